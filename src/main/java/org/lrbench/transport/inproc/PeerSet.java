package org.lrbench.transport.inproc;

import java.util.Map;

/** The in-process instruments of one simulated bench, by role: generator, digitizer, switch, meter. */
public interface PeerSet {

    Map<String, InProcessPeer> peers();
}
