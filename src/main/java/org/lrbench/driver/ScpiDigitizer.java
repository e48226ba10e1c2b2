package org.lrbench.driver;

import java.util.HashMap;
import java.util.Locale;
import java.util.Map;
import org.lrbench.instrument.Coupling;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.Trace;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.scpi.BlockFormatException;
import org.lrbench.scpi.ScpiNumbers;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.scpi.TraceEncoding;

/** A digitizer that speaks SCPI through a digitizer driver file. */
public final class ScpiDigitizer extends DrivenInstrument implements Digitizer {
    private final Map<Integer, Double> ranges = new HashMap<>();
    private final Map<Integer, Double> offsets = new HashMap<>();
    private int points;

    public ScpiDigitizer(ScpiSession session, DriverFile driver) {
        super(session, driver);
    }

    @Override
    public void prepare() {
        identity();
        configure("prepare", Map.of());
        ranges.clear();
        offsets.clear();
    }

    @Override
    public RangeLimits rangeLimits(int channel) {
        Map<String, String> ch = channel(channel);
        return new RangeLimits(queryNumber("range_min_query", ch), queryNumber("range_max_query", ch));
    }

    @Override
    public double setRange(int channel, double peakToPeakVolt) {
        Map<String, String> values = new HashMap<>(channel(channel));
        values.put("range", ScpiNumbers.nr3(peakToPeakVolt));
        configure("range", values);
        double actual = queryNumber("range_query", channel(channel));
        ranges.put(channel, actual);
        return actual;
    }

    @Override
    public void setOffset(int channel, double volt) {
        Map<String, String> values = new HashMap<>(channel(channel));
        values.put("offset", ScpiNumbers.nr3(volt));
        configure("offset", values);
        offsets.put(channel, volt);
    }

    @Override
    public void setCoupling(int channel, Coupling coupling) {
        Map<String, String> values = new HashMap<>(channel(channel));
        values.put("coupling", driver.word("couplings", coupling.name().toLowerCase(Locale.ROOT)));
        configure("coupling", values);
    }

    @Override
    public Timing setTiming(double sampleIntervalSecond, int requestedPoints) {
        configure("interval", Map.of("interval", ScpiNumbers.nr3(sampleIntervalSecond)));
        configure("points", Map.of("points", ScpiNumbers.nr1(requestedPoints)));
        double interval = queryNumber("interval_query", Map.of());
        double n = queryNumber("points_query", Map.of());
        if (n != Math.rint(n) || n < 1) {
            throw new InstrumentException(session.instrument() + ": record length reply " + n + " is not a count");
        }
        points = (int) n;
        return new Timing(interval, points);
    }

    @Override
    public void setTrigger(TriggerSource source, double levelVolt, boolean rising) {
        configure("trigger", Map.of(
                "source", driver.word("trigger_sources", source.name().toLowerCase(Locale.ROOT)),
                "level", ScpiNumbers.nr3(levelVolt),
                "slope", driver.word("slopes", rising ? "rising" : "falling")));
    }

    @Override
    public void acquire() {
        String command = driver.command("acquire").render(Map.of());
        session.write(command);
        session.waitComplete();
        session.checkErrors(driver.errorQuery(), command);
    }

    @Override
    public Trace fetch(int channel) {
        Double range = ranges.get(channel);
        if (range == null) {
            throw new IllegalStateException("channel " + channel + " range was never set");
        }
        double offset = offsets.getOrDefault(channel, 0.0);
        String scaleCommand = driver.command("scale_query").render(channel(channel));
        double[] scale = parseScale(scaleCommand, session.query(scaleCommand));
        String fetchCommand = driver.command("fetch").render(channel(channel));
        TraceEncoding encoding = driver.traceEncoding();
        double[] raw;
        try {
            raw = encoding.isBinary() ? encoding.decode(session.queryBlock(fetchCommand))
                    : TraceEncoding.decodeAscii(session.query(fetchCommand));
        } catch (BlockFormatException e) {
            throw new InstrumentException(session.instrument() + ": trace from '" + fetchCommand + "': " + e.getMessage(), e);
        }
        if (points > 0 && raw.length != points) {
            throw new InstrumentException(session.instrument() + ": '" + fetchCommand + "' returned " + raw.length
                    + " samples, the record length is " + points);
        }
        double[] volts = new double[raw.length];
        int clipped = 0;
        double half = range / 2;
        for (int i = 0; i < raw.length; i++) {
            volts[i] = scale[3] + scale[2] * raw[i];
            boolean atLimit = encoding.isInteger()
                    ? raw[i] <= encoding.minCode() || raw[i] >= encoding.maxCode()
                    : Math.abs(volts[i] - offset) >= half * (1 - 1e-9);
            if (atLimit) {
                clipped++;
            }
        }
        return new Trace(channel, scale[0], scale[1], volts, range, offset, clipped);
    }

    private double[] parseScale(String command, String reply) {
        String[] parts = reply.split("[,;]");
        if (parts.length != 4) {
            throw new InstrumentException(session.instrument() + ": reply to '" + command + "' is '" + reply
                    + "'; expected four numbers: x increment, x origin, y increment, y origin");
        }
        double[] out = new double[4];
        for (int i = 0; i < 4; i++) {
            try {
                out[i] = ScpiNumbers.parse(parts[i]);
            } catch (NumberFormatException e) {
                throw new InstrumentException(session.instrument() + ": reply to '" + command + "' field " + (i + 1)
                        + " is '" + parts[i] + "', not a number");
            }
        }
        if (!(out[0] > 0)) {
            throw new InstrumentException(session.instrument() + ": sample interval " + out[0] + " from '" + command
                    + "' is not positive");
        }
        return out;
    }

    private static Map<String, String> channel(int channel) {
        return Map.of("channel", ScpiNumbers.nr1(channel));
    }
}
