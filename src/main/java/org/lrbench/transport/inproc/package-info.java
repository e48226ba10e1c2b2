/** The in-process link to the simulated bench. */
package org.lrbench.transport.inproc;
