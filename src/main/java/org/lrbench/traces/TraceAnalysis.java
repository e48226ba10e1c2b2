package org.lrbench.traces;

import org.lrbench.analysis.FourParameterSineFit;
import org.lrbench.analysis.FrequencyEstimate;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.analysis.PhasorImpedance;
import org.lrbench.analysis.SineFit;
import org.lrbench.analysis.SineFitResult;

/**
 * The sine-phasor extraction on traces from a file: the frequency given, or estimated from the
 * current (spectrum peak, then the IEEE 1057 four-parameter fit); both channels fitted at that
 * frequency; Z = Rs V2 / V1.
 */
public final class TraceAnalysis {

    private TraceAnalysis() {
    }

    public static ImpedancePoint analyse(CsvTraces t, double senseOhm, Double frequencyHz) {
        double f = frequencyHz != null ? frequencyHz
                : FourParameterSineFit.fit(t.sense(), t.intervalSecond(), FrequencyEstimate.peakHz(t.sense(),
                        t.intervalSecond())).frequencyHz();
        SineFitResult sense = SineFit.fit(t.sense(), t.intervalSecond(), f);
        SineFitResult part = SineFit.fit(t.part(), t.intervalSecond(), f);
        return PhasorImpedance.of(f, sense, part, senseOhm);
    }
}
