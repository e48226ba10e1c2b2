package org.lrbench.service;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.net.InetAddress;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermission;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.TestBench;
import org.lrbench.cli.ServeTokens;
import org.lrbench.sampling.Severity;
import org.lrbench.store.ResultStore;

/** The service's API with the JDK's HTTP client against a service on a free loopback port. */
class BenchServiceApiTests {
    static final Path HOME = TestBench.home();
    static final ObjectMapper JSON = new ObjectMapper();
    final HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();

    static ServiceConfig config(Path dir) {
        return new ServiceConfig(HOME.resolve("simulator/bench.yaml"), HOME.resolve("drivers"), HOME.resolve("plans"),
                HOME.resolve("simulator"), dir.resolve("data"), dir.resolve("runs"), dir.resolve("cal"), "test");
    }

    HttpResponse<String> call(int port, String method, String path, String body, String token) throws Exception {
        HttpRequest.Builder b = HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + path))
                .timeout(Duration.ofSeconds(30))
                .method(method, body == null ? HttpRequest.BodyPublishers.noBody() : HttpRequest.BodyPublishers.ofString(body));
        if (token != null) {
            b.header(HttpApi.TOKEN_HEADER, token);
        }
        return http.send(b.build(), HttpResponse.BodyHandlers.ofString());
    }

    JsonNode json(HttpResponse<String> r) throws Exception {
        return JSON.readTree(r.body());
    }

    /** Waits for a prompt to open and returns its id. */
    long openPrompt(int port) throws Exception {
        long deadline = System.currentTimeMillis() + 30_000;
        while (System.currentTimeMillis() < deadline) {
            JsonNode s = json(call(port, "GET", "/api/runs/current", null, null));
            if (s.get("prompt").isIntegralNumber()) {
                return s.get("prompt").asLong();
            }
            Thread.sleep(10);
        }
        throw new AssertionError("no prompt opened");
    }

    void answer(int port, String serial) throws Exception {
        long prompt = openPrompt(port);
        assertThat(call(port, "POST", "/api/runs/current/answer", "{\"prompt\":" + prompt + ",\"serial\":\"" + serial
                + "\"}", null).statusCode()).isEqualTo(202);
    }

    void waitForParts(int port, int parts) throws Exception {
        long deadline = System.currentTimeMillis() + 30_000;
        while (System.currentTimeMillis() < deadline) {
            JsonNode s = json(call(port, "GET", "/api/runs/current", null, null));
            if (s.get("parts_done").asInt() >= parts || !s.get("state").asText().equals("running")) {
                return;
            }
            Thread.sleep(20);
        }
    }

    @Test
    void onABenchWithACheckStandardTheServiceSaysWhyALotCannotStart(@TempDir Path dir) throws Exception {
        ServiceConfig checked = new ServiceConfig(HOME.resolve("simulator/bench-checked.yaml"), HOME.resolve("drivers"),
                HOME.resolve("plans"), HOME.resolve("simulator"), dir.resolve("data"), dir.resolve("runs"), dir.resolve("cal"),
                "test");
        try (BenchService service = new BenchService(checked);
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            int port = api.port();
            JsonNode state = json(call(port, "GET", "/api/bench", null, null));
            assertThat(state.get("bench").asText()).isEqualTo("sim-bench-checked");
            assertThat(state.get("lot_may_start").asBoolean()).isFalse();
            assertThat(state.get("refusal").asText()).contains("has not been measured");
            assertThat(state.get("check_standard").get("serial").asText()).isEqualTo("QFD-REF-0001");
            HttpResponse<String> start = call(port, "POST", "/api/runs",
                    "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"CS-1\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\",\"operator\":\"Tam\"}", null);
            assertThat(start.statusCode()).as(start.body()).isEqualTo(409);
            assertThat(json(start).get("error").asText()).contains("not started").contains("QFD-REF-0001");
            // started anyway with a reason: the override is recorded with the operator's name
            HttpResponse<String> anyway = call(port, "POST", "/api/runs",
                    "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"CS-1\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\","
                            + "\"operator\":\"Tam\",\"override_check_reason\":\"standard at the cal lab\"}", null);
            assertThat(anyway.statusCode()).as(anyway.body()).isEqualTo(201);
            call(port, "POST", "/api/runs/current/stop", null, null);
            try (var files = Files.list(dir.resolve("runs/check-standard/sim-bench-checked/overrides"))) {
                assertThat(Files.readString(files.findFirst().orElseThrow())).contains("standard at the cal lab").contains("Tam");
            }
        }
        // the shipped bench has no check standard: nothing stands in a lot's way
        try (BenchService service = new BenchService(config(dir.resolve("plain")));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            assertThat(json(call(api.port(), "GET", "/api/bench", null, null)).get("lot_may_start").asBoolean()).isTrue();
        }
    }

    @Test
    void thePageSeesTheSuppliersSeverityAndADiscontinuedSchemeRefusesALot(@TempDir Path dir) throws Exception {
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            int port = api.port();
            JsonNode plan = json(call(port, "GET", "/api/plans", null, null)).get("plans").get(0);
            assertThat(plan.get("supplier").asText()).isEqualTo("Halvern Coil Co.");
            assertThat(plan.get("severity").asText()).isEqualTo("normal");
            try (ResultStore store = ResultStore.open(dir.resolve("data/lrbench.db"))) {
                // this service's bench is the simulated one: its page shows the simulated bench's scheme
                store.decideScheme("QFD-IND-1M0", "Halvern Coil Co.", Severity.DISCONTINUED, "supplier audit failed",
                        "qa", true, "2026-12-01T08:00:00Z", true);
            }
            plan = json(call(port, "GET", "/api/plans", null, null)).get("plans").get(0);
            assertThat(plan.get("severity").asText()).isEqualTo("discontinued");
            assertThat(plan.get("severity_reason").asText()).contains("supplier audit failed");
            HttpResponse<String> start = call(port, "POST", "/api/runs",
                    "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"SW-1\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\","
                            + "\"operator\":\"Tam\"}", null);
            assertThat(start.statusCode()).as(start.body()).isEqualTo(409);
            assertThat(json(start).get("error").asText()).contains("discontinued").contains("supplier audit failed");
            // another supplier named for the lot has a scheme of its own
            HttpResponse<String> other = call(port, "POST", "/api/runs",
                    "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"SW-2\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\","
                            + "\"operator\":\"Tam\",\"supplier\":\"Brackwater\"}", null);
            assertThat(other.statusCode()).as(other.body()).isEqualTo(201);
            call(port, "POST", "/api/runs/current/stop", null, null);
        }
    }

    @Test
    void aWholeLotRunWithPromptsStopResumeAndTheEventStream(@TempDir Path dir) throws Exception {
        String start = "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"API-1\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\",\"operator\":\"Tam\"}";
        List<String> serials = List.of("HC0417-0001", "HC0417-0002", "HC0417-0003", "HC0417-0004", "HC0417-0005",
                "HC0417-0006", "HC0417-0007", "HC0417-0008");
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            int port = api.port();
            assertThat(json(call(port, "GET", "/api/plans", null, null)).get("plans").get(0).get("part_number").asText())
                    .isEqualTo("QFD-IND-1M0");
            assertThat(call(port, "POST", "/api/runs", start, null).statusCode()).isEqualTo(201);
            // a second start while the first runs is refused
            HttpResponse<String> second = call(port, "POST", "/api/runs", start.replace("API-1", "API-2"), null);
            assertThat(second.statusCode()).isEqualTo(409);
            assertThat(json(second).get("error").asText()).contains("already going");
            for (int i = 0; i < 3; i++) {
                answer(port, serials.get(i));
                waitForParts(port, i + 1);
            }
            assertThat(call(port, "POST", "/api/runs/current/stop", null, null).statusCode()).isEqualTo(202);
            service.join(30_000);
            assertThat(json(call(port, "GET", "/api/runs/current", null, null)).get("state").asText()).isEqualTo("stopped");
            assertThat(json(call(port, "GET", "/api/runs/interrupted", null, null)).get("interrupted")).hasSize(1);
            // resume: the three parts are kept and not asked for again
            assertThat(call(port, "POST", "/api/runs", start, null).statusCode()).isEqualTo(201);
            for (int i = 3; i < serials.size(); i++) {
                answer(port, serials.get(i));
                waitForParts(port, i + 1);
            }
            service.join(30_000);
            // the event stream replays the whole run: prompts, points, parts in order, then the disposition
            List<String> types = new ArrayList<>();
            HttpResponse<InputStream> stream = http.send(HttpRequest.newBuilder(
                    URI.create("http://127.0.0.1:" + port + "/api/runs/current/events")).build(),
                    HttpResponse.BodyHandlers.ofInputStream());
            try (BufferedReader r = new BufferedReader(new InputStreamReader(stream.body(), StandardCharsets.UTF_8))) {
                String line;
                // the run is over: the stream ends by itself after its last event (readLine gives null)
                while ((line = r.readLine()) != null) {
                    if (line.startsWith("event: ")) {
                        types.add(line.substring(7));
                    }
                }
            }
            assertThat(types.get(0)).isEqualTo("run_started");
            // a client that reconnects with Last-Event-ID (the SSE standard's resume) gets only what it missed
            int total = json(call(port, "GET", "/api/runs/current", null, null)).get("events").asInt();
            HttpResponse<InputStream> resumed = http.send(HttpRequest.newBuilder(
                    URI.create("http://127.0.0.1:" + port + "/api/runs/current/events"))
                    .header("Last-Event-ID", String.valueOf(total - 2)).build(), HttpResponse.BodyHandlers.ofInputStream());
            List<String> ids = new ArrayList<>();
            try (BufferedReader r = new BufferedReader(new InputStreamReader(resumed.body(), StandardCharsets.UTF_8))) {
                String line;
                while ((line = r.readLine()) != null) {
                    if (line.startsWith("id: ")) {
                        ids.add(line.substring(4));
                    }
                }
            }
            // and a Last-Event-ID past the end gets an empty stream that ends
            HttpResponse<String> past = http.send(HttpRequest.newBuilder(
                    URI.create("http://127.0.0.1:" + port + "/api/runs/current/events"))
                    .header("Last-Event-ID", String.valueOf(total + 5)).timeout(Duration.ofSeconds(10)).build(),
                    HttpResponse.BodyHandlers.ofString());
            assertThat(past.body()).doesNotContain("event:");
            assertThat(ids).containsExactly(String.valueOf(total - 1), String.valueOf(total));
            assertThat(types).filteredOn("part_done"::equals).hasSize(5);
            assertThat(types).filteredOn("point"::equals).hasSize(5 * 7);
            assertThat(types.get(types.size() - 1)).isEqualTo("lot_done");
            JsonNode lot = json(call(port, "GET", "/api/lots/API-1", null, null));
            assertThat(lot.get("parts")).hasSize(8);
            // the decided lot is closed: starting it again (even with a lot size that would accept) measures nothing
            HttpResponse<String> closed = call(port, "POST", "/api/runs", start.replace("40", "5"), null);
            assertThat(closed.statusCode()).isEqualTo(409);
            assertThat(json(closed).get("error").asText()).contains("is closed").contains("REJECT");
            assertThat(json(call(port, "GET", "/api/lots", null, null)).get("lots").get(0).get("disposition").asText())
                    .isEqualTo("reject");
            HttpResponse<String> report = call(port, "GET", "/api/lots/API-1/report", null, null);
            assertThat(report.statusCode()).isEqualTo(200);
            assertThat(report.body()).contains("<h1>Inspection record: lot API-1");
            assertThat(call(port, "GET", "/", null, null).body()).contains("STOP the lot");
        }
    }

    @Test
    void aRestartedServiceOffersTheInterruptedLot(@TempDir Path dir) throws Exception {
        String start = "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"API-9\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\",\"operator\":\"Tam\"}";
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            int port = api.port();
            assertThat(call(port, "POST", "/api/runs", start, null).statusCode()).isEqualTo(201);
            answer(port, "HC0417-0002");
            waitForParts(port, 1);
            JsonNode status = json(call(port, "GET", "/api/runs/current", null, null));
            assertThat(status.get("parts_done").asInt()).isEqualTo(1);
            // the part is reported as it completes and committed right after: wait for the commit
            long deadline = System.currentTimeMillis() + 10_000;
            while (call(port, "GET", "/api/lots/API-9", null, null).statusCode() != 200
                    && System.currentTimeMillis() < deadline) {
                Thread.sleep(20);
            }
        } // the service goes down with the lot undecided
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            JsonNode open = json(call(api.port(), "GET", "/api/runs/interrupted", null, null)).get("interrupted");
            assertThat(open).hasSize(1);
            assertThat(open.get(0).get("lot").asText()).isEqualTo("API-9");
            assertThat(open.get(0).get("measured").asInt()).isEqualTo(1);
        }
    }

    @Test
    void badRequestsGetClearErrorsAndNoStackTraces(@TempDir Path dir) throws Exception {
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            int port = api.port();
            HttpResponse<String> traversal = call(port, "POST", "/api/runs",
                    "{\"plan\":\"../pom.xml\",\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Tam\"}", null);
            assertThat(traversal.statusCode()).isEqualTo(400);
            assertThat(json(traversal).get("error").asText()).startsWith("plan:");
            assertThat(call(port, "POST", "/api/runs", "{\"plan\":\"..%2Fpom.yaml\",\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Tam\"}", null)
                    .statusCode()).isEqualTo(400);
            assertThat(call(port, "POST", "/api/runs", "{\"plan\":\"nope.yaml\",\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Tam\"}", null)
                    .statusCode()).isEqualTo(404);
            HttpResponse<String> malformed = call(port, "POST", "/api/runs", "{not json", null);
            assertThat(malformed.statusCode()).isEqualTo(400);
            assertThat(json(malformed).get("error").asText()).isEqualTo("body: not valid JSON");
            HttpResponse<String> size = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"L\"}", null);
            assertThat(json(size).get("error").asText()).startsWith("lot_size:");
            // a misspelt key is refused naming it, as in a plan, never ignored (the lot would go to the plan's supplier)
            HttpResponse<String> misspelt = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\","
                    + "\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Tam\",\"tray\":\"demo-lot.yaml\","
                    + "\"suplier\":\"Other Supplier Ltd\"}", null);
            assertThat(misspelt.statusCode()).isEqualTo(400);
            assertThat(json(misspelt).get("error").asText()).startsWith("suplier: unknown key").contains("supplier");
            // identifiers are one printable line each: the key, the character and its position are named
            HttpResponse<String> bell = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\","
                    + "\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Ta\\u0007m\",\"tray\":\"demo-lot.yaml\"}", null);
            assertThat(bell.statusCode()).isEqualTo(400);
            assertThat(json(bell).get("error").asText()).startsWith("operator:").contains("U+0007 at position 3");
            HttpResponse<String> twoLines = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\","
                    + "\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Tam\",\"tray\":\"demo-lot.yaml\","
                    + "\"supplier\":\"Other\\nLtd\"}", null);
            assertThat(twoLines.statusCode()).isEqualTo(400);
            assertThat(json(twoLines).get("error").asText()).startsWith("supplier:").contains("U+000A at position 6");
            HttpResponse<String> slashLot = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\","
                    + "\"lot\":\"L/../x\",\"lot_size\":40,\"operator\":\"Tam\",\"tray\":\"demo-lot.yaml\"}", null);
            assertThat(slashLot.statusCode()).isEqualTo(400);
            assertThat(json(slashLot).get("error").asText()).startsWith("lot:").contains("'/' at position 2");
            HttpResponse<String> answerKey = call(port, "POST", "/api/runs/current/answer",
                    "{\"prompt\":1,\"serail\":\"X\"}", null);
            assertThat(answerKey.statusCode()).isEqualTo(400);
            assertThat(json(answerKey).get("error").asText()).startsWith("serail: unknown key");
            HttpResponse<String> big = call(port, "POST", "/api/runs", "{\"x\":\"" + "a".repeat(100_000) + "\"}", null);
            assertThat(big.statusCode()).isEqualTo(413);
            assertThat(call(port, "GET", "/api/lots/..%2F..%2Fetc", null, null).statusCode()).isIn(400, 404);
            HttpResponse<String> none = call(port, "GET", "/api/runs/current", null, null);
            assertThat(none.statusCode()).isEqualTo(404);
            assertThat(none.body()).doesNotContain("Exception").doesNotContain("at org.");
        }
    }

    @Test
    void answersAreBoundToTheOpenPromptAndADoubleScanIsRefused(@TempDir Path dir) throws Exception {
        String start = "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"API-5\",\"lot_size\":40,\"tray\":\"demo-lot.yaml\","
                + "\"operator\":\"Tam\"}";
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            int port = api.port();
            assertThat(call(port, "POST", "/api/runs", start, null).statusCode()).isEqualTo(201);
            long p1 = openPrompt(port);
            // three scans against one prompt: the first is taken, the others are refused, not queued
            List<Integer> codes = new ArrayList<>();
            for (String s : List.of("HC0417-0001", "HC0417-0002", "HC0417-0003")) {
                codes.add(call(port, "POST", "/api/runs/current/answer", "{\"prompt\":" + p1 + ",\"serial\":\"" + s
                        + "\"}", null).statusCode());
            }
            assertThat(codes).containsExactly(202, 409, 409);
            waitForParts(port, 1);
            long p2 = openPrompt(port);
            assertThat(p2).isGreaterThan(p1);
            // an answer naming an old prompt is refused
            HttpResponse<String> stale = call(port, "POST", "/api/runs/current/answer", "{\"prompt\":" + p1
                    + ",\"serial\":\"HC0417-0002\"}", null);
            assertThat(stale.statusCode()).isEqualTo(409);
            assertThat(json(stale).get("error").asText()).contains("prompt " + p1 + " is not open");
            // the same serial scanned twice: refused, unless measured again on purpose with a reason
            HttpResponse<String> twice = call(port, "POST", "/api/runs/current/answer", "{\"prompt\":" + p2
                    + ",\"serial\":\"HC0417-0001\"}", null);
            assertThat(twice.statusCode()).isEqualTo(409);
            assertThat(json(twice).get("error").asText()).contains("already measured");
            assertThat(call(port, "POST", "/api/runs/current/answer", "{\"prompt\":" + p2
                    + ",\"serial\":\"HC0417-0001\",\"action\":\"again\"}", null).statusCode()).isEqualTo(400);
            assertThat(call(port, "POST", "/api/runs/current/answer", "{\"prompt\":" + p2
                    + ",\"serial\":\"HC0417-0001\",\"action\":\"again\",\"reason\":\"part was tilted\"}", null)
                    .statusCode()).isEqualTo(202);
            long p3 = openPrompt(port);
            assertThat(call(port, "POST", "/api/runs/current/answer", "{\"prompt\":" + p3 + ",\"action\":\"skip\"}",
                    null).statusCode()).isEqualTo(202);
            openPrompt(port);
            service.stop();
            service.join(30_000);
            JsonNode parts = json(call(port, "GET", "/api/lots/API-5", null, null)).get("parts");
            assertThat(parts).hasSize(3);
            assertThat(parts.get(0).get("attempt").asInt()).isEqualTo(1);
            assertThat(parts.get(0).get("counts").asBoolean()).isFalse();
            assertThat(parts.get(1).get("attempt").asInt()).isEqualTo(2);
            assertThat(parts.get(1).get("reason").asText()).isEqualTo("part was tilted");
            assertThat(parts.get(1).get("result").get("attempt").get("operator").asText()).isEqualTo("Tam");
            // the skipped position is never counted as measured
            JsonNode lot = json(call(port, "GET", "/api/lots", null, null)).get("lots").get(0);
            assertThat(lot.get("measured").asInt()).isEqualTo(1);
            assertThat(lot.get("skipped").asInt()).isEqualTo(1);
            // resuming under other terms is refused, naming the stored and the given value
            HttpResponse<String> other = call(port, "POST", "/api/runs", start.replace("40", "5"), null);
            assertThat(other.statusCode()).isEqualTo(409);
            assertThat(json(other).get("error").asText()).contains("lot size: stored 40, given 5");
        }
    }

    @Test
    void sloppyBodiesAreRefusedWithJsonErrors(@TempDir Path dir) throws Exception {
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, null)) {
            int port = api.port();
            HttpResponse<String> fraction = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"L\","
                    + "\"lot_size\":2.9,\"operator\":\"Tam\"}", null);
            assertThat(fraction.statusCode()).isEqualTo(400);
            assertThat(json(fraction).get("error").asText()).startsWith("lot_size:").contains("2.9");
            HttpResponse<String> dup = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\",\"lot\":\"L\","
                    + "\"lot_size\":40,\"lot_size\":5,\"operator\":\"Tam\"}", null);
            assertThat(dup.statusCode()).isEqualTo(400);
            assertThat(json(dup).get("error").asText()).contains("Duplicate field 'lot_size'");
            HttpResponse<String> noOperator = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\","
                    + "\"lot\":\"L\",\"lot_size\":40}", null);
            assertThat(json(noOperator).get("error").asText()).startsWith("operator:");
            // the simulated bench measures only parts of a simulated tray: refused at start, in the page's terms
            HttpResponse<String> noTray = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\","
                    + "\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Tam\"}", null);
            assertThat(noTray.statusCode()).isEqualTo(400);
            assertThat(json(noTray).get("error").asText()).startsWith("tray:").contains("simulated tray");
            // a misspelt key is refused naming it, as in a plan, never ignored (the lot would go to the plan's supplier)
            HttpResponse<String> misspelt = call(port, "POST", "/api/runs", "{\"plan\":\"qfd-ind-1m0.yaml\","
                    + "\"lot\":\"L\",\"lot_size\":40,\"operator\":\"Tam\",\"tray\":\"demo-lot.yaml\","
                    + "\"suplier\":\"Other Supplier Ltd\"}", null);
            assertThat(misspelt.statusCode()).isEqualTo(400);
            assertThat(json(misspelt).get("error").asText()).startsWith("suplier: unknown key").contains("supplier");
            HttpResponse<String> answerKey = call(port, "POST", "/api/runs/current/answer",
                    "{\"prompt\":1,\"serail\":\"X\"}", null);
            assertThat(answerKey.statusCode()).isEqualTo(400);
            assertThat(json(answerKey).get("error").asText()).startsWith("serail: unknown key");
            HttpResponse<String> big = call(port, "POST", "/api/runs", "{\"x\":\"" + "a".repeat(100_000) + "\"}", null);
            assertThat(big.statusCode()).isEqualTo(413);
            assertThat(json(big).get("error").asText()).contains("larger than");
        }
    }

    @Test
    void offLoopbackEveryCallNeedsTheToken(@TempDir Path dir) throws Exception {
        // the token check itself is address-independent; a service given a token enforces it
        try (BenchService service = new BenchService(config(dir));
             HttpApi api = new HttpApi(service, InetAddress.getLoopbackAddress(), 0, "s3cret")) {
            int port = api.port();
            assertThat(call(port, "GET", "/api/plans", null, null).statusCode()).isEqualTo(401);
            assertThat(call(port, "GET", "/api/plans", null, "wrong").statusCode()).isEqualTo(401);
            assertThat(call(port, "GET", "/api/plans", null, "s3cret").statusCode()).isEqualTo(200);
        }
        Path token = dir.resolve("t");
        String t = ServeTokens.token(token);
        assertThat(t).hasSize(48).isEqualTo(ServeTokens.token(token));
        assertThat(Files.getPosixFilePermissions(token.resolve("service-token")))
                .containsExactlyInAnyOrder(PosixFilePermission.OWNER_READ,
                        PosixFilePermission.OWNER_WRITE);
        TimeUnit.MILLISECONDS.sleep(1);
    }
}
