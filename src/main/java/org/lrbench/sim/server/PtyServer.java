package org.lrbench.sim.server;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.ClosedChannelException;
import java.nio.channels.FileChannel;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import org.lrbench.sim.scpi.ScpiDevice;

/**
 * Serves one simulated instrument on a terminal device (one end of a pseudo-terminal pair, for
 * example made by {@code socat -d -d pty,raw,echo=0 pty,raw,echo=0}), so the serial transport can be
 * exercised for real. Plain file I/O on a thread of its own.
 */
public final class PtyServer implements AutoCloseable {
    private final FileChannel tty;
    private final Thread pump;
    private volatile IOException failure;

    public PtyServer(ScpiDevice device, Path terminal) throws IOException {
        this.tty = FileChannel.open(terminal, StandardOpenOption.READ, StandardOpenOption.WRITE);
        this.pump = new Thread(() -> run(device), "lrbench-pty-" + terminal.getFileName());
        pump.setDaemon(true);
        pump.start();
    }

    private void run(ScpiDevice device) {
        ByteBuffer in = ByteBuffer.allocate(4096);
        try {
            while (true) {
                in.clear();
                int n = tty.read(in);
                if (n < 0) {
                    return;
                }
                byte[] bytes = new byte[n];
                in.flip();
                in.get(bytes);
                byte[] out;
                synchronized (device) {
                    device.receive(bytes);
                    out = device.takeOutput();
                }
                ByteBuffer b = ByteBuffer.wrap(out);
                while (b.hasRemaining()) {
                    tty.write(b);
                }
            }
        } catch (ClosedChannelException closed) {
            // stopped
        } catch (IOException e) {
            failure = e;
        }
    }

    /** The I/O error that stopped the pump, or null. */
    public IOException failure() {
        return failure;
    }

    @Override
    public void close() throws IOException {
        tty.close();
        pump.interrupt();
    }
}
