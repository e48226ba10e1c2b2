/** Limits of a purchase specification and the verdicts they give. */
package org.lrbench.judge;
