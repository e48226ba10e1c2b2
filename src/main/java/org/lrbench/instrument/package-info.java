/** Instruments as interfaces of logical operations, and the values they exchange. */
package org.lrbench.instrument;
