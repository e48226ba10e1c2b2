package org.lrbench.calibration;

import java.util.List;
import org.apache.commons.math3.complex.Complex;

/**
 * Open/short compensation of the fixture, per frequency: with the fixture modelled as a series
 * residual Z_s (leads) followed by a shunt admittance Y_o (stray capacitance) at the part's
 * terminals, the measured Z_m = Z_s + 1 / (Y_o + 1 / Z_dut), hence the usual correction
 * Z_dut = (Z_m - Z_s) / (1 - (Z_m - Z_s) Y_o) with Z_s the short reading and
 * Y_o = 1 / (Z_open - Z_s). An open reading lost in noise counts as Y_o = 0 (no stray to remove).
 */
public record FixtureCompensation(String measuredAt, List<Point> points, String plan, Double senseOhm) {

    /**
     * A compensation without the plan and sense resistor it was measured with (kept before they were
     * recorded, and tests): then not checked against a plan's sense resistor.
     */
    public FixtureCompensation(String measuredAt, List<Point> points) {
        this(measuredAt, points, null, null);
    }

    /** The same compensation, recorded as measured with this plan (its file) and sense resistor. */
    public FixtureCompensation measuredWith(String planFile, double sense) {
        return new FixtureCompensation(measuredAt, points, planFile, sense);
    }

    /**
     * The short and open readings at one frequency; {@code openReal}/{@code openImag} NaN when lost in
     * noise; {@code shortUncertaintyOhm} the short reading's own standard uncertainty per component
     * (null in corrections kept before it was recorded: then taken as 0); {@code openModelled} true where
     * the open was lost in noise and is the stray modelled from the frequencies where it was read;
     * {@code openAdmittanceUncertainty} the standard uncertainty per component of the open's
     * admittance Y_o in siemens (null in corrections kept before it was recorded: then 0).
     */
    public record Point(double frequencyHz, double shortReal, double shortImag, double openReal, double openImag,
                        Double shortUncertaintyOhm, Boolean openModelled, Double openAdmittanceUncertainty) {

        public Point(double frequencyHz, double shortReal, double shortImag, double openReal, double openImag,
                     Double shortUncertaintyOhm, Boolean openModelled) {
            this(frequencyHz, shortReal, shortImag, openReal, openImag, shortUncertaintyOhm, openModelled, null);
        }

        public Point(double frequencyHz, double shortReal, double shortImag, double openReal, double openImag) {
            this(frequencyHz, shortReal, shortImag, openReal, openImag, null, null);
        }

        public Point(double frequencyHz, double shortReal, double shortImag, double openReal, double openImag,
                     Double shortUncertaintyOhm) {
            this(frequencyHz, shortReal, shortImag, openReal, openImag, shortUncertaintyOhm, null);
        }

        /** Whether the open was modelled from the stray seen at other frequencies (lost in noise here). */
        public boolean modelled() {
            return Boolean.TRUE.equals(openModelled);
        }

        Complex shortZ() {
            return new Complex(shortReal, shortImag);
        }

        Complex openAdmittance() {
            if (Double.isNaN(openReal)) {
                return Complex.ZERO;
            }
            return new Complex(openReal, openImag).subtract(shortZ()).reciprocal();
        }
    }

    /** The compensated impedance; the frequency must be one the compensation was measured at. */
    public Complex correct(double frequencyHz, Complex measured) {
        Point p = at(frequencyHz);
        Complex d = measured.subtract(p.shortZ());
        return d.divide(Complex.ONE.subtract(d.multiply(p.openAdmittance())));
    }

    /**
     * The standard uncertainty per component of the compensated impedance: the measured point's
     * and the short reading's (it is subtracted, so the two add in quadrature), carried through the
     * correction's derivative dZ/dZ_m = 1 / (1 - D Y_o)^2 with D = Z_m - Z_s, and the open
     * admittance's own uncertainty through dZ/dY_o = D^2 / (1 - D Y_o)^2 (first-order propagation,
     * JCGM 100:2008 5.1.2).
     */
    public double uncertainty(double frequencyHz, Complex measured, double measuredUncertainty) {
        Point p = at(frequencyHz);
        double us = p.shortUncertaintyOhm() == null ? 0 : p.shortUncertaintyOhm();
        double uy = p.openAdmittanceUncertainty() == null || Double.isNaN(p.openReal()) ? 0 : p.openAdmittanceUncertainty();
        Complex d = measured.subtract(p.shortZ());
        Complex den = Complex.ONE.subtract(d.multiply(p.openAdmittance()));
        double gain = 1 / (den.abs() * den.abs());
        return Math.hypot(Math.hypot(measuredUncertainty, us), d.abs() * d.abs() * uy) * gain;
    }

    /**
     * The short reading nearest in frequency as a series resistance and inductance {R, L}: the
     * leads, for a method that measures R and L directly (the triangle check) at a frequency of its own.
     */
    public double[] shortSeriesNear(double frequencyHz) {
        Point best = points.get(0);
        for (Point p : points) {
            if (Math.abs(Math.log(p.frequencyHz() / frequencyHz)) < Math.abs(Math.log(best.frequencyHz() / frequencyHz))) {
                best = p;
            }
        }
        return new double[] {best.shortReal(), best.shortImag() / (2 * Math.PI * best.frequencyHz())};
    }

    public boolean covers(double frequencyHz) {
        return points.stream().anyMatch(p -> Math.abs(p.frequencyHz() - frequencyHz) <= 1e-9 * frequencyHz);
    }

    private Point at(double frequencyHz) {
        return points.stream().filter(p -> Math.abs(p.frequencyHz() - frequencyHz) <= 1e-9 * frequencyHz).findFirst()
                .orElseThrow(() -> new IllegalArgumentException("the fixture compensation has no reading at "
                        + frequencyHz + " Hz: measure it again with this plan's frequencies"));
    }
}
