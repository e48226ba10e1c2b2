package org.lrbench.transport.tcp;

import io.netty.channel.EventLoopGroup;
import io.netty.channel.MultiThreadIoEventLoopGroup;
import io.netty.channel.nio.NioIoHandler;
import io.netty.util.concurrent.DefaultThreadFactory;

/** The one Netty event loop the process's TCP links share; its threads are daemons. */
public final class NettyLoops {
    private static EventLoopGroup group;

    private NettyLoops() {
    }

    public static synchronized EventLoopGroup shared() {
        if (group == null) {
            group = new MultiThreadIoEventLoopGroup(1, new DefaultThreadFactory("lrbench-net", true),
                    NioIoHandler.newFactory());
        }
        return group;
    }
}
