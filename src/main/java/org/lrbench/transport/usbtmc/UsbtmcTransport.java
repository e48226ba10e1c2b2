package org.lrbench.transport.usbtmc;

import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.ByteBuffer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportTimeoutException;

/**
 * SCPI over the Linux kernel's USBTMC driver: each write to {@code /dev/usbtmcN} is one message to
 * the instrument, each read asks it for response bytes. The kernel's read blocks (up to the
 * driver's own timeout), so reads run on a helper thread and are waited for with this link's
 * timeout; a read that completes after its wait is kept as late input and thrown away by
 * {@link #discardInput()}. A read is only issued when a reply is expected, because asking a USBTMC
 * instrument for data it has not got makes it log a query error. The device is opened once as a
 * {@link RandomAccessFile}, whose reads and writes share no lock, so a write is never held up by a
 * read still waiting in the kernel.
 */
public final class UsbtmcTransport implements Transport {
    private final String address;
    private final RandomAccessFile device;
    private final ExecutorService reader;
    private Future<ByteBuffer> pending;
    private ByteBuffer late;

    public UsbtmcTransport(String address, Path path) throws IOException {
        this.address = address;
        if (!Files.exists(path)) {
            throw new IOException("USBTMC device " + path + " does not exist (is the instrument connected and the"
                    + " usbtmc kernel module loaded?)");
        }
        this.device = new RandomAccessFile(path.toFile(), "rw");
        this.reader = Executors.newSingleThreadExecutor(r -> {
            Thread t = new Thread(r, "lrbench-usbtmc-read");
            t.setDaemon(true);
            return t;
        });
    }

    @Override
    public String address() {
        return address;
    }

    @Override
    public synchronized void write(byte[] bytes) throws IOException {
        device.write(bytes);
    }

    @Override
    public synchronized int read(byte[] dst, int offset, int length, Duration timeout) throws IOException {
        if (late != null && late.hasRemaining()) {
            return take(late, dst, offset, length);
        }
        if (pending == null) {
            int size = Math.max(length, 4096);
            pending = reader.submit(() -> {
                byte[] b = new byte[size];
                int n = device.read(b);
                if (n < 0) {
                    throw new IOException("end of file on " + address);
                }
                return ByteBuffer.wrap(b, 0, n);
            });
        }
        try {
            ByteBuffer got = pending.get(timeout.toNanos(), TimeUnit.NANOSECONDS);
            pending = null;
            if (!got.hasRemaining()) {
                throw new TransportTimeoutException("empty read from " + address);
            }
            late = got;
            return take(late, dst, offset, length);
        } catch (TimeoutException e) {
            throw new TransportTimeoutException("no data from " + address + " within " + timeout.toMillis() + " ms");
        } catch (ExecutionException e) {
            pending = null;
            Throwable cause = e.getCause();
            throw cause instanceof IOException io ? io : new IOException(cause);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted while reading from " + address, e);
        }
    }

    private static int take(ByteBuffer from, byte[] dst, int offset, int length) {
        int n = Math.min(length, from.remaining());
        from.get(dst, offset, n);
        return n;
    }

    @Override
    public synchronized void discardInput() {
        late = null;
        if (pending != null && pending.isDone()) {
            pending = null;
        }
    }

    @Override
    public synchronized void close() throws IOException {
        reader.shutdownNow();
        device.close();
    }
}
