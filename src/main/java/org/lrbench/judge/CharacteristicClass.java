package org.lrbench.judge;

/** The classes of nonconformity a limit belongs to, each sampled at its own AQL (ISO 2859-1, 3.1.6). */
public enum CharacteristicClass { CRITICAL, MAJOR, MINOR }
