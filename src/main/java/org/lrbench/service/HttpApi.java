package org.lrbench.service;

import com.fasterxml.jackson.core.StreamReadFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectReader;
import com.fasterxml.jackson.databind.SerializationFeature;
import io.netty.bootstrap.ServerBootstrap;
import io.netty.buffer.Unpooled;
import io.netty.channel.Channel;
import io.netty.channel.ChannelFutureListener;
import io.netty.channel.ChannelHandlerContext;
import io.netty.channel.ChannelInitializer;
import io.netty.channel.EventLoopGroup;
import io.netty.channel.MultiThreadIoEventLoopGroup;
import io.netty.channel.SimpleChannelInboundHandler;
import io.netty.channel.group.ChannelGroup;
import io.netty.channel.group.DefaultChannelGroup;
import io.netty.channel.nio.NioIoHandler;
import io.netty.channel.socket.SocketChannel;
import io.netty.channel.socket.nio.NioServerSocketChannel;
import io.netty.handler.codec.http.DefaultFullHttpResponse;
import io.netty.handler.codec.http.DefaultHttpResponse;
import io.netty.handler.codec.http.FullHttpMessage;
import io.netty.handler.codec.http.FullHttpRequest;
import io.netty.handler.codec.http.FullHttpResponse;
import io.netty.handler.codec.http.HttpHeaderNames;
import io.netty.handler.codec.http.HttpMessage;
import io.netty.handler.codec.http.HttpMethod;
import io.netty.handler.codec.http.HttpObjectAggregator;
import io.netty.handler.codec.http.HttpResponseStatus;
import io.netty.handler.codec.http.HttpServerCodec;
import io.netty.handler.codec.http.HttpUtil;
import io.netty.handler.codec.http.HttpVersion;
import io.netty.handler.codec.http.QueryStringDecoder;
import io.netty.util.concurrent.DefaultEventExecutorGroup;
import io.netty.util.concurrent.DefaultThreadFactory;
import io.netty.util.concurrent.EventExecutorGroup;
import io.netty.util.concurrent.GlobalEventExecutor;
import java.io.IOException;
import java.io.InputStream;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;
import org.lrbench.report.LotReport;
import org.lrbench.results.Attempt;
import org.lrbench.results.Names;
import org.lrbench.results.ResultFiles;
import org.lrbench.store.ResultStore;

/**
 * The service's HTTP API and operator page, with Netty. JSON in and out (Jackson); request bodies
 * are limited to {@value #MAX_BODY} bytes; errors are {@code {"error": "..."}} with a 4xx or 5xx
 * status and never a stack trace. On any address but loopback every call must carry the access
 * token in the {@value #TOKEN_HEADER} header (a header, not a cookie, so a foreign page cannot
 * ride on it).
 */
public final class HttpApi implements AutoCloseable {
    public static final int MAX_BODY = 64 * 1024;
    public static final String TOKEN_HEADER = "X-Lrbench-Token";
    /** Request bodies: a key given twice is refused, not silently taken as the last one. */
    private static final ObjectReader STRICT = ResultFiles.JSON.reader()
            .with(StreamReadFeature.STRICT_DUPLICATE_DETECTION);

    private final BenchService service;
    private final String token;
    private final EventLoopGroup loop = new MultiThreadIoEventLoopGroup(2, new DefaultThreadFactory("lrbench-http", true),
            NioIoHandler.newFactory());
    private final Channel listener;
    /** The open connections, closed before the threads stop. */
    private final ChannelGroup connections = new DefaultChannelGroup(
            GlobalEventExecutor.INSTANCE);
    /** Threads for the handlers' blocking work, so the I/O loop only moves bytes. */
    private final EventExecutorGroup work = new DefaultEventExecutorGroup(4,
            new DefaultThreadFactory("lrbench-api", true));

    /** @param token required on every call, or null when listening on loopback only */
    public HttpApi(BenchService service, InetAddress address, int port, String token) throws IOException {
        this.service = service;
        this.token = token;
        var f = new ServerBootstrap().group(loop).channel(NioServerSocketChannel.class)
                .childHandler(new ChannelInitializer<SocketChannel>() {
                    @Override
                    // Netty 4.2 deprecates handlers on an executor group in favour of its own
                    // per-handler executors; the group is what keeps store and chart work off the
                    // I/O loop here, and it still works as documented for 4.x
                    @SuppressWarnings("deprecation")
                    protected void initChannel(SocketChannel ch) {
                        connections.add(ch);
                        ch.pipeline().addLast(new HttpServerCodec(), new BodyLimit());
                        // the API's work (store queries, reports with charts, files) runs off the I/O loop
                        ch.pipeline().addLast(work, new Handler());
                    }
                }).bind(address, port).awaitUninterruptibly();
        if (!f.isSuccess()) {
            loop.shutdownGracefully();
            work.shutdownGracefully();
            throw new IOException("cannot listen on " + address.getHostAddress() + ":" + port + ": " + f.cause().getMessage());
        }
        listener = f.channel();
    }

    public int port() {
        return ((InetSocketAddress) listener.localAddress()).getPort();
    }

    @Override
    public void close() {
        listener.close().awaitUninterruptibly();
        connections.close().awaitUninterruptibly();
        // both together, each with a short quiet period: closing a connection passes tasks between the
        // I/O loop and the work threads, which must both still accept them
        var a = loop.shutdownGracefully(100, 2000, TimeUnit.MILLISECONDS);
        var b = work.shutdownGracefully(100, 2000, TimeUnit.MILLISECONDS);
        a.awaitUninterruptibly();
        b.awaitUninterruptibly();
    }

    /** A request body over the limit is answered like every refusal: a JSON error (413), then the connection closes. */
    private static final class BodyLimit extends HttpObjectAggregator {
        BodyLimit() {
            super(MAX_BODY);
        }

        @Override
        protected void handleOversizedMessage(ChannelHandlerContext ctx, HttpMessage oversized) {
            byte[] body = ("{\"error\":\"body: larger than " + MAX_BODY + " bytes; nothing was done\"}")
                    .getBytes(StandardCharsets.UTF_8);
            FullHttpResponse r = new DefaultFullHttpResponse(HttpVersion.HTTP_1_1,
                    HttpResponseStatus.REQUEST_ENTITY_TOO_LARGE, Unpooled.wrappedBuffer(body));
            r.headers().set(HttpHeaderNames.CONTENT_TYPE, "application/json");
            r.headers().setInt(HttpHeaderNames.CONTENT_LENGTH, body.length);
            if (oversized instanceof FullHttpMessage
                    || !HttpUtil.isKeepAlive(oversized)) {
                r.headers().set(HttpHeaderNames.CONNECTION, "close");
                ctx.writeAndFlush(r).addListener(ChannelFutureListener.CLOSE);
            } else {
                // as Netty's own answer does: the rest of the body is read and dropped, so the client,
                // still sending, gets the answer instead of a reset connection
                ctx.writeAndFlush(r);
            }
        }
    }

    private final class Handler extends SimpleChannelInboundHandler<FullHttpRequest> {
        @Override
        protected void channelRead0(ChannelHandlerContext ctx, FullHttpRequest req) {
            try {
                if (token != null && !token.equals(req.headers().get(TOKEN_HEADER))) {
                    throw new ServiceException(401, "missing or wrong access token (header " + TOKEN_HEADER + ")");
                }
                route(ctx, req);
            } catch (ServiceException e) {
                json(ctx, HttpResponseStatus.valueOf(e.status()), Map.of("error", e.getMessage()));
            } catch (Exception e) {
                json(ctx, HttpResponseStatus.INTERNAL_SERVER_ERROR, Map.of("error", "internal error: "
                        + e.getClass().getSimpleName() + (e.getMessage() == null ? "" : ": " + e.getMessage())));
            }
        }

        private void route(ChannelHandlerContext ctx, FullHttpRequest req) throws Exception {
            String path = new QueryStringDecoder(req.uri()).path();
            HttpMethod m = req.method();
            List<String> parts = List.of(path.replaceAll("^/+|/+$", "").split("/"));
            if (m == HttpMethod.GET && (path.equals("/") || path.equals("/index.html"))) {
                send(ctx, HttpResponseStatus.OK, "text/html; charset=utf-8", page());
            } else if (m == HttpMethod.GET && path.equals("/api/bench")) {
                json(ctx, HttpResponseStatus.OK, service.benchState());
            } else if (m == HttpMethod.GET && path.equals("/api/plans")) {
                json(ctx, HttpResponseStatus.OK, Map.of("plans", service.plans()));
            } else if (m == HttpMethod.POST && path.equals("/api/runs")) {
                JsonNode b = body(req);
                onlyKeys(b, "plan", "lot", "lot_size", "tray", "operator", "reinspect_reason", "override_check_reason",
                        "supplier");
                String plan = text(b, "plan", true);
                String lot = text(b, "lot", true);
                if (!Names.valid(lot)) {
                    throw new ServiceException(400, "lot: " + Names.problem("lot", lot));
                }
                JsonNode size = b.get("lot_size");
                if (size == null || !size.isIntegralNumber() || !size.canConvertToInt() || size.asInt() < 2) {
                    throw new ServiceException(400, "lot_size: " + (size == null ? "missing" : "'" + size + "'")
                            + "; a whole number of at least 2 is required");
                }
                String operator = text(b, "operator", true);
                if (operator.isBlank()) {
                    throw new ServiceException(400, "operator: who measures, in words, is required");
                }
                if (Names.operatorProblem(operator) != null) {
                    throw new ServiceException(400, Names.operatorProblem(operator));
                }
                String reinspect = text(b, "reinspect_reason", false);
                if (reinspect != null && reinspect.isBlank()) {
                    throw new ServiceException(400, "reinspect_reason: a re-inspection needs a reason, in words");
                }
                String override = text(b, "override_check_reason", false);
                if (override != null && override.isBlank()) {
                    throw new ServiceException(400, "override_check_reason: starting despite the check needs a reason, in words");
                }
                for (String[] r : new String[][] {{"reinspect_reason", reinspect}, {"override_check_reason", override}}) {
                    if (Names.reasonProblem(r[0], r[1]) != null) {
                        throw new ServiceException(400, Names.reasonProblem(r[0], r[1]));
                    }
                }
                String supplier = text(b, "supplier", false);
                if (Names.supplierProblem(supplier) != null) {
                    throw new ServiceException(400, Names.supplierProblem(supplier));
                }
                var run = service.start(new BenchService.StartRequest(plan, lot, size.asInt(), text(b, "tray", false),
                        operator, reinspect, override, supplier));
                json(ctx, HttpResponseStatus.CREATED, run.status());
            } else if (m == HttpMethod.GET && path.equals("/api/runs/current")) {
                json(ctx, HttpResponseStatus.OK, service.currentOr404().status());
            } else if (m == HttpMethod.GET && path.equals("/api/runs/current/events")) {
                long after = 0;
                String last = req.headers().get("Last-Event-ID");
                if (last != null) {
                    try {
                        after = Long.parseLong(last.trim());
                    } catch (NumberFormatException e) {
                        throw new ServiceException(400, "Last-Event-ID: '" + last + "' is not an event number");
                    }
                }
                events(ctx, service.currentOr404().events, after);
            } else if (m == HttpMethod.POST && path.equals("/api/runs/current/answer")) {
                JsonNode b = body(req);
                onlyKeys(b, "prompt", "action", "serial", "reason");
                JsonNode prompt = b.get("prompt");
                if (prompt == null || !prompt.isIntegralNumber() || prompt.asLong() < 1) {
                    throw new ServiceException(400, "prompt: the id of the prompt being answered (a whole number,"
                            + " from the prompt event) is required");
                }
                String action = text(b, "action", false);
                String serial = text(b, "serial", false);
                String reason = text(b, "reason", false);
                if (action != null && !List.of("skip", "stop", "again").contains(action)) {
                    throw new ServiceException(400, "action: '" + action + "' is not skip, stop or again");
                }
                if ((action == null || action.equals("again")) && serial == null) {
                    throw new ServiceException(400, "serial: give the part's serial (" + Names.RULE + "),"
                            + " or action skip or stop");
                }
                if ("again".equals(action) && (reason == null || reason.isBlank())) {
                    throw new ServiceException(400, "reason: measuring a part again needs a reason, in words");
                }
                service.currentOr404().feeder.answer(new PromptFeeder.Answer(prompt.asLong(), serial, action, reason));
                json(ctx, HttpResponseStatus.ACCEPTED, Map.of("accepted", true, "prompt", prompt.asLong()));
            } else if (m == HttpMethod.POST && path.equals("/api/runs/current/stop")) {
                service.stop();
                json(ctx, HttpResponseStatus.ACCEPTED, service.currentOr404().status());
            } else if (m == HttpMethod.GET && path.equals("/api/runs/interrupted")) {
                // lots begun and not decided, other than the one running now: resume by starting them again
                BenchService.Run cur = service.current();
                List<Object> open = new ArrayList<>();
                if (service.hasStore()) {
                    try (ResultStore s = store()) {
                        for (var l : s.lots()) {
                            boolean running = cur != null && cur.state.equals("running") && cur.lot.equals(l.lot());
                            if (l.disposition() == null && !running) {
                                open.add(l);
                            }
                        }
                    }
                }
                json(ctx, HttpResponseStatus.OK, Map.of("interrupted", open));
            } else if (m == HttpMethod.GET && path.equals("/api/lots")) {
                try (ResultStore s = store()) {
                    json(ctx, HttpResponseStatus.OK, Map.of("lots", s.lots()));
                }
            } else if (m == HttpMethod.GET && parts.size() == 3 && parts.get(0).equals("api") && parts.get(1).equals("lots")) {
                try (ResultStore s = store()) {
                    String lot = lotName(parts.get(2));
                    var all = s.attempts(lot);
                    if (all.isEmpty()) {
                        throw new ServiceException(404, "lot: no parts stored for " + lot);
                    }
                    List<Object> rows = new ArrayList<>();
                    for (var i : s.lot(lot)) {
                        var round = all.stream().filter(a -> a.round() == i.round()).toList();
                        var counting = Attempt.counting(round);
                        for (var a : round) {
                            Map<String, Object> row = new LinkedHashMap<>();
                            row.put("inspection", a.round());
                            row.put("serial", a.serial());
                            row.put("position", a.position());
                            row.put("attempt", a.number());
                            row.put("counts", counting.contains(a));
                            row.put("verdict", a.verdict());
                            row.put("operator", a.operator());
                            row.put("reason", a.reason());
                            row.put("result", ResultFilesJson.tree(a.resultJson()));
                            rows.add(row);
                        }
                    }
                    json(ctx, HttpResponseStatus.OK, Map.of("lot", lot, "inspections", s.lot(lot), "parts", rows));
                }
            } else if (m == HttpMethod.GET && parts.size() == 4 && parts.get(0).equals("api") && parts.get(1).equals("lots")
                    && parts.get(3).equals("report")) {
                String lot = lotName(parts.get(2));
                try (ResultStore s = store()) {
                    if (s.lot(lot).isEmpty()) {
                        throw new ServiceException(404, "lot: no lot " + lot);
                    }
                    send(ctx, HttpResponseStatus.OK, "text/html; charset=utf-8",
                            LotReport.html(s, lot).getBytes(StandardCharsets.UTF_8));
                }
            } else {
                throw new ServiceException(404, "no such resource: " + m + " " + path);
            }
        }

        private ResultStore store() {
            if (!service.hasStore()) {
                throw new ServiceException(404, "the results store is empty: no lot has been run yet");
            }
            return service.openStore();
        }

        private String lotName(String lot) {
            if (!Names.valid(lot)) {
                throw new ServiceException(400, "lot: '" + lot + "' is not a lot number");
            }
            return lot;
        }

        private void events(ChannelHandlerContext ctx, RunEvents events, long after) {
            DefaultHttpResponse head = new DefaultHttpResponse(HttpVersion.HTTP_1_1, HttpResponseStatus.OK);
            head.headers().set(HttpHeaderNames.CONTENT_TYPE, "text/event-stream");
            head.headers().set(HttpHeaderNames.CACHE_CONTROL, "no-cache");
            ctx.writeAndFlush(head);
            Channel ch = ctx.channel();
            Consumer<Map<String, Object>> subscriber = new Consumer<>() {
                @Override
                public void accept(Map<String, Object> e) {
                    if (!ch.isActive()) {
                        throw new IllegalStateException("gone");
                    }
                    try {
                        String line = "id: " + e.get("seq") + "\nevent: " + e.get("type") + "\ndata: "
                                + ResultFiles.JSON.writer().without(SerializationFeature.INDENT_OUTPUT)
                                .writeValueAsString(e) + "\n\n";
                        ch.writeAndFlush(Unpooled.copiedBuffer(line, StandardCharsets.UTF_8));
                    } catch (IOException x) {
                        throw new IllegalStateException(x);
                    }
                }
            };
            ch.closeFuture().addListener(f -> events.unsubscribe(subscriber));
            // the run over: the stream ends after its last event (a client does not wait on a finished run)
            events.subscribe(subscriber, after, () -> ch.writeAndFlush(Unpooled.EMPTY_BUFFER)
                    .addListener(io.netty.channel.ChannelFutureListener.CLOSE));
        }

        private JsonNode body(FullHttpRequest req) {
            String text = req.content().toString(StandardCharsets.UTF_8);
            try {
                JsonNode n = STRICT.readTree(text);
                if (n == null || !n.isObject()) {
                    throw new ServiceException(400, "body: a JSON object is required");
                }
                return n;
            } catch (IOException e) {
                String why = e.getMessage() != null && e.getMessage().startsWith("Duplicate field")
                        ? e.getMessage().lines().findFirst().orElse("") : "not valid JSON";
                throw new ServiceException(400, "body: " + why);
            }
        }

        /** A body's keys must be among these, as a plan's are: a misspelt key is refused, never ignored. */
        private void onlyKeys(JsonNode b, String... allowed) {
            List<String> known = List.of(allowed);
            for (var it = b.fieldNames(); it.hasNext(); ) {
                String key = it.next();
                if (!known.contains(key)) {
                    throw new ServiceException(400, key + ": unknown key; allowed: " + String.join(", ", known));
                }
            }
        }

        private String text(JsonNode b, String field, boolean required) {
            JsonNode v = b.get(field);
            if (v == null || v.isNull()) {
                if (required) {
                    throw new ServiceException(400, field + ": required");
                }
                return null;
            }
            if (!v.isTextual() || v.asText().length() > 200) {
                throw new ServiceException(400, field + ": must be a string of at most 200 characters");
            }
            return v.asText();
        }

        @Override
        public void exceptionCaught(ChannelHandlerContext ctx, Throwable cause) {
            ctx.close();
        }
    }

    private static byte[] page() throws IOException {
        try (InputStream in = HttpApi.class.getResourceAsStream("operator.html")) {
            if (in == null) {
                throw new IOException("operator page missing from the jar");
            }
            return in.readAllBytes();
        }
    }

    private static void json(ChannelHandlerContext ctx, HttpResponseStatus status, Object value) {
        byte[] body;
        try {
            body = ResultFiles.JSON.writeValueAsBytes(value);
        } catch (IOException e) {
            body = "{\"error\":\"response could not be written\"}".getBytes(StandardCharsets.UTF_8);
            status = HttpResponseStatus.INTERNAL_SERVER_ERROR;
        }
        send(ctx, status, "application/json", body);
    }

    private static void send(ChannelHandlerContext ctx, HttpResponseStatus status, String type, byte[] body) {
        FullHttpResponse r = new DefaultFullHttpResponse(HttpVersion.HTTP_1_1, status, Unpooled.wrappedBuffer(body));
        r.headers().set(HttpHeaderNames.CONTENT_TYPE, type);
        r.headers().setInt(HttpHeaderNames.CONTENT_LENGTH, body.length);
        r.headers().set("X-Content-Type-Options", "nosniff");
        // one request per connection: say so, so clients do not reuse a connection being closed
        r.headers().set(HttpHeaderNames.CONNECTION, "close");
        ctx.writeAndFlush(r).addListener(ChannelFutureListener.CLOSE);
    }
}
