/** Byte links to instruments and the address syntax that selects one. */
package org.lrbench.transport;
