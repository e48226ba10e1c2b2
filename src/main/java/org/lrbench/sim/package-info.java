/** The simulated bench: circuit theory of generator, fixture and part, and the SCPI instruments over it. */
package org.lrbench.sim;
