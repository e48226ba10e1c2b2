package org.lrbench.judge;

/**
 * Where a reading falls: inside the acceptance limits and farther than U from any tolerance limit
 * ({@code CLEAR}), within U of a tolerance limit but on the accepting side ({@code MARGINAL}, our
 * word for a reading whose uncertainty interval straddles the limit), or beyond the acceptance limit
 * ({@code OUTSIDE}).
 */
public enum Zone { CLEAR, MARGINAL, OUTSIDE }
