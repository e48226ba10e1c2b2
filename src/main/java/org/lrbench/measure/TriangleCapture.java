package org.lrbench.measure;

import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.TriangleExtraction;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.Waveform;
import org.lrbench.plan.Plan;
import org.lrbench.plan.TriangleCheck;

/**
 * The plan's triangle-wave check after the sweep: its settings (sent while the sweep's last point
 * is analysed, so its settle runs from there), ranges (from the part before on instruments kept
 * open), the capture, the output switched off (the part is no longer driven while its time-domain
 * values are worked out) and R and L extracted in the time domain.
 */
final class TriangleCapture {
    private final SweepBench bench;
    private final Plan plan;
    /** When the triangle's settings took effect (the bench clock's time); 0 until they are sent. */
    private long setAt;
    private boolean set;
    private boolean outputOff;

    TriangleCapture(SweepBench bench, Plan plan) {
        this.bench = bench;
        this.plan = plan;
    }

    /** Whether the plan has a triangle check this sweep makes (none on an open fixture). */
    boolean wanted() {
        return plan.triangle() != null && !bench.openCircuit();
    }

    /** Whether the output went off after the triangle's capture (the sweep's last). */
    boolean outputOff() {
        return outputOff;
    }

    /** Sends the triangle's settings; its settle counts from here. */
    void set() {
        TriangleCheck t = plan.triangle();
        bench.generator().batch(() -> {
            bench.generator().setWaveform(Waveform.TRIANGLE);
            bench.generator().setAmplitude(t.amplitudeVolt());
            bench.generator().setFrequency(t.frequencyHz());
        });
        setAt = bench.clock().nanoTime();
        set = true;
    }

    /**
     * Captures the triangle (its settings sent first if they were not) and extracts R and L.
     *
     * @param last  the sweep's last point, whose impedance gives the circuit rule's settle
     * @param peaks filled with the capture's peak on each channel (channel volts), for the next part
     */
    TriangleExtraction.Result measure(ImpedancePoint last, double[] peaks) {
        TriangleCheck t = plan.triangle();
        if (!set) {
            set();
        }
        double start = SweepRunner.START_RANGE_PER_PEAK * t.amplitudeVolt();
        AutoRanger ranger = new AutoRanger(bench.digitizer(), start, start);
        RangeMemory memory = bench.memory();
        double[] known = memory == null ? null : memory.trianglePeaks(plan);
        if (known != null) {
            ranger.expect(known[0], known[1]);
        }
        double settle = Settle.seconds(plan.sweep(), plan.senseResistanceOhm(), last,
                bench.generator().frequencySettleSecond());
        if (known == null && t.cycles() > SweepRunner.RANGING_CYCLES) {
            // the ranges found on short records first, as at the sweep's first point
            bench.clock().sleep(bench.remaining(settle, setAt));
            TimeBase.setWithRanges(bench.digitizer(), ranger, t.frequencyHz(), SweepRunner.RANGING_CYCLES,
                    t.samplesPerCycle());
            ranger.acquire();
        }
        TimedCapture.Captured found = TimedCapture.capture(bench, ranger, t.frequencyHz(), t.cycles(),
                t.samplesPerCycle(), settle, setAt);
        Timing timing = found.timing();
        AutoRanger.Capture capture = found.capture();
        // the last capture: the part is not driven while its time-domain values are worked out
        bench.generator().outputOff();
        outputOff = true;
        peaks[0] = SweepRunner.peak(capture.sense().volts());
        peaks[1] = SweepRunner.peak(capture.part().volts());
        double[][] v = SweepRunner.volts(plan, capture);
        return TriangleExtraction.extract(v[0], v[1], timing.sampleIntervalSecond(),
                t.frequencyHz(), plan.senseResistanceOhm(), t.harmonics());
    }
}
