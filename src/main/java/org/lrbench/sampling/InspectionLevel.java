package org.lrbench.sampling;

/** The inspection levels of ISO 2859-1 Table I: special S-1 to S-4, general I, II (the default), III. */
public enum InspectionLevel { S1, S2, S3, S4, I, II, III }
