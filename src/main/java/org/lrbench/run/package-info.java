/** Measuring one part from a plan: opening the bench, the sweep, the fit, the verdict, output safety. */
package org.lrbench.run;
