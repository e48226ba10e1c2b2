package org.lrbench.traces;

import org.lrbench.analysis.FixturePhasors;
import org.lrbench.analysis.FourParameterSineFit;
import org.lrbench.analysis.FrequencyEstimate;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.PhasorImpedance;

/**
 * The sine-phasor extraction on traces from a file: the frequency given, or estimated from the
 * current (spectrum peak, then the IEEE 1057 four-parameter fit); both channels fitted at that
 * frequency, each corrected for its converter's quantization where the samples show its grid;
 * Z = Rs V2 / V1.
 */
public final class TraceAnalysis {

    private TraceAnalysis() {
    }

    public static ImpedancePoint analyse(CsvTraces t, double senseOhm, Double frequencyHz) {
        double f = frequencyHz != null ? frequencyHz
                : FourParameterSineFit.fit(t.sense(), t.intervalSecond(), FrequencyEstimate.peakHz(t.sense(),
                        t.intervalSecond())).frequencyHz();
        FixturePhasors.Result r = FixturePhasors.of(t.sense(), t.part(), t.intervalSecond(), f, 1, 1, false);
        return PhasorImpedance.of(f, r.sense(), r.part(), senseOhm);
    }
}
