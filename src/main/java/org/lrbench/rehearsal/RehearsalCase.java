package org.lrbench.rehearsal;

import org.lrbench.sim.PartModel;

/**
 * One simulated part of a rehearsal: which limit it probes, where it stands ("nominal",
 * "just inside", "just outside"), its true model, and whether that limit should pass.
 */
public record RehearsalCase(String limit, String where, PartModel part, boolean shouldPass) {
}
