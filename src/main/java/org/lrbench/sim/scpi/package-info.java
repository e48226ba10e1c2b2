/** The SCPI command parser and error queue that front every simulated instrument. */
package org.lrbench.sim.scpi;
