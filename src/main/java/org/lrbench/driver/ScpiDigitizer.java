package org.lrbench.driver;

import java.util.HashMap;
import java.util.List;
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
    private final Map<Integer, Double> requestedRanges = new HashMap<>();
    private final Map<Integer, Double> offsets = new HashMap<>();
    private final Map<Integer, double[]> scales = new HashMap<>();
    private int points;

    public ScpiDigitizer(ScpiSession session, DriverFile driver) {
        super(session, driver);
    }

    @Override
    public void prepare() {
        super.prepare();
        ranges.clear();
        requestedRanges.clear();
        offsets.clear();
        scales.clear();
    }

    @Override
    public RangeLimits rangeLimits(int channel) {
        Map<String, String> ch = channel(channel);
        return new RangeLimits(queryNumber("range_min_query", ch), queryNumber("range_max_query", ch));
    }

    @Override
    public double setRange(int channel, double peakToPeakVolt) {
        Double requested = requestedRanges.get(channel);
        if (requested != null && requested == peakToPeakVolt && ranges.containsKey(channel)) {
            return ranges.get(channel); // unchanged: no round trip
        }
        Map<String, String> values = new HashMap<>(channel(channel));
        values.put("range", ScpiNumbers.nr3(peakToPeakVolt));
        String query = driver.command("range_query").render(channel(channel));
        List<String> replies = session.configure(driver.command("range").render(values) + ";" + query,
                driver.errorQuery());
        double actual = number(query, single(query, replies));
        ranges.put(channel, actual);
        requestedRanges.put(channel, peakToPeakVolt);
        scales.remove(channel);
        return actual;
    }

    @Override
    public void setOffset(int channel, double volt) {
        Map<String, String> values = new HashMap<>(channel(channel));
        values.put("offset", ScpiNumbers.nr3(volt));
        configure("offset", values);
        offsets.put(channel, volt);
        scales.remove(channel);
    }

    @Override
    public void setCoupling(int channel, Coupling coupling) {
        Map<String, String> values = new HashMap<>(channel(channel));
        values.put("coupling", driver.word("couplings", coupling.name().toLowerCase(Locale.ROOT)));
        configure("coupling", values);
    }

    @Override
    public Timing setTiming(double sampleIntervalSecond, int requestedPoints) {
        String intervalQuery = driver.command("interval_query").render(Map.of());
        String pointsQuery = driver.command("points_query").render(Map.of());
        String command = driver.command("interval").render(Map.of("interval", ScpiNumbers.nr3(sampleIntervalSecond)))
                + ";" + driver.command("points").render(Map.of("points", ScpiNumbers.nr1(requestedPoints)))
                + ";" + intervalQuery + ";" + pointsQuery;
        List<String> replies = session.configure(command, driver.errorQuery());
        if (replies.size() != 2) {
            throw new InstrumentException(session.instrument() + ": '" + command + "' answered " + replies
                    + "; expected the interval and the record length");
        }
        double interval = number(intervalQuery, replies.get(0));
        double n = number(pointsQuery, replies.get(1));
        if (n != Math.rint(n) || n < 1) {
            throw new InstrumentException(session.instrument() + ": record length reply " + n + " is not a count");
        }
        points = (int) n;
        scales.clear();
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
        // arm and wait in one message: *OPC? answers once the record is complete
        List<String> replies = session.configure(driver.command("acquire").render(Map.of()) + ";*OPC?",
                driver.errorQuery());
        String opc = single("*OPC?", replies);
        if (!opc.equals("1") && !opc.equals("+1")) {
            throw new InstrumentException(session.instrument() + ": *OPC? after acquiring answered '" + opc + "'");
        }
    }

    @Override
    public Trace fetch(int channel) {
        Double range = ranges.get(channel);
        if (range == null) {
            throw new IllegalStateException("channel " + channel + " range was never set");
        }
        double offset = offsets.getOrDefault(channel, 0.0);
        if (!scales.containsKey(channel)) {
            queryScales(channel);
        }
        double[] scale = scales.get(channel);
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

    /** Asks the scaling of this channel and of every other ranged channel lacking it, in one message. */
    private void queryScales(int channel) {
        List<Integer> channels = new java.util.ArrayList<>();
        channels.add(channel);
        ranges.keySet().stream().filter(c -> c != channel && !scales.containsKey(c)).sorted().forEach(channels::add);
        StringBuilder command = new StringBuilder();
        for (int ch : channels) {
            command.append(command.length() == 0 ? "" : ";").append(driver.command("scale_query").render(channel(ch)));
        }
        List<String> replies = org.lrbench.scpi.ScpiReplies.split(session.query(command.toString()));
        if (replies.size() != channels.size()) {
            throw new InstrumentException(session.instrument() + ": '" + command + "' answered " + replies.size()
                    + " replies for " + channels.size() + " channels");
        }
        for (int i = 0; i < channels.size(); i++) {
            scales.put(channels.get(i), parseScale(command.toString(), replies.get(i)));
        }
    }

    private double[] parseScale(String command, String reply) {
        String[] parts = reply.split(",");
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

    private String single(String command, List<String> replies) {
        if (replies.size() != 1) {
            throw new InstrumentException(session.instrument() + ": '" + command + "' answered " + replies
                    + "; expected one value");
        }
        return replies.get(0);
    }

    private static Map<String, String> channel(int channel) {
        return Map.of("channel", ScpiNumbers.nr1(channel));
    }
}
