/** Benchmarks that print measured ratios side by side; run with {@code ./lrbench benchmark}. */
package org.lrbench.benchmark;
