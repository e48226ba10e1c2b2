/** The simulated bench served over real links: TCP sockets and a pseudo-terminal. */
package org.lrbench.sim.server;
