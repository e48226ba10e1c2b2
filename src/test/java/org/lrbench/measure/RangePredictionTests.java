package org.lrbench.measure;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.lrbench.analysis.ImpedancePoint;
import org.lrbench.sim.Circuit;
import org.lrbench.sim.PartModel;

class RangePredictionTests {

    @Test
    void predictsTheNextPointsVoltagesOfASeriesCircuit() {
        // Reference: the loop current of a Thevenin source into Rg + Rs + R + jwL (Ohm's law for
        // phasors, textbook, from memory), computed by the simulator's circuit at both frequencies
        Circuit c = new Circuit(50, 100, new PartModel(1e-3, 2.3, 0));
        Complex e = new Complex(3, 0);
        double f1 = 1000;
        double f2 = 4309;
        Complex i1 = c.current(e, 2 * Math.PI * f1);
        ImpedancePoint last = new ImpedancePoint(f1, c.part().impedance(2 * Math.PI * f1), 0, i1);
        double[] peaks = RangePrediction.next(last, 3, 100, f2);
        assertThat(peaks[0]).isCloseTo(c.senseVoltage(e, 2 * Math.PI * f2).abs(), within(1e-12));
        assertThat(peaks[1]).isCloseTo(c.partVoltage(e, 2 * Math.PI * f2).abs(), within(1e-12));
    }

    @Test
    void noCurrentGivesNoPrediction() {
        ImpedancePoint dead = new ImpedancePoint(1000, new Complex(1, 1), 0, Complex.ZERO);
        assertThat(RangePrediction.next(dead, 3, 100, 2000)).isNull();
    }
}
