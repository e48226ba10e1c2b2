package org.lrbench.sim;

/**
 * How a fixture is wired and probed. {@code DIFFERENTIAL}: generator, sense resistor, part, ground;
 * a differential probe across the sense resistor (channel 1) and one across the part (channel 2).
 * {@code LOW_SIDE}: generator, part, sense resistor, ground; channel 1 measures the sense resistor
 * to ground, channel 2 the top of the part to ground, and the part's voltage is channel 2 minus
 * channel 1 (the usual wiring when both scope inputs share ground). Each probe divides by its
 * attenuation (1 for 1x, 10 for 10x, or a measured factor).
 */
public record FixtureWiring(double senseOhm, Topology topology, double attenuation1, double attenuation2,
                            boolean channel1Differential, boolean channel2Differential) {

    /** The fixture topologies. */
    public enum Topology { DIFFERENTIAL, LOW_SIDE }

    public static FixtureWiring differential(double senseOhm) {
        return new FixtureWiring(senseOhm, Topology.DIFFERENTIAL, 1, 1, true, true);
    }

    public double attenuation(int channel) {
        return channel == 1 ? attenuation1 : attenuation2;
    }
}
