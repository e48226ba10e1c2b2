package org.lrbench.bench;

/**
 * A bench's check standard: a reference part with a certified inductance and its expanded
 * uncertainty (k = 2), measured with a plan at the start of a shift or every {@code intervalSecond};
 * the bench's corrections may be no older than {@code calibrationDueSecond}; the control chart's
 * limits come from the check's own history once it has {@code historyPoints} readings. On the
 * simulated bench {@code simulatedPart} is the reference part's file (null on a real bench).
 */
public record CheckStandard(String serial, double certifiedHenry, double certifiedExpandedHenry, String plan,
                            double intervalSecond, double calibrationDueSecond, int historyPoints, String simulatedPart) {
}
