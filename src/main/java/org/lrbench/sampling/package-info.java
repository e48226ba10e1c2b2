/** Lot sampling: single sampling plans for normal inspection after ISO 2859-1. */
package org.lrbench.sampling;
