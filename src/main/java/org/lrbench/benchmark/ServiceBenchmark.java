package org.lrbench.benchmark;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.io.PrintStream;
import java.net.InetAddress;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.atomic.AtomicInteger;
import org.lrbench.service.BenchService;
import org.lrbench.service.HttpApi;
import org.lrbench.service.ServiceConfig;

/**
 * A bounded load on loopback: many event-stream clients follow one simulated lot run while another
 * client polls the run's status; prints whether every client got every event in order and the
 * status calls' median and 95th-percentile latency.
 */
public final class ServiceBenchmark {

    private ServiceBenchmark() {
    }

    public static void run(PrintStream out, Path home, Path drivers, Path benchFile, int clients) throws Exception {
        Path dir = Files.createTempDirectory("lrbench-service-bench");
        ServiceConfig cfg = new ServiceConfig(benchFile, drivers, home.resolve("plans"), home.resolve("simulator"),
                dir.resolve("data"), dir.resolve("runs"), dir.resolve("cal"), "benchmark");
        HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
        ObjectMapper json = new ObjectMapper();
        try (BenchService service = new BenchService(cfg);
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            String base = "http://127.0.0.1:" + api.port();
            List<String> serials = new ArrayList<>();
            for (int i = 1; i <= 8; i++) {
                serials.add(String.format(Locale.ROOT, "HC0417-%04d", i));
            }
            send(http, base, "POST", "/api/runs",
                    "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"BENCH-1\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\","
                            + "\"operator\":\"benchmark\"}");
            List<Thread> readers = new ArrayList<>();
            AtomicInteger inOrder = new AtomicInteger();
            AtomicInteger eventsSeen = new AtomicInteger();
            for (int c = 0; c < clients; c++) {
                Thread t = new Thread(() -> {
                    try {
                        var r = http.send(HttpRequest.newBuilder(URI.create(base + "/api/runs/current/events")).build(),
                                HttpResponse.BodyHandlers.ofInputStream());
                        int last = 0;
                        boolean ordered = true;
                        try (BufferedReader in = new BufferedReader(new InputStreamReader(r.body(), StandardCharsets.UTF_8))) {
                            String line;
                            while ((line = in.readLine()) != null) {
                                if (line.startsWith("id: ")) {
                                    int id = Integer.parseInt(line.substring(4));
                                    ordered &= id == last + 1;
                                    last = id;
                                    eventsSeen.incrementAndGet();
                                }
                                if (line.equals("event: lot_done")) {
                                    break;
                                }
                            }
                        }
                        if (ordered) {
                            inOrder.incrementAndGet();
                        }
                    } catch (Exception ignored) {
                        // counted as not in order
                    }
                }, "sse-client");
                t.setDaemon(true);
                t.start();
                readers.add(t);
            }
            List<Double> latencies = Collections.synchronizedList(new ArrayList<>());
            Thread poller = new Thread(() -> {
                long end = System.currentTimeMillis() + 60_000;
                while (System.currentTimeMillis() < end) {
                    try {
                        long t0 = System.nanoTime();
                        String s = send(http, base, "GET", "/api/runs/current", null);
                        latencies.add((System.nanoTime() - t0) / 1e6);
                        if (!json.readTree(s).get("state").asText().equals("running")) {
                            return;
                        }
                        Thread.sleep(5);
                    } catch (Exception e) {
                        return;
                    }
                }
            }, "status-poller");
            poller.setDaemon(true);
            poller.start();
            long t0 = System.nanoTime();
            for (String s : serials) {
                JsonNode status = json.readTree(send(http, base, "GET", "/api/runs/current", null));
                while (!status.get("prompt").isIntegralNumber()) {
                    Thread.sleep(2);
                    status = json.readTree(send(http, base, "GET", "/api/runs/current", null));
                }
                send(http, base, "POST", "/api/runs/current/answer", "{\"prompt\":" + status.get("prompt").asLong()
                        + ",\"serial\":\"" + s + "\"}");
                while (json.readTree(send(http, base, "GET", "/api/runs/current", null)).get("parts_done").asInt()
                        < serials.indexOf(s) + 1) {
                    Thread.sleep(5);
                }
            }
            service.join(60_000);
            double seconds = (System.nanoTime() - t0) / 1e9;
            for (Thread t : readers) {
                t.join(10_000);
            }
            poller.join(10_000);
            List<Double> sorted = new ArrayList<>(latencies);
            Collections.sort(sorted);
            int total = service.current().events.size();
            out.printf(Locale.ROOT, "service on loopback: %d event-stream clients following a lot of 8 parts (%.1f s)%n",
                    clients, seconds);
            out.printf(Locale.ROOT, "  clients that got every event in order: %d of %d (%d events each, %d received in all)%n",
                    inOrder.get(), clients, total, eventsSeen.get());
            if (!sorted.isEmpty()) {
                out.printf(Locale.ROOT, "  status calls during the run: %d, median %.1f ms, 95th percentile %.1f ms"
                        + " (goal: median under 100 ms)%n", sorted.size(), sorted.get(sorted.size() / 2),
                        sorted.get((int) Math.min(sorted.size() - 1, Math.round(0.95 * sorted.size()))));
            }
        }
    }

    private static String send(HttpClient http, String base, String method, String path, String body) throws Exception {
        HttpRequest r = HttpRequest.newBuilder(URI.create(base + path)).timeout(Duration.ofSeconds(30))
                .method(method, body == null ? HttpRequest.BodyPublishers.noBody() : HttpRequest.BodyPublishers.ofString(body))
                .build();
        return http.send(r, HttpResponse.BodyHandlers.ofString()).body();
    }
}
