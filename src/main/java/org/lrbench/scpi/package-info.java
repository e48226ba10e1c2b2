/** The SCPI conversation with an instrument, the same over every transport. */
package org.lrbench.scpi;
