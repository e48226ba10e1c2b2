/** Plan rehearsal on the simulated bench: can this plan tell a good part from a bad one? */
package org.lrbench.rehearsal;
