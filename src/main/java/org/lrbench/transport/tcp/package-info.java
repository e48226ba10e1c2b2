/** SCPI over a raw TCP socket, with Netty. */
package org.lrbench.transport.tcp;
