package org.lrbench.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.instrument.Waveform;
import org.lrbench.sim.Circuit;
import org.lrbench.sim.Harmonic;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.WaveformSpectrum;

class TriangleExtractionTests {

    @Test
    void recoversRAndLFromATriangleDrivenSeriesInductor() {
        // Circuit theory (textbook, from memory): across R + L, v = R i + L di/dt. The traces are the
        // band-limited steady state of a triangle EMF through 50 ohm + 100 ohm into 1 mH, 2.3 ohm.
        Circuit c = new Circuit(50, 100, new PartModel(1e-3, 2.3, 0));
        double f = 500;
        int spc = 400;
        double dt = 1.0 / (f * spc);
        int n = 10 * spc;
        List<Harmonic> emf = WaveformSpectrum.of(Waveform.TRIANGLE, 3.0, 0, f, 0.5 / dt);
        double[] v1 = new double[n];
        double[] v2 = new double[n];
        for (int s = 0; s < n; s++) {
            double t = s * dt;
            for (Harmonic h : emf) {
                double w = 2 * Math.PI * h.k() * f;
                Complex e = h.amplitude();
                Complex a = c.senseVoltage(e, w);
                Complex b = c.partVoltage(e, w);
                v1[s] += a.getReal() * Math.cos(w * t) - a.getImaginary() * Math.sin(w * t);
                v2[s] += b.getReal() * Math.cos(w * t) - b.getImaginary() * Math.sin(w * t);
            }
        }
        TriangleExtraction.Result r = TriangleExtraction.extract(v1, v2, dt, f, 100, 199);
        assertThat(r.harmonics()).isGreaterThan(50);
        assertThat(r.resistanceOhm()).isCloseTo(2.3, within(1e-6));
        assertThat(r.inductanceHenry()).isCloseTo(1e-3, within(1e-9));
        assertThat(r.residualRmsVolt()).isLessThan(1e-9);
    }

    @Test
    void quantizationOnTheHarmonicsDoesNotPullInductanceLow() {
        // coherent sampling repeats the 8-bit quantization error every cycle, i.e. on the harmonics;
        // however many harmonics are allowed, those under the converter step must not enter di/dt
        Circuit c = new Circuit(50, 100, new PartModel(1e-3, 2.3, 0));
        double f = 500;
        double dt = 1.0 / (f * 400);
        int n = 4000;
        List<Harmonic> emf = WaveformSpectrum.of(Waveform.TRIANGLE, 3.0, 0, f, 0.5 / dt);
        double lsb1 = 5.6 / 256;
        double lsb2 = 0.5 / 256;
        double[] v1 = new double[n];
        double[] v2 = new double[n];
        for (int s = 0; s < n; s++) {
            double t = s * dt;
            for (Harmonic h : emf) {
                double w = 2 * Math.PI * h.k() * f;
                Complex a = c.senseVoltage(h.amplitude(), w);
                Complex b = c.partVoltage(h.amplitude(), w);
                v1[s] += a.getReal() * Math.cos(w * t) - a.getImaginary() * Math.sin(w * t);
                v2[s] += b.getReal() * Math.cos(w * t) - b.getImaginary() * Math.sin(w * t);
            }
            v1[s] = lsb1 * Math.rint(v1[s] / lsb1);
            v2[s] = lsb2 * Math.rint(v2[s] / lsb2);
        }
        for (int k : new int[] {31, 99, 199}) {
            TriangleExtraction.Result r = TriangleExtraction.extract(v1, v2, dt, f, 100, k);
            assertThat(r.inductanceHenry()).as("%d harmonics", k).isCloseTo(1e-3, within(0.005e-3));
            assertThat(r.resistanceOhm()).as("%d harmonics", k).isCloseTo(2.3, within(0.05));
        }
    }
}
