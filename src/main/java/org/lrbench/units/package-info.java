/** Numbers with SI units: the single parser every plan, bench and part file goes through. */
package org.lrbench.units;
