/** Bench corrections: digitizer channel match and fixture open/short compensation, and where they are kept. */
package org.lrbench.calibration;
