package org.lrbench.transport.tcp;

import io.netty.bootstrap.Bootstrap;
import io.netty.buffer.ByteBuf;
import io.netty.buffer.Unpooled;
import io.netty.channel.Channel;
import io.netty.channel.ChannelFuture;
import io.netty.channel.ChannelHandlerContext;
import io.netty.channel.ChannelInitializer;
import io.netty.channel.ChannelOption;
import io.netty.channel.SimpleChannelInboundHandler;
import io.netty.channel.socket.SocketChannel;
import io.netty.channel.socket.nio.NioSocketChannel;
import java.io.IOException;
import java.time.Duration;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.concurrent.TimeUnit;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportTimeoutException;

/**
 * A raw SCPI socket (conventionally port 5025) over Netty. Received buffers queue up until read
 * and are copied once, straight into the reader's array;
 * a dropped connection fails the read in progress, and the next write connects again, so a
 * measurement that lost its link can still switch the generator off.
 */
public final class TcpTransport implements Transport {
    /** More unread input than this means a runaway instrument: the link is closed. */
    static final long MAX_QUEUED = 512L << 20;

    private final String address;
    private final String host;
    private final int port;
    private final Duration connectTimeout;
    private final Object lock = new Object();
    private final Deque<ByteBuf> chunks = new ArrayDeque<>();
    private ByteBuf current;
    private long queued;
    /** Why the connection ended before lrbench closed it (null while it is up), and what caused it. */
    private String dropReason;
    private Throwable dropCause;
    private Channel channel;
    private boolean closed;

    public TcpTransport(String address, String host, int port, Duration connectTimeout) throws IOException {
        this.address = address;
        this.host = host;
        this.port = port;
        this.connectTimeout = connectTimeout;
        connect();
    }

    @Override
    public String address() {
        return address;
    }

    private void connect() throws IOException {
        Bootstrap b = new Bootstrap()
                .group(NettyLoops.shared())
                .channel(NioSocketChannel.class)
                .option(ChannelOption.CONNECT_TIMEOUT_MILLIS, (int) connectTimeout.toMillis())
                .option(ChannelOption.TCP_NODELAY, true)
                .option(ChannelOption.SO_RCVBUF, 1 << 20)
                .handler(new ChannelInitializer<SocketChannel>() {
                    @Override
                    protected void initChannel(SocketChannel ch) {
                        ch.pipeline().addLast(new Receiver());
                    }
                });
        ChannelFuture f = b.connect(host, port);
        if (!f.awaitUninterruptibly(connectTimeout.toMillis() + 500, TimeUnit.MILLISECONDS) || !f.isSuccess()) {
            f.channel().close();
            Throwable cause = f.cause();
            throw new IOException("cannot connect to " + host + ":" + port + " within " + connectTimeout.toMillis()
                    + " ms" + (cause == null ? "" : ": " + cause.getMessage()), cause);
        }
        synchronized (lock) {
            releaseQueued();
            dropReason = null;
            dropCause = null;
            channel = f.channel();
        }
    }

    @Override
    public void write(byte[] bytes) throws IOException {
        Channel ch;
        synchronized (lock) {
            if (closed) {
                throw new IOException("link to " + address + " is closed");
            }
            ch = channel;
        }
        if (ch == null || !ch.isActive()) {
            connect(); // the instrument dropped the connection: open a new one for this message
            synchronized (lock) {
                ch = channel;
            }
        }
        ChannelFuture f = ch.writeAndFlush(Unpooled.wrappedBuffer(bytes));
        if (!f.awaitUninterruptibly(connectTimeout.toMillis() + 5000, TimeUnit.MILLISECONDS)) {
            throw new IOException("sending " + bytes.length + " bytes to " + address + " did not complete");
        }
        if (!f.isSuccess()) {
            throw new IOException("sending to " + address + " failed: " + f.cause().getMessage(), f.cause());
        }
    }

    @Override
    public int read(byte[] dst, int offset, int length, Duration timeout) throws IOException {
        long deadline = System.nanoTime() + timeout.toNanos();
        synchronized (lock) {
            while (current == null) {
                current = chunks.poll();
                if (current != null) {
                    break;
                }
                if (dropReason != null) {
                    throw new IOException(dropReason, dropCause);
                }
                if (closed) {
                    throw new IOException("link to " + address + " is closed");
                }
                long wait = deadline - System.nanoTime();
                if (wait <= 0) {
                    throw new TransportTimeoutException("no data from " + address + " within " + timeout.toMillis() + " ms");
                }
                try {
                    TimeUnit.NANOSECONDS.timedWait(lock, wait);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                    throw new IOException("interrupted while reading from " + address, e);
                }
            }
            int n = Math.min(length, current.readableBytes());
            current.readBytes(dst, offset, n);
            queued -= n;
            if (!current.isReadable()) {
                current.release();
                current = null;
            }
            return n;
        }
    }

    @Override
    public void discardInput() {
        synchronized (lock) {
            releaseQueued();
        }
    }

    private void releaseQueued() {
        if (current != null) {
            current.release();
            current = null;
        }
        for (ByteBuf b : chunks) {
            b.release();
        }
        chunks.clear();
        queued = 0;
    }

    @Override
    public void close() {
        Channel ch;
        synchronized (lock) {
            closed = true;
            ch = channel;
            releaseQueued();
            lock.notifyAll();
        }
        if (ch != null) {
            ch.close().awaitUninterruptibly(1, TimeUnit.SECONDS);
        }
    }

    /** Moves received bytes to the reader; notes the connection's end. */
    private final class Receiver extends SimpleChannelInboundHandler<ByteBuf> {
        @Override
        protected void channelRead0(ChannelHandlerContext ctx, ByteBuf msg) {
            synchronized (lock) {
                if (ctx.channel() != channel || closed) {
                    return; // a late packet from a connection already replaced
                }
                queued += msg.readableBytes();
                if (queued > MAX_QUEUED) {
                    // lrbench's own bound on unread input, not the instrument's doing
                    dropReason = "lrbench closed the connection to " + address + ": more than " + (MAX_QUEUED >> 20)
                            + " MiB arrived unread (a reply longer than any trace lrbench asks for)";
                    ctx.close();
                } else {
                    chunks.add(msg.retain()); // kept until read: one copy, into the reader's array
                }
                lock.notifyAll();
            }
        }

        @Override
        public void channelInactive(ChannelHandlerContext ctx) {
            synchronized (lock) {
                if (ctx.channel() == channel) {
                    if (dropReason == null) {
                        dropReason = "connection to " + address + " was closed by the instrument";
                    }
                    lock.notifyAll();
                }
            }
        }

        @Override
        public void exceptionCaught(ChannelHandlerContext ctx, Throwable cause) {
            synchronized (lock) {
                if (ctx.channel() == channel && dropReason == null) {
                    dropReason = "connection to " + address + " failed: " + cause.getMessage();
                    dropCause = cause;
                    lock.notifyAll();
                }
            }
            ctx.close();
        }
    }
}
