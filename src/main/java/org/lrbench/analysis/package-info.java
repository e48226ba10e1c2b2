/** Pure numerics: sine fits, impedance from phasors, model fits. No I/O. */
package org.lrbench.analysis;
