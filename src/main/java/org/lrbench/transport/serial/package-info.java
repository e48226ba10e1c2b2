/** SCPI over serial lines, with jSerialComm. */
package org.lrbench.transport.serial;
