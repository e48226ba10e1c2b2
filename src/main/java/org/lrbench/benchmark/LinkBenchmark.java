package org.lrbench.benchmark;

import java.io.BufferedInputStream;
import java.io.DataInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.PrintStream;
import java.net.InetAddress;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.lrbench.bench.BenchConfig;
import org.lrbench.driver.DriverLoader;
import org.lrbench.measure.PointResult;
import org.lrbench.measure.BenchClock;
import org.lrbench.measure.SweepListener;
import org.lrbench.plan.Plan;
import org.lrbench.results.PartResult;
import org.lrbench.run.BenchInstruments;
import org.lrbench.run.PartRun;
import org.lrbench.scpi.ScpiSession;
import org.lrbench.sim.PartModel;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.server.SimServer;
import org.lrbench.transport.Address;
import org.lrbench.transport.tcp.TcpTransport;

/**
 * Measures the instrument links side by side in one run: the transfer rate of a large 8-bit trace
 * through lrbench's TCP transport and SCPI block decoder against a plain Java socket reading the
 * same bytes from the same server, and the round trips and instrument-wait share of a sweep.
 */
public final class LinkBenchmark {
    private static final String FETCH = ":TRACe:DATA? CH1";

    private LinkBenchmark() {
    }

    public static void run(PrintStream out, BenchConfig bench, Plan plan, Path drivers, PartModel part, int points,
                           int repeats) throws Exception {
        out.printf(Locale.ROOT, "trace transfer over loopback TCP: %d samples of 8 bits, %d repeats each%n", points, repeats);
        SimBench sim = new SimBench(bench.simulation(), plan.wiring(), part);
        try (SimServer server = new SimServer(sim, 0)) {
            prepare(server, points);
            double[] ours = new double[repeats];
            double[] plain = new double[repeats];
            long bytes = 0;
            try (ScpiSession s = new ScpiSession("digitizer", new TcpTransport("tcp", "127.0.0.1",
                    server.digitizerPort(), Duration.ofSeconds(5)), Duration.ofSeconds(60))) {
                s.queryBlock(FETCH); // warm-up of both ends
                plainFetch(server.digitizerPort());
                for (int r = 0; r < repeats; r++) {
                    long t0 = System.nanoTime();
                    bytes = s.queryBlock(FETCH).length;
                    ours[r] = bytes / ((System.nanoTime() - t0) / 1e9) / 1e6;
                    long t1 = System.nanoTime();
                    long n = plainFetch(server.digitizerPort());
                    plain[r] = n / ((System.nanoTime() - t1) / 1e9) / 1e6;
                }
            }
            double oursMedian = median(ours);
            double plainMedian = median(plain);
            out.printf(Locale.ROOT, "  lrbench TCP transport + SCPI block decoder: median %.1f MB/s (%s)%n", oursMedian, list(ours));
            out.printf(Locale.ROOT, "  plain java.net.Socket, same bytes:          median %.1f MB/s (%s)%n", plainMedian, list(plain));
            out.printf(Locale.ROOT, "  ratio lrbench / plain socket: %.2f (goal >= 0.80), %d bytes per fetch%n",
                    oursMedian / plainMedian, bytes);
        }
        sweep(out, bench, plan, drivers, part);
    }

    private static void prepare(SimServer server, int points) throws IOException {
        try (ScpiSession g = new ScpiSession("generator", new TcpTransport("tcp", "127.0.0.1", server.generatorPort(),
                Duration.ofSeconds(5)), Duration.ofSeconds(5));
             ScpiSession d = new ScpiSession("digitizer", new TcpTransport("tcp", "127.0.0.1", server.digitizerPort(),
                     Duration.ofSeconds(5)), Duration.ofSeconds(120))) {
            g.configure("*RST;:OUTPut1:LOAD INFinity;:SOURce1:FREQuency:FIXed 1.0E+03;:SOURce1:VOLTage 2;:OUTPut1:STATe ON",
                    ":SYSTem:ERRor?");
            d.configure("*RST;:FORMat:DATA INTeger,8;:SENSe1:VOLTage:RANGe 5;:SENSe:SWEep:TINTerval 1.0E-06;"
                    + ":SENSe:SWEep:POINts " + points, ":SYSTem:ERRor?");
            d.configure(":INITiate;*OPC?", ":SYSTem:ERRor?");
            g.configure(":OUTPut1:STATe OFF", ":SYSTem:ERRor?");
        }
    }

    /** Reads one block reply with nothing but a socket and a DataInputStream. */
    private static long plainFetch(int port) throws IOException {
        try (Socket socket = new Socket(InetAddress.getLoopbackAddress(), port)) {
            socket.setTcpNoDelay(true);
            socket.setReceiveBufferSize(1 << 20);
            OutputStream o = socket.getOutputStream();
            o.write((FETCH + "\n").getBytes(StandardCharsets.US_ASCII));
            o.flush();
            DataInputStream in = new DataInputStream(new BufferedInputStream(socket.getInputStream(), 1 << 16));
            if (in.readUnsignedByte() != '#') {
                throw new IOException("not a block");
            }
            int digits = in.readUnsignedByte() - '0';
            byte[] len = new byte[digits];
            in.readFully(len);
            int n = Integer.parseInt(new String(len, StandardCharsets.US_ASCII));
            byte[] data = new byte[n];
            in.readFully(data);
            if (in.readUnsignedByte() != '\n') {
                throw new IOException("no terminator");
            }
            return n;
        }
    }

    private static void sweep(PrintStream out, BenchConfig bench, Plan plan, Path drivers, PartModel part) throws Exception {
        SimBench sim = new SimBench(bench.simulation(), plan.wiring(), part);
        try (SimServer server = new SimServer(sim, 0)) {
            BenchConfig tcp = bench.withAddresses(Address.parse("tcp://127.0.0.1:" + server.generatorPort()),
                    Address.parse("tcp://127.0.0.1:" + server.digitizerPort()));
            try (BenchInstruments inst = BenchInstruments.open(tcp, new DriverLoader(drivers), null)) {
                List<long[]> marks = new ArrayList<>();
                long[] start = new long[1];
                SweepListener listener = new SweepListener() {
                    @Override
                    public void pointMeasured(int index, int count, PointResult point) {
                        marks.add(new long[] {queries(inst), io(inst), System.nanoTime(), point.acquisitions()});
                    }
                };
                PartRun.Request req = new PartRun.Request(plan, "0", tcp, "BENCH", "BENCH", false, "benchmark");
                start[0] = System.nanoTime();
                long q0 = queries(inst);
                long io0 = io(inst);
                PartResult r = PartRun.measure(req, inst, BenchClock.NONE, listener);
                out.printf(Locale.ROOT, "sweep of %s over loopback TCP: %d points, verdict %s%n",
                        plan.partNumber(), marks.size(), r.verdict());
                long prevQ = -1;
                long prevIo = 0;
                long prevT = 0;
                int steadyMax = 0;
                double outside = 0;
                double total = 0;
                StringBuilder perPoint = new StringBuilder();
                for (int i = 0; i < marks.size(); i++) {
                    long[] m = marks.get(i);
                    if (i > 0) {
                        int rt = (int) (m[0] - prevQ);
                        steadyMax = Math.max(steadyMax, rt);
                        perPoint.append(i == 1 ? "" : ", ").append(rt).append(m[3] > 1 ? " (" + m[3] + " acq.)" : "");
                        double dt = m[2] - prevT;
                        total += dt;
                        outside += dt - (m[1] - prevIo);
                    }
                    prevQ = m[0];
                    prevIo = m[1];
                    prevT = m[2];
                }
                long firstQ = marks.isEmpty() ? 0 : marks.get(0)[0] - q0;
                out.printf(Locale.ROOT, "  round trips: %d up to the first point (identification, set-up, auto-ranging)%n", firstQ);
                out.printf(Locale.ROOT, "  round trips per later point: %s; most %d (goal <= 8)%n", perPoint, steadyMax);
                out.printf(Locale.ROOT, "  share of the later points' time spent outside the instruments: %.1f %%%n",
                        total > 0 ? 100 * outside / total : 0);
                out.printf(Locale.ROOT, "  whole part: %.1f ms, %d round trips, %.1f ms waiting on links%n",
                        (System.nanoTime() - start[0]) / 1e6, queries(inst) - q0, (io(inst) - io0) / 1e6);
            }
        }
    }

    private static long queries(BenchInstruments inst) {
        return inst.sessions().stream().mapToLong(ScpiSession::queries).sum();
    }

    private static long io(BenchInstruments inst) {
        return inst.sessions().stream().mapToLong(ScpiSession::ioNanos).sum();
    }

    private static double median(double[] v) {
        double[] c = v.clone();
        Arrays.sort(c);
        return c.length % 2 == 1 ? c[c.length / 2] : 0.5 * (c[c.length / 2 - 1] + c[c.length / 2]);
    }

    private static String list(double[] v) {
        StringBuilder sb = new StringBuilder();
        for (double x : v) {
            sb.append(sb.length() == 0 ? "" : " ").append(String.format(Locale.ROOT, "%.0f", x));
        }
        return sb.toString();
    }

    /** Reads into a sink: keeps the compiler from removing the plain read. */
    static long drain(InputStream in) throws IOException {
        return in.transferTo(OutputStream.nullOutputStream());
    }
}
