package org.lrbench.sim.server;

import io.netty.bootstrap.ServerBootstrap;
import io.netty.buffer.ByteBuf;
import io.netty.buffer.Unpooled;
import io.netty.channel.Channel;
import io.netty.channel.ChannelHandlerContext;
import io.netty.channel.ChannelInitializer;
import io.netty.channel.ChannelOption;
import io.netty.channel.EventLoopGroup;
import io.netty.channel.MultiThreadIoEventLoopGroup;
import io.netty.channel.SimpleChannelInboundHandler;
import io.netty.channel.nio.NioIoHandler;
import io.netty.channel.socket.SocketChannel;
import io.netty.channel.socket.nio.NioServerSocketChannel;
import io.netty.util.concurrent.DefaultThreadFactory;
import java.io.IOException;
import java.net.InetSocketAddress;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.lrbench.sim.SimBench;
import org.lrbench.sim.scpi.ScpiDevice;

/**
 * Serves the simulated bench's generator and digitizer as two raw SCPI sockets on 127.0.0.1, each
 * on its own port, with the same SCPI parser as in-process. Replies go out as soon as a message has
 * been executed.
 */
public final class SimServer implements AutoCloseable {
    private final List<Channel> listeners = new ArrayList<>();
    /** Its own event loop, apart from the process's client links, as a separate instrument would be. */
    private final EventLoopGroup loop = new MultiThreadIoEventLoopGroup(1, new DefaultThreadFactory("lrbench-sim", true),
            NioIoHandler.newFactory());
    private final int generatorPort;
    private final int digitizerPort;

    /**
     * @param port the generator's port; the digitizer listens on the next one. 0 picks two free ports.
     */
    public SimServer(SimBench bench, int port) throws IOException {
        generatorPort = listen(bench.generator(), port);
        try {
            digitizerPort = listen(bench.digitizer(), port == 0 ? 0 : port + 1);
        } catch (IOException e) {
            close();
            throw e;
        }
    }

    public int generatorPort() {
        return generatorPort;
    }

    public int digitizerPort() {
        return digitizerPort;
    }

    private int listen(ScpiDevice device, int port) throws IOException {
        ServerBootstrap b = new ServerBootstrap()
                .group(loop)
                .channel(NioServerSocketChannel.class)
                .childOption(ChannelOption.TCP_NODELAY, true)
                .childHandler(new ChannelInitializer<SocketChannel>() {
                    @Override
                    protected void initChannel(SocketChannel ch) {
                        ch.pipeline().addLast(new DeviceHandler(device));
                    }
                });
        var f = b.bind("127.0.0.1", port).awaitUninterruptibly();
        if (!f.isSuccess()) {
            throw new IOException("cannot listen on 127.0.0.1:" + port + ": " + f.cause().getMessage(), f.cause());
        }
        listeners.add(f.channel());
        return ((InetSocketAddress) f.channel().localAddress()).getPort();
    }

    @Override
    public void close() {
        for (Channel c : listeners) {
            c.close().awaitUninterruptibly();
        }
        listeners.clear();
        loop.shutdownGracefully(0, 1, TimeUnit.SECONDS).awaitUninterruptibly();
    }

    /** Feeds one connection's bytes to an instrument and sends its replies back. */
    private static final class DeviceHandler extends SimpleChannelInboundHandler<ByteBuf> {
        private final ScpiDevice device;

        DeviceHandler(ScpiDevice device) {
            this.device = device;
        }

        @Override
        protected void channelRead0(ChannelHandlerContext ctx, ByteBuf msg) {
            byte[] in = new byte[msg.readableBytes()];
            msg.readBytes(in);
            byte[] out;
            synchronized (device) {
                device.receive(in);
                out = device.takeOutput();
            }
            if (out.length > 0) {
                ctx.writeAndFlush(Unpooled.wrappedBuffer(out));
            }
        }

        @Override
        public void exceptionCaught(ChannelHandlerContext ctx, Throwable cause) {
            ctx.close();
        }
    }
}
