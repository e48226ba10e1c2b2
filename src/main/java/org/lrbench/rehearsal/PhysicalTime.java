package org.lrbench.rehearsal;

import java.util.List;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.Settle;
import org.lrbench.plan.Plan;
import org.lrbench.sim.SimTiming;

/**
 * The least time a measured part's sweep and triangle check can take on a link: what the
 * instruments and the circuit cannot do faster, lrbench's own work left out. A stepped point is
 * its settle, the generator's frequency change, the digitizer's arming, one record's duration,
 * both traces over the link and four messages (set the frequency, acquire, fetch each channel);
 * a multisine is the waveform over the link once, one settle and one such capture; the triangle
 * check counts as a stepped point. The points are those the part's measurement took (their
 * records' samples and intervals), so the figure holds for the records really taken.
 */
public final class PhysicalTime {

    private PhysicalTime() {
    }

    /**
     * @param bytesPerSample each trace sample's bytes on the wire, as the digitizer's driver reads them
     * @param waveformBytes  a multisine's waveform as the generator's driver sends it (0 when stepped)
     */
    public static double of(Plan plan, List<PointResult> points, SimTiming link, int bytesPerSample, long waveformBytes) {
        double seconds = 0;
        if (points.isEmpty()) {
            return seconds;
        }
        if (plan.sweep().multisine()) {
            PointResult p = points.get(0);
            seconds += settle(plan, null) + capture(link, p.samples(), p.sampleIntervalSecond(), bytesPerSample)
                    + link.transfer(waveformBytes) + link.messageSecond();
        } else {
            for (int i = 0; i < points.size(); i++) {
                PointResult p = points.get(i);
                seconds += settle(plan, i == 0 ? null : points.get(i - 1))
                        + capture(link, p.samples(), p.sampleIntervalSecond(), bytesPerSample);
            }
        }
        if (plan.triangle() != null) {
            var tri = plan.triangle();
            int n = tri.cycles() * tri.samplesPerCycle() + 1;
            seconds += settle(plan, points.get(points.size() - 1))
                    + capture(link, n, 1 / (tri.frequencyHz() * tri.samplesPerCycle()), bytesPerSample);
        }
        return seconds;
    }

    /**
     * A multisine's waveform as the generator's driver sends it: nine characters a point in ASCII, two
     * bytes a point in a definite block of 16-bit words; 0 for a stepped sweep.
     */
    public static long waveformBytes(Plan plan, org.lrbench.driver.DriverFile source) {
        if (!plan.sweep().multisine()) {
            return 0;
        }
        Integer memory = source.limits().maxArbitrarySamples();
        int points = org.lrbench.analysis.MultisineDesign.of(plan.sweep().frequenciesHz(), plan.sweep().multisineTolerance(),
                memory == null ? Integer.MAX_VALUE : memory).samples().length;
        return (source.arbitraryEncoding().equals("ascii") ? 9L : 2L) * points;
    }

    private static double settle(Plan plan, PointResult previous) {
        return Settle.seconds(plan.sweep(), plan.senseResistanceOhm(), previous == null ? null : previous.impedance(), 0);
    }

    /** One capture's unavoidable time: frequency change, arming, the record, both traces over the link, four messages. */
    private static double capture(SimTiming t, int samples, double interval, int bytesPerSample) {
        return t.frequencyChangeSecond() + t.armSecond() + samples * interval
                + t.transfer(2L * samples * bytesPerSample) + 4 * t.messageSecond();
    }
}
