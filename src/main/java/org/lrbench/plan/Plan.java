package org.lrbench.plan;

import java.util.List;
import java.util.Optional;
import org.lrbench.judge.Characteristic;
import org.lrbench.judge.Limit;
import org.lrbench.sampling.SamplingScheme;
import org.lrbench.fixture.FixtureWiring;

/**
 * A validated measurement plan for one part number; {@code triangle} is null when the plan has no
 * time-domain check, {@code sampling} when it has no lot sampling section, {@code supplier} when the
 * plan names none (a lot may name it). Immutable; made only by {@link PlanLoader}.
 */
public record Plan(String source, String partNumber, String description, double senseResistanceOhm,
                   SineSweep sweep, TriangleCheck triangle, List<Limit> limits, SamplingScheme sampling,
                   FixtureWiring wiring, DcResistanceStep dcResistance, String supplier) {

    /** A plan naming no supplier. */
    public Plan(String source, String partNumber, String description, double senseResistanceOhm, SineSweep sweep,
                TriangleCheck triangle, List<Limit> limits, SamplingScheme sampling, FixtureWiring wiring,
                DcResistanceStep dcResistance) {
        this(source, partNumber, description, senseResistanceOhm, sweep, triangle, limits, sampling, wiring, dcResistance,
                null);
    }

    /** The plan's first limit on a characteristic, if it has one (a study's or a check standard's reading). */
    public Optional<Limit> firstLimit(Characteristic c) {
        return limits.stream().filter(l -> l.characteristic() == c).findFirst();
    }

    /** The same plan with another sweep. */
    public Plan withSweep(SineSweep other) {
        return new Plan(source, partNumber, description, senseResistanceOhm, other, triangle, limits, sampling, wiring,
                dcResistance, supplier);
    }
}
