/**
 * Measurement system studies: the crossed repeatability-and-reproducibility study by analysis of
 * variance ({@link org.lrbench.study.GaugeStudy}) and the type-1 study of one reference part
 * ({@link org.lrbench.study.TypeOneStudy}). Pure numerics, no I/O.
 */
package org.lrbench.study;
