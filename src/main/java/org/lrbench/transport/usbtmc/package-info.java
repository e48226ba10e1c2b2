/** SCPI over the Linux USBTMC character device. */
package org.lrbench.transport.usbtmc;
