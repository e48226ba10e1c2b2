package org.lrbench.measure;

import java.util.ArrayList;
import java.util.List;
import org.lrbench.instrument.Coupling;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.Identity;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.Trace;
import org.lrbench.instrument.TriggerSource;

/**
 * A digitizer with a fixed range set, as most oscilloscopes have: a request is coerced to one of
 * the ranges (rounded up, down or to the nearest) and the coerced range is what the instrument
 * underneath is set to. Counts acquisitions and requests.
 */
final class RangeSetDigitizer implements Digitizer {
    enum Rounding { UP, DOWN, NEAREST }

    private final Digitizer inner;
    private final double[] ranges;
    private final Rounding rounding;
    final List<Double> requests = new ArrayList<>();
    /** The rounding a driver would declare for it (null: none declared). */
    RangeLimits.Rounding declared;
    int acquisitions;

    RangeSetDigitizer(Digitizer inner, double[] ranges, Rounding rounding) {
        this.inner = inner;
        this.ranges = ranges;
        this.rounding = rounding;
    }

    /** 1-2-5 steps from {@code from} to {@code to} volts (common practice, no source: the usual oscilloscope sequence). */
    static double[] oneTwoFive(double from, double to) {
        List<Double> out = new ArrayList<>();
        for (double decade = from; decade <= to * 1.0001; decade *= 10) {
            for (double m : new double[] {1, 2, 5}) {
                if (decade * m <= to * 1.0001) {
                    out.add(decade * m);
                }
            }
        }
        return out.stream().mapToDouble(Double::doubleValue).toArray();
    }

    double coerce(double r) {
        double best = ranges[0];
        switch (rounding) {
            case UP -> {
                best = ranges[ranges.length - 1];
                for (double x : ranges) {
                    if (x >= r * (1 - 1e-12)) {
                        best = x;
                        break;
                    }
                }
            }
            case DOWN -> {
                for (double x : ranges) {
                    if (x <= r * (1 + 1e-12)) {
                        best = x;
                    }
                }
            }
            case NEAREST -> {
                for (double x : ranges) {
                    if (Math.abs(Math.log(x / r)) < Math.abs(Math.log(best / r))) {
                        best = x;
                    }
                }
            }
        }
        return best;
    }

    @Override
    public double setRange(int channel, double peakToPeakVolt) {
        requests.add(peakToPeakVolt);
        return inner.setRange(channel, coerce(peakToPeakVolt));
    }

    @Override
    public RangeLimits rangeLimits(int channel) {
        return new RangeLimits(ranges[0], ranges[ranges.length - 1], List.of(), declared);
    }

    @Override
    public void acquire() {
        acquisitions++;
        inner.acquire();
    }

    @Override
    public Identity identity() {
        return inner.identity();
    }

    @Override
    public void prepare() {
        inner.prepare();
    }

    @Override
    public void setOffset(int channel, double volt) {
        inner.setOffset(channel, volt);
    }

    @Override
    public void setCoupling(int channel, Coupling coupling) {
        inner.setCoupling(channel, coupling);
    }

    @Override
    public Timing setTiming(double sampleIntervalSecond, int points) {
        return inner.setTiming(sampleIntervalSecond, points);
    }

    @Override
    public void setTrigger(TriggerSource source, double levelVolt, boolean rising) {
        inner.setTrigger(source, levelVolt, rising);
    }

    /** Each fetched trace's fill (excursion over half its range; above 1: clipped), per channel, in order. */
    final List<List<Double>> fills = List.of(new ArrayList<>(), new ArrayList<>(), new ArrayList<>());

    @Override
    public Trace fetch(int channel) {
        Trace t = inner.fetch(channel);
        fills.get(channel).add(t.clippedSamples() > 0 ? Double.POSITIVE_INFINITY : 2 * t.excursion() / t.rangeVolt());
        return t;
    }
}
