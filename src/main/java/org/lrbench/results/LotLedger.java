package org.lrbench.results;

import org.lrbench.sampling.LotDisposition;
import org.lrbench.fixture.FixtureWiring;
import java.io.IOException;
import java.util.List;
import java.util.Optional;
import org.lrbench.measure.PointResult;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;
import org.lrbench.results.PartResult;
import org.lrbench.sampling.SwitchingRules;

/**
 * Where a lot run's records go: the runner's one path to the store, the result files and the
 * trace archives. {@link #keep} returns only once the attempt is committed; what the console and
 * the service show comes after it.
 */
public interface LotLedger {

    /** The inspection to work on, under these terms (refused when they differ from the stored ones). */
    Inspection open(LotTerms terms, String reinspectReason);

    /** The lot's latest inspection, if the lot was started. */
    Optional<Inspection> latest(String lot);

    /** Every attempt of one inspection round. */
    List<Attempt> attempts(String lot, int round);

    /** The number the serial's next attempt gets. */
    int nextAttempt(String lot, String serial);

    /**
     * Keeps one finished attempt ({@code result} carries its attempt record) with its traces (empty
     * for a skipped position), the sense resistance and the fixture's wiring they were captured with
     * (null: differential, unity probes): files written whole, the store commit, then the files' final names.
     */
    Attempt keep(PartResult result, int position, List<PointResult> traces, double senseOhm, FixtureWiring wiring)
            throws IOException;

    /** As above, captured on a differential fixture with unity probes. */
    default Attempt keep(PartResult result, int position, List<PointResult> traces, double senseOhm) throws IOException {
        return keep(result, position, traces, senseOhm, null);
    }

    /**
     * Records an inspection's disposition once, with what it means for the switching rules (the
     * score's step, whether it reinstates normal inspection; null where it does not count); false
     * when it was decided already.
     */
    boolean decide(String lot, int round, LotDisposition.State disposition, String reason, Integer switchingStep,
                   Boolean reinstatesNormal, String now);

    /** Where a part number's scheme with a supplier stands under the switching rules. */
    SwitchingRules.State scheme(String partNumber, String supplier);

    /** A supplier's scheme of real lots, or of lots on the simulated bench (the two never mix). */
    default SwitchingRules.State scheme(String partNumber, String supplier, boolean simulated) {
        if (simulated) {
            throw new UnsupportedOperationException("this ledger keeps no simulated schemes");
        }
        return scheme(partNumber, supplier);
    }
}
