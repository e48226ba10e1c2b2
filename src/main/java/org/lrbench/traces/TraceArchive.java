package org.lrbench.traces;

import org.lrbench.fixture.FixtureWiring;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.ByteArrayOutputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.zip.CRC32;
import org.lrbench.instrument.Trace;
import org.lrbench.measure.PointResult;
import org.lrbench.results.ResultFiles;

/**
 * Every trace behind a part's verdict, in one file of our own format ({@code .lrtraces}):
 * <pre>
 *   4 bytes   "LRTA"
 *   2 bytes   format version, big-endian (2; version 1 is read as well)
 *   4 bytes   length N of the header, big-endian
 *   N bytes   header, UTF-8 JSON: lot, serial, part number, sense resistor, the fixture's wiring (low
 *             side or not, each probe's attenuation; absent in older archives), instrument identities,
 *             and per point its frequency, sample interval, start time, and per channel its range,
 *             offset and sample count; {@code "shared_capture": true} (version 2) where every point is a
 *             tone of one multisine capture
 *   then      per point, channel 1 then channel 2: the samples in volts, IEEE 754 float64, big-endian;
 *             with a shared capture its samples once (version 1 wrote them again for every point)
 *   4 bytes   CRC-32 of everything before it
 * </pre>
 * Reading checks the magic, the version, the lengths and the CRC, and names what is wrong.
 */
public final class TraceArchive {
    static final byte[] MAGIC = "LRTA".getBytes(StandardCharsets.US_ASCII);
    static final int VERSION = 2;

    private TraceArchive() {
    }

    /** One archived point: its frequency, time base, and both channels. */
    public record Point(double frequencyHz, double intervalSecond, double startSecond, double[] sense, double[] part,
                        double senseRange, double partRange) {
    }

    /** An archive read back: its header and its points. */
    public record Contents(JsonNode header, List<Point> points) {
    }

    public static byte[] encode(String lot, String serial, String partNumber, double senseOhm, FixtureWiring wiring,
                                JsonNode identities, List<PointResult> points) throws IOException {
        ObjectNode h = ResultFiles.JSON.createObjectNode();
        h.put("lot", lot);
        h.put("serial", serial);
        h.put("part_number", partNumber);
        h.put("sense_resistor_ohm", senseOhm);
        // how the traces became the fixture's voltages (archives without it: differential, unity probes)
        ObjectNode w = h.putObject("wiring");
        w.put("low_side", FixtureWiring.lowSide(wiring));
        w.put("attenuation_1", wiring == null ? 1 : wiring.attenuation1());
        w.put("attenuation_2", wiring == null ? 1 : wiring.attenuation2());
        h.set("instruments", identities);
        // one capture behind every point: the sweep was one multisine, its tones fitted together
        boolean oneCapture = points.size() > 1 && points.stream().allMatch(p -> p.senseTrace() == points.get(0).senseTrace());
        h.put("excitation", oneCapture ? "multisine" : "stepped");
        h.put("shared_capture", oneCapture);
        ArrayNode pts = h.putArray("points");
        for (PointResult p : points) {
            ObjectNode o = pts.addObject();
            o.put("frequency_hz", p.impedance().frequencyHz());
            o.put("interval_s", p.senseTrace().intervalSecond());
            o.put("start_s", p.senseTrace().startSecond());
            channel(o.putObject("sense"), p.senseTrace());
            channel(o.putObject("part"), p.partTrace());
        }
        byte[] header = ResultFiles.JSON.writeValueAsBytes(h);
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        DataOutputStream out = new DataOutputStream(bytes);
        out.write(MAGIC);
        out.writeShort(VERSION);
        out.writeInt(header.length);
        out.write(header);
        for (PointResult p : oneCapture ? points.subList(0, 1) : points) {
            for (double v : p.senseTrace().volts()) {
                out.writeDouble(v);
            }
            for (double v : p.partTrace().volts()) {
                out.writeDouble(v);
            }
        }
        out.flush();
        CRC32 crc = new CRC32();
        crc.update(bytes.toByteArray());
        out.writeInt((int) crc.getValue());
        return bytes.toByteArray();
    }

    private static void channel(ObjectNode o, Trace t) {
        o.put("range_v", t.rangeVolt());
        o.put("offset_v", t.offsetVolt());
        o.put("samples", t.length());
    }

    public static Contents read(Path file) throws IOException {
        byte[] all = Files.readAllBytes(file);
        String where = file.toString();
        if (all.length < 14 || !Arrays.equals(Arrays.copyOf(all, 4), MAGIC)) {
            throw new IOException(where + ": not a trace archive (no LRTA header)");
        }
        CRC32 crc = new CRC32();
        crc.update(all, 0, all.length - 4);
        ByteBuffer b = ByteBuffer.wrap(all);
        if (b.getInt(all.length - 4) != (int) crc.getValue()) {
            throw new IOException(where + ": the archive is corrupt or truncated (CRC-32 does not match)");
        }
        b.position(4);
        int version = b.getShort();
        if (version < 1 || version > VERSION) {
            throw new IOException(where + ": archive format version " + version + "; this lrbench reads 1 to " + VERSION);
        }
        int n = b.getInt();
        if (n < 0 || n > all.length - 14) {
            throw new IOException(where + ": header length " + n + " does not fit the file");
        }
        JsonNode header = ResultFiles.JSON.readTree(new String(all, 10, n, StandardCharsets.UTF_8));
        b.position(10 + n);
        List<Point> points = new ArrayList<>();
        boolean shared = version >= 2 && header.path("shared_capture").asBoolean(false);
        double[][] capture = null;
        for (JsonNode p : header.get("points")) {
            int ns = p.get("sense").get("samples").asInt();
            int nq = p.get("part").get("samples").asInt();
            if (capture != null && (ns != capture[0].length || nq != capture[1].length)) {
                throw new IOException(where + ": a point of a shared capture names " + ns + " and " + nq
                        + " samples; the capture has " + capture[0].length + " and " + capture[1].length);
            }
            double[] s = capture != null ? capture[0] : samples(b, ns, where);
            double[] q = capture != null ? capture[1] : samples(b, nq, where);
            if (shared) {
                capture = new double[][] {s, q};
            }
            points.add(new Point(p.get("frequency_hz").asDouble(), p.get("interval_s").asDouble(), p.get("start_s").asDouble(),
                    s, q, p.get("sense").get("range_v").asDouble(), p.get("part").get("range_v").asDouble()));
        }
        if (b.position() != all.length - 4) {
            throw new IOException(where + ": " + (all.length - 4 - b.position()) + " bytes left over after the samples");
        }
        return new Contents(header, List.copyOf(points));
    }

    private static double[] samples(ByteBuffer b, int n, String where) throws IOException {
        if (n < 0 || (long) n * 8 > b.remaining() - 4) {
            throw new IOException(where + ": the header promises " + n + " samples that the file does not hold");
        }
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            v[i] = b.getDouble();
        }
        return v;
    }
}
