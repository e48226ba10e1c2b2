/** Measurement plans: the YAML format, its validation and the immutable plan it yields. */
package org.lrbench.plan;
