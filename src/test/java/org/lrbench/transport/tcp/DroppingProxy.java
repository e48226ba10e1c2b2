package org.lrbench.transport.tcp;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.net.InetAddress;
import java.net.ServerSocket;
import java.net.Socket;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * A loopback TCP proxy in front of a simulated instrument that drops its first connection once:
 * after forwarding {@code dropAfterReplyBytes} bytes of the reply to the first message that
 * contains {@code trigger}. Later connections are forwarded faithfully.
 */
final class DroppingProxy implements AutoCloseable {
    private final ServerSocket listener;
    private final int targetPort;
    private final String trigger;
    private final int dropAfterReplyBytes;
    private final AtomicBoolean dropped = new AtomicBoolean();
    private final Thread acceptor;

    DroppingProxy(int targetPort, String trigger, int dropAfterReplyBytes) throws IOException {
        this.listener = new ServerSocket(0, 4, InetAddress.getLoopbackAddress());
        this.targetPort = targetPort;
        this.trigger = trigger;
        this.dropAfterReplyBytes = dropAfterReplyBytes;
        this.acceptor = new Thread(this::accept, "dropping-proxy");
        acceptor.setDaemon(true);
        acceptor.start();
    }

    int port() {
        return listener.getLocalPort();
    }

    boolean hasDropped() {
        return dropped.get();
    }

    private void accept() {
        try {
            while (!listener.isClosed()) {
                Socket client = listener.accept();
                Socket server = new Socket(InetAddress.getLoopbackAddress(), targetPort);
                boolean armed = !dropped.get();
                AtomicBoolean triggered = new AtomicBoolean();
                start(() -> pump(client, server, armed ? triggered : null, false));
                start(() -> pump(server, client, armed ? triggered : null, true));
            }
        } catch (IOException closed) {
            // listener closed
        }
    }

    private void pump(Socket from, Socket to, AtomicBoolean triggered, boolean replies) {
        byte[] buf = new byte[8192];
        long forwarded = 0;
        try (InputStream in = from.getInputStream(); OutputStream out = to.getOutputStream()) {
            int n;
            while ((n = in.read(buf)) > 0) {
                if (triggered != null && !replies && new String(buf, 0, n, StandardCharsets.ISO_8859_1).contains(trigger)) {
                    triggered.set(true);
                }
                if (triggered != null && replies && triggered.get()) {
                    int allowed = (int) Math.max(0, Math.min(n, dropAfterReplyBytes - forwarded));
                    out.write(buf, 0, allowed);
                    out.flush();
                    forwarded += allowed;
                    if (forwarded >= dropAfterReplyBytes) {
                        dropped.set(true);
                        from.close();
                        to.close();
                        return;
                    }
                    continue;
                }
                out.write(buf, 0, n);
                out.flush();
            }
        } catch (IOException e) {
            // one side closed
        } finally {
            try {
                from.close();
                to.close();
            } catch (IOException ignored) {
                // already closed
            }
        }
    }

    private static void start(Runnable r) {
        Thread t = new Thread(r, "dropping-proxy-pump");
        t.setDaemon(true);
        t.start();
    }

    @Override
    public void close() throws IOException {
        listener.close();
    }
}
