package org.lrbench.driver;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeSet;
import org.lrbench.instrument.Coupling;
import org.lrbench.instrument.Digitizer;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.instrument.RangeLimits;
import org.lrbench.instrument.Timing;
import org.lrbench.instrument.Trace;
import org.lrbench.instrument.TriggerSource;
import org.lrbench.scpi.BlockFormatException;
import org.lrbench.scpi.ScpiNumbers;
import org.lrbench.scpi.ScpiReplies;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.scpi.TraceEncoding;

/** A digitizer that speaks SCPI through a digitizer driver file. */
public final class ScpiDigitizer extends DrivenInstrument implements Digitizer {
    private final Map<Integer, RangeLimits> limitsAsked = new HashMap<>();
    private final Map<Integer, Double> ranges = new HashMap<>();
    private final Map<Integer, Double> requestedRanges = new HashMap<>();
    private final Map<Integer, Double> offsets = new HashMap<>();
    private final Map<Integer, double[]> scales = new HashMap<>();
    private int points;
    private double interval;
    private final DigitizerTraits traits;

    public ScpiDigitizer(ScpiSession session, DriverFile driver) {
        super(session, driver);
        this.traits = driver.digitizer() == null ? DigitizerTraits.GENERIC : driver.digitizer();
    }

    /** Instrument units of the vertical setting per volt of full-scale peak-to-peak range. */
    private double perPeakToPeak() {
        return traits.vertical().perPeakToPeak();
    }

    @Override
    public void prepare() {
        super.prepare();
        ranges.clear();
        requestedRanges.clear();
        offsets.clear();
        scales.clear();
    }

    /** A channel's range limits, asked once: they are the instrument's, not a setting's. */
    @Override
    public RangeLimits rangeLimits(int channel) {
        return limitsAsked.computeIfAbsent(channel, c -> askRangeLimits(c).withRounding(traits.vertical().rounding()));
    }

    private RangeLimits askRangeLimits(int channel) {
        List<Double> declared = traits.vertical().ranges();
        if (!declared.isEmpty()) {
            return new RangeLimits(declared.get(0) / perPeakToPeak(), declared.get(declared.size() - 1) / perPeakToPeak(),
                    declared.stream().map(r -> r / perPeakToPeak()).toList());
        }
        Map<String, String> ch = channel(channel);
        if (driver.has("range_list_query")) {
            String query = driver.command("range_list_query").render(ch);
            double[] list = TraceEncoding.decodeAscii(session.query(query));
            if (list.length == 0) {
                throw new InstrumentException(session.instrument() + ": '" + query + "' answered no ranges");
            }
            double min = Arrays.stream(list).min().orElseThrow();
            double max = Arrays.stream(list).max().orElseThrow();
            if (!(min > 0)) {
                throw new InstrumentException(session.instrument() + ": '" + query + "' answered a range of " + min);
            }
            return new RangeLimits(min / perPeakToPeak(), max / perPeakToPeak(),
                    Arrays.stream(list).mapToObj(r -> r / perPeakToPeak()).toList());
        }
        // both in one message, one round trip
        String min = driver.command("range_min_query").render(ch);
        String max = driver.command("range_max_query").render(ch);
        List<String> replies = session.configure(min + ";" + max, driver.errorQuery());
        if (replies.size() != 2) {
            throw new InstrumentException(session.instrument() + ": '" + min + ";" + max + "' answered " + replies.size()
                    + " replies; expected 2");
        }
        return new RangeLimits(number(min, replies.get(0).trim()) / perPeakToPeak(),
                number(max, replies.get(1).trim()) / perPeakToPeak());
    }

    @Override
    public double inputNoiseVolt() {
        Double declared = traits.vertical().noiseVolt();
        return declared == null ? Digitizer.super.inputNoiseVolt() : declared;
    }

    @Override
    public int maxRecordLength() {
        Integer declared = driver.limits().maxRecordLength();
        return declared == null ? Digitizer.super.maxRecordLength() : declared;
    }

    @Override
    public double minIntervalSecond() {
        Double declared = driver.limits().minIntervalSecond();
        return declared == null ? Digitizer.super.minIntervalSecond() : declared;
    }

    @Override
    public double setRange(int channel, double peakToPeakVolt) {
        Double requested = requestedRanges.get(channel);
        if (requested != null && requested == peakToPeakVolt && ranges.containsKey(channel)) {
            return ranges.get(channel); // unchanged: no round trip
        }
        Map<String, String> values = new HashMap<>(channel(channel));
        values.put("range", ScpiNumbers.nr3(peakToPeakVolt * perPeakToPeak()));
        String query = driver.command("range_query").render(channel(channel));
        List<String> replies = session.configure(driver.command("range").render(values) + ";" + query,
                driver.errorQuery());
        double actual = number(query, single(query, replies)) / perPeakToPeak();
        if (!(actual > 0)) {
            throw new InstrumentException(session.instrument() + ": '" + query + "' answered a range of " + actual);
        }
        ranges.put(channel, actual);
        requestedRanges.put(channel, peakToPeakVolt);
        scales.remove(channel);
        return actual;
    }

    /** Both channels' ranges in one message when both change (one round trip, not two). */
    @Override
    public double[] setRanges(double peakToPeak1, double peakToPeak2) {
        boolean same1 = requestedRanges.get(1) != null && requestedRanges.get(1) == peakToPeak1 && ranges.containsKey(1);
        boolean same2 = requestedRanges.get(2) != null && requestedRanges.get(2) == peakToPeak2 && ranges.containsKey(2);
        if (same1 || same2) {
            return new double[] {setRange(1, peakToPeak1), setRange(2, peakToPeak2)};
        }
        StringBuilder message = new StringBuilder();
        double[] requested = {peakToPeak1, peakToPeak2};
        String[] queries = new String[2];
        for (int ch = 1; ch <= 2; ch++) {
            Map<String, String> values = new HashMap<>(channel(ch));
            values.put("range", ScpiNumbers.nr3(requested[ch - 1] * perPeakToPeak()));
            queries[ch - 1] = driver.command("range_query").render(channel(ch));
            message.append(ch == 1 ? "" : ";").append(driver.command("range").render(values)).append(';')
                    .append(queries[ch - 1]);
        }
        List<String> replies = session.configure(message.toString(), driver.errorQuery());
        if (replies.size() != 2) {
            throw new InstrumentException(session.instrument() + ": '" + message + "' answered " + replies.size()
                    + " replies; expected 2");
        }
        double[] actual = new double[2];
        for (int ch = 1; ch <= 2; ch++) {
            actual[ch - 1] = number(queries[ch - 1], replies.get(ch - 1).trim()) / perPeakToPeak();
            if (!(actual[ch - 1] > 0)) {
                throw new InstrumentException(session.instrument() + ": '" + queries[ch - 1] + "' answered a range of "
                        + actual[ch - 1]);
            }
            ranges.put(ch, actual[ch - 1]);
            requestedRanges.put(ch, requested[ch - 1]);
            scales.remove(ch);
        }
        return actual;
    }

    @Override
    public void setOffset(int channel, double volt) {
        if (!driver.has("offset")) {
            // an instrument without an input offset sits at 0 V; any other offset cannot be had
            if (volt != 0) {
                throw new InstrumentException(session.instrument() + ": this digitizer's driver has no offset command"
                        + " (commands.offset); an offset of " + ScpiNumbers.nr3(volt) + " V was needed");
            }
            offsets.put(channel, 0.0);
            return;
        }
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
    public Timing setTiming(double sampleIntervalSecond, int wanted) {
        TimingMessage m = timingMessage(sampleIntervalSecond, wanted);
        List<String> replies = session.configure(m.command(), driver.errorQuery());
        if (replies.size() != 2) {
            throw new InstrumentException(session.instrument() + ": '" + m.command() + "' answered " + replies
                    + "; expected the interval and the record length");
        }
        return acceptTiming(m, replies.get(0), replies.get(1));
    }

    /**
     * The time base and the ranges of the channels whose request changed in one message (one round
     * trip), each read back in the same reply.
     */
    @Override
    public Timing setTimingAndRanges(double sampleIntervalSecond, int wanted, double peakToPeak1, double peakToPeak2,
                                     double[] granted) {
        TimingMessage m = timingMessage(sampleIntervalSecond, wanted);
        RangeMessage r = rangeMessage(peakToPeak1, peakToPeak2);
        String message = m.command() + r.command();
        List<String> replies = session.configure(message, driver.errorQuery());
        if (replies.size() != 2 + r.channels().size()) {
            throw new InstrumentException(session.instrument() + ": '" + message + "' answered " + replies.size()
                    + " replies; expected " + (2 + r.channels().size()));
        }
        Timing t = acceptTiming(m, replies.get(0), replies.get(1));
        acceptRanges(r, replies.subList(2, replies.size()), granted);
        return t;
    }

    /**
     * The time base, the changed ranges and the arming in one message, each read back in the reply,
     * with the completion the driver declares: *OPC? (and the scaling of every ranged channel) in the
     * same message, the first poll (with the scaling) in the same message, or the fixed wait after it.
     * One round trip where there would be two.
     */
    @Override
    public Timing setTimingAndRangesThenAcquire(double sampleIntervalSecond, int wanted, double peakToPeak1,
                                                double peakToPeak2, double[] granted) {
        TimingMessage m = timingMessage(sampleIntervalSecond, wanted);
        RangeMessage r = rangeMessage(peakToPeak1, peakToPeak2);
        // a new time base voids every channel's scaling: ask each ranged channel's after the record
        TreeSet<Integer> channels = new TreeSet<>(ranges.keySet());
        channels.addAll(r.channels());
        Timing[] t = new Timing[1];
        armAndWait(m.command() + r.command(), 2 + r.channels().size(), channels, replies -> {
            t[0] = acceptTiming(m, replies.get(0), replies.get(1));
            acceptRanges(r, replies.subList(2, replies.size()), granted);
        });
        return t[0];
    }

    /** The range settings and read-back queries of the channels whose request changed, each after a ';'. */
    private record RangeMessage(String command, List<Integer> channels, List<String> queries, double[] requested) {
    }

    private RangeMessage rangeMessage(double peakToPeak1, double peakToPeak2) {
        StringBuilder message = new StringBuilder();
        double[] requested = {peakToPeak1, peakToPeak2};
        List<Integer> changing = new ArrayList<>();
        List<String> queries = new ArrayList<>();
        for (int ch = 1; ch <= 2; ch++) {
            Double before = requestedRanges.get(ch);
            if (before != null && before == requested[ch - 1] && ranges.containsKey(ch)) {
                continue; // unchanged: not sent
            }
            Map<String, String> values = new HashMap<>(channel(ch));
            values.put("range", ScpiNumbers.nr3(requested[ch - 1] * perPeakToPeak()));
            String query = driver.command("range_query").render(channel(ch));
            message.append(';').append(driver.command("range").render(values)).append(';').append(query);
            changing.add(ch);
            queries.add(query);
        }
        return new RangeMessage(message.toString(), changing, queries, requested);
    }

    /** The ranges read back for a {@link RangeMessage}; both channels' ranges in effect into {@code granted}. */
    private void acceptRanges(RangeMessage r, List<String> replies, double[] granted) {
        for (int i = 0; i < r.channels().size(); i++) {
            int ch = r.channels().get(i);
            double actual = number(r.queries().get(i), replies.get(i).trim()) / perPeakToPeak();
            if (!(actual > 0)) {
                throw new InstrumentException(session.instrument() + ": '" + r.queries().get(i) + "' answered a range of "
                        + actual);
            }
            ranges.put(ch, actual);
            requestedRanges.put(ch, r.requested()[ch - 1]);
        }
        granted[0] = ranges.get(1);
        granted[1] = ranges.get(2);
    }

    /** A time-base request: the settings and their read-back queries, as one command string. */
    private record TimingMessage(String command, String intervalQuery, String pointsQuery, boolean rate,
                                 double askedInterval) {
    }

    private TimingMessage timingMessage(double sampleIntervalSecond, int wanted) {
        int requestedPoints = wanted;
        List<Integer> lengths = traits.timebase().recordLengths();
        if (!lengths.isEmpty()) {
            // the shortest record the instrument offers that holds the request (or its longest)
            requestedPoints = lengths.stream().filter(n -> n >= wanted).findFirst().orElse(lengths.get(lengths.size() - 1));
        }
        String intervalQuery = driver.command("interval_query").render(Map.of());
        String pointsQuery = driver.command("points_query").render(Map.of());
        String command = driver.command("interval").render(Map.of("interval", ScpiNumbers.nr3(sampleIntervalSecond),
                        "rate", ScpiNumbers.nr3(1 / sampleIntervalSecond),
                        "duration", ScpiNumbers.nr3(sampleIntervalSecond * requestedPoints)))
                + ";" + driver.command("points").render(Map.of("points", ScpiNumbers.nr1(requestedPoints)))
                + ";" + intervalQuery + ";" + pointsQuery;
        return new TimingMessage(command, intervalQuery, pointsQuery, traits.timebase().rate(), sampleIntervalSecond);
    }

    private Timing acceptTiming(TimingMessage m, String intervalReply, String pointsReply) {
        double answered = number(m.intervalQuery(), intervalReply);
        if (!(answered > 0)) {
            throw new InstrumentException(session.instrument() + ": '" + m.intervalQuery() + "' answered " + answered);
        }
        interval = m.rate() ? 1 / answered : answered;
        org.lrbench.instrument.RangeLimits.Rounding declared = traits.timebase().rounding();
        if (declared != null && !declared.allows(m.askedInterval(), interval)) {
            throw new InstrumentException(session.instrument() + ": asked for a sample interval of "
                    + ScpiNumbers.nr3(m.askedInterval()) + " s, granted " + ScpiNumbers.nr3(interval) + " s, but the driver"
                    + " declares timebase.rounding: " + declared.name().toLowerCase(java.util.Locale.ROOT)
                    + ": the declaration is not the instrument's");
        }
        double n = number(m.pointsQuery(), pointsReply);
        if (n != Math.rint(n) || n < 1) {
            throw new InstrumentException(session.instrument() + ": record length reply " + n + " is not a count");
        }
        points = (int) n;
        scales.clear();
        return new Timing(interval, points);
    }

    @Override
    public void setTrigger(TriggerSource source, double levelVolt, boolean rising) {
        if (!driver.has("trigger")) {
            return; // no trigger setting: the instrument runs free, and the sine fit needs no trigger
        }
        String word = driver.word("trigger_sources", source.name().toLowerCase(Locale.ROOT));
        if (word == null) {
            // the source is not the instrument's: run free where it can, which the fit allows
            word = driver.word("trigger_sources", "immediate");
            if (word == null) {
                throw new InstrumentException(session.instrument() + ": this digitizer's driver has no trigger source "
                        + source.name().toLowerCase(Locale.ROOT) + " and no immediate (trigger_sources)");
            }
        }
        Map<String, String> values = new HashMap<>();
        values.put("source", word);
        values.put("level", ScpiNumbers.nr3(levelVolt));
        String slope = driver.word("slopes", rising ? "rising" : "falling");
        if (slope != null) {
            values.put("slope", slope);
        }
        configure("trigger", values);
    }

    @Override
    public void acquire() {
        armAndWait("", 0, ranges.keySet(), replies -> { });
    }

    /**
     * The scaling queries of {@code channels} whose scaling the instrument gives and is not known
     * yet, to go after a completion in the same message, and how many replies they take.
     */
    private record ScaleAsk(List<Integer> channels, List<String> queries, int perChannel) {
        String suffix() {
            return queries.isEmpty() ? "" : ";" + String.join(";", queries);
        }
    }

    private ScaleAsk scaleAsk(java.util.Collection<Integer> candidates, boolean voided) {
        List<Integer> channels = candidates.stream().filter(c -> voided || !scales.containsKey(c)).sorted().toList();
        List<String> queries = new ArrayList<>();
        int per;
        switch (traits.scaling().source()) {
            case SCALE_QUERY, REPLY_FIELDS -> {
                per = 1;
                channels.forEach(ch -> queries.add(driver.command("scale_query").render(channel(ch))));
            }
            case QUERIES -> {
                Map<String, CommandTemplate> q = traits.scaling().queries();
                List<String> names = q.keySet().stream().sorted().toList();
                per = names.size();
                channels.forEach(ch -> names.forEach(n -> queries.add(q.get(n).render(channel(ch)))));
            }
            default -> {
                return new ScaleAsk(List.of(), List.of(), 0);
            }
        }
        return new ScaleAsk(channels, queries, per);
    }

    /** Keeps the scaling replies of {@code ask}, in its order. */
    private void takeScales(ScaleAsk ask, String message, List<String> replies) {
        for (int i = 0; i < ask.channels().size(); i++) {
            List<String> mine = replies.subList(i * ask.perChannel(), (i + 1) * ask.perChannel());
            if (traits.scaling().source() == DigitizerTraits.ScaleSource.QUERIES) {
                List<String> names = traits.scaling().queries().keySet().stream().sorted().toList();
                Map<String, Double> v = new HashMap<>();
                for (int k = 0; k < names.size(); k++) {
                    v.put(names.get(k), number(ask.queries().get(i * ask.perChannel() + k), mine.get(k).trim()));
                }
                scales.put(ask.channels().get(i), scaleFrom(v, message));
            } else {
                scales.put(ask.channels().get(i), parseScale(message, mine.get(0).trim()));
            }
        }
    }

    /**
     * Sends {@code settings} (possibly empty; {@code settingsReplies} replies of its own, given to
     * {@code settled} before the scaling is taken), arms, and waits as the driver declares: *OPC? in
     * the same message; polling, the first poll in the same message; or the fixed wait. The scaling of
     * {@code channels} the instrument gives goes after *OPC? or after each poll (kept from the poll
     * that finds the record complete: the instrument answers its queries in order).
     */
    private void armAndWait(String settings, int settingsReplies, java.util.Collection<Integer> channels,
                            java.util.function.Consumer<List<String>> settled) {
        String arm = driver.command("acquire").render(Map.of());
        String head = settings.isEmpty() ? arm : settings + ";" + arm;
        DigitizerTraits.Acquisition a = traits.acquisition();
        boolean voided = settingsReplies > 0;
        switch (a.complete()) {
            case OPC -> {
                // arm and wait in one message: *OPC? answers once the record is complete; the scaling
                // the fetches will need is asked in the same message (one round trip, not two)
                ScaleAsk ask = scaleAsk(channels, voided);
                String message = head + ";*OPC?" + ask.suffix();
                List<String> replies;
                try {
                    replies = session.configure(message, driver.errorQuery());
                } catch (InstrumentException e) {
                    if (!timedOut(e)) {
                        throw e;
                    }
                    throw new InstrumentException(e.getMessage() + ". No answer to *OPC? after arming within the driver's"
                            + " timeout (" + driver.timeout().toMillis() + " ms): a digitizer that tells the end of a"
                            + " capture only through a status query needs acquisition: {complete: poll, poll_query:"
                            + " ..., until: ...} in its driver, one without *OPC? complete: wait; a record longer than"
                            + " the timeout needs a longer timeout", e);
                }
                expectReplies(message, replies, settingsReplies + 1 + ask.queries().size());
                settled.accept(replies.subList(0, settingsReplies));
                String opc = replies.get(settingsReplies).trim();
                if (!opc.equals("1") && !opc.equals("+1")) {
                    throw new InstrumentException(session.instrument() + ": *OPC? after acquiring answered '" + opc + "'");
                }
                takeScales(ask, message, replies.subList(settingsReplies + 1, replies.size()));
            }
            case WAIT -> {
                List<String> replies = session.configure(head, driver.errorQuery());
                expectReplies(head, replies, settingsReplies);
                settled.accept(replies);
                pause(a.pause().toNanos());
            }
            case POLL -> {
                // arming and the first poll in one message (with the error query: one round trip)
                ScaleAsk ask = scaleAsk(channels, voided);
                String message = head + ";" + a.pollQuery() + ask.suffix();
                List<String> first = session.configure(message, driver.errorQuery());
                expectReplies(message, first, settingsReplies + 1 + ask.queries().size());
                settled.accept(first.subList(0, settingsReplies));
                String last = first.get(settingsReplies).trim();
                List<String> scaling = first.subList(settingsReplies + 1, first.size());
                long deadline = System.nanoTime() + driver.timeout().toNanos();
                while (!last.equalsIgnoreCase(a.until())) {
                    if (System.nanoTime() >= deadline) {
                        throw new InstrumentException(session.instrument() + ": the acquisition did not complete: '"
                                + a.pollQuery() + "' still answered '" + last + "' (waiting for '" + a.until() + "') after "
                                + driver.timeout().toMillis() + " ms");
                    }
                    pause(a.pause().toNanos());
                    String poll = a.pollQuery() + ask.suffix();
                    List<String> replies = ScpiReplies.split(session.query(poll));
                    expectReplies(poll, replies, 1 + ask.queries().size());
                    last = replies.get(0).trim();
                    scaling = replies.subList(1, replies.size());
                }
                takeScales(ask, message, scaling);
            }
        }
    }

    private void expectReplies(String message, List<String> replies, int expected) {
        if (replies.size() != expected) {
            throw new InstrumentException(session.instrument() + ": '" + message + "' answered " + replies.size()
                    + " replies; expected " + expected);
        }
    }

    /** Whether the failure was a reply that never came (a timeout anywhere in its causes). */
    private static boolean timedOut(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof org.lrbench.transport.TransportTimeoutException) {
                return true;
            }
        }
        return false;
    }

    private static void pause(long nanos) {
        try {
            Thread.sleep(nanos / 1_000_000, (int) (nanos % 1_000_000));
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new InstrumentException("interrupted while waiting for an acquisition", e);
        }
    }

    @Override
    public Trace fetch(int channel) {
        Double range = ranges.get(channel);
        if (range == null) {
            throw new IllegalStateException("channel " + channel + " range was never set");
        }
        double offset = offsets.getOrDefault(channel, 0.0);
        double[] scale = scale(channel, range, offset);
        String fetchCommand = driver.command("fetch").render(channel(channel));
        TraceEncoding encoding = driver.traceEncoding();
        double[] raw;
        try {
            if (encoding == TraceEncoding.ASCII_LINES) {
                if (points < 1) {
                    throw new IllegalStateException("the record length was never set");
                }
                raw = TraceEncoding.decodeAscii(String.join(",", session.queryLines(fetchCommand, points)));
            } else {
                raw = encoding.isBinary() ? encoding.decode(session.queryBlock(fetchCommand, traits.blockTerminated()))
                        : TraceEncoding.decodeAscii(session.query(fetchCommand));
            }
        } catch (BlockFormatException e) {
            throw new InstrumentException(session.instrument() + ": trace from '" + fetchCommand + "': " + e.getMessage(), e);
        }
        return trace(channel, fetchCommand, raw, scale, range, offset);
    }

    @Override
    public Trace[] fetchBoth() {
        TraceEncoding encoding = driver.traceEncoding();
        if (!traits.fetchTogether() || !encoding.isBinary()) {
            return Digitizer.super.fetchBoth();
        }
        double[][] scales = new double[3][];
        for (int ch = 1; ch <= 2; ch++) {
            if (ranges.get(ch) == null) {
                throw new IllegalStateException("channel " + ch + " range was never set");
            }
            scales[ch] = scale(ch, ranges.get(ch), offsets.getOrDefault(ch, 0.0));
        }
        String one = driver.command("fetch").render(channel(1));
        String two = driver.command("fetch").render(channel(2));
        List<byte[]> blocks = session.queryBlocks(one + ";" + two, 2, traits.blockTerminated());
        Trace[] out = new Trace[2];
        for (int ch = 1; ch <= 2; ch++) {
            String command = ch == 1 ? one : two;
            double[] raw;
            try {
                raw = encoding.decode(blocks.get(ch - 1));
            } catch (BlockFormatException e) {
                throw new InstrumentException(session.instrument() + ": trace from '" + command + "': " + e.getMessage(), e);
            }
            out[ch - 1] = trace(ch, command, raw, scales[ch], ranges.get(ch), offsets.getOrDefault(ch, 0.0));
        }
        return out;
    }

    /** A channel's codes as a trace in volts, its clipped samples counted. */
    private Trace trace(int channel, String fetchCommand, double[] raw, double[] scale, double range, double offset) {
        TraceEncoding encoding = driver.traceEncoding();
        if (points > 0 && raw.length != points) {
            throw new InstrumentException(session.instrument() + ": '" + fetchCommand + "' returned " + raw.length
                    + " samples, the record length is " + points);
        }
        double[] volts = new double[raw.length];
        int clipped = 0;
        double half = range / 2;
        DigitizerTraits.Scaling sc = traits.scaling();
        double low = sc.clipLow() != null ? sc.clipLow() : encoding.minCode();
        double high = sc.clipHigh() != null ? sc.clipHigh() : encoding.maxCode();
        for (int i = 0; i < raw.length; i++) {
            volts[i] = scale[3] + scale[2] * raw[i];
            boolean atLimit = encoding.isInteger()
                    ? raw[i] <= low || raw[i] >= high
                    : Math.abs(volts[i] - offset) >= half * (1 - 1e-9);
            if (atLimit) {
                clipped++;
            }
        }
        return new Trace(channel, scale[0], scale[1], volts, range, offset, clipped);
    }

    /**
     * The channel's scaling as {x increment, x origin, y increment, y origin}, volts = y origin +
     * y increment * code: from the instrument (four numbers or the scale query's reply), from the declared
     * formula, or the identity for data in volts.
     */
    private double[] scale(int channel, double range, double offset) {
        DigitizerTraits.Scaling sc = traits.scaling();
        return switch (sc.source()) {
            case SCALE_QUERY, REPLY_FIELDS, QUERIES -> {
                if (!scales.containsKey(channel)) {
                    askScales(channel);
                }
                yield scales.get(channel);
            }
            case FORMULA -> new double[] {timebase(), 0, range / sc.fullScaleCodes(),
                offset - sc.zeroCode() * range / sc.fullScaleCodes()};
            case NONE -> new double[] {timebase(), 0, 1, 0};
        };
    }

    private double timebase() {
        if (!(interval > 0)) {
            throw new IllegalStateException("the time base was never set");
        }
        return interval;
    }

    /** Asks the scaling of this channel and of every other ranged channel lacking it, in one message. */
    private void askScales(int channel) {
        java.util.Set<Integer> candidates = new TreeSet<>(ranges.keySet());
        candidates.add(channel);
        ScaleAsk ask = scaleAsk(candidates, false);
        String message = String.join(";", ask.queries());
        List<String> replies = ScpiReplies.split(session.query(message));
        expectReplies(message, replies, ask.queries().size());
        takeScales(ask, message, replies);
    }

    private double[] parseScale(String command, String reply) {
        if (traits.scaling().source() == DigitizerTraits.ScaleSource.REPLY_FIELDS) {
            return parsePreamble(command, reply);
        }
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

    /** Fields picked by position from the scale query's reply: volts = (code - y reference) * y increment + y origin. */
    private double[] parsePreamble(String command, String reply) {
        String[] parts = reply.split(",");
        Map<String, Integer> fields = traits.scaling().fields();
        Map<String, Double> v = new HashMap<>();
        for (Map.Entry<String, Integer> f : fields.entrySet()) {
            int pos = f.getValue();
            if (pos > parts.length) {
                throw new InstrumentException(session.instrument() + ": reply to '" + command + "' has " + parts.length
                        + " fields; the driver takes " + f.getKey() + " from field " + pos);
            }
            try {
                v.put(f.getKey(), ScpiNumbers.parse(parts[pos - 1]));
            } catch (NumberFormatException e) {
                throw new InstrumentException(session.instrument() + ": reply to '" + command + "' field " + pos + " ("
                        + f.getKey() + ") is '" + parts[pos - 1] + "', not a number");
            }
        }
        return scaleFrom(v, command);
    }

    /** The scaling from named fields; without an x increment the read-back interval is used. */
    private double[] scaleFrom(Map<String, Double> v, String command) {
        double xInc = v.containsKey("x_increment") ? v.get("x_increment") : timebase();
        if (!(xInc > 0)) {
            throw new InstrumentException(session.instrument() + ": sample interval " + xInc + " from '" + command
                    + "' is not positive");
        }
        double yInc = v.get("y_increment");
        double yRef = v.getOrDefault("y_reference", 0.0);
        double yOrigin = v.getOrDefault("y_origin", 0.0);
        return new double[] {xInc, v.getOrDefault("x_origin", 0.0), yInc, yOrigin - yRef * yInc};
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
