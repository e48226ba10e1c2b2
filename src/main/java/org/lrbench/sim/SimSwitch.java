package org.lrbench.sim;

import java.util.Set;
import java.util.TreeSet;
import org.lrbench.sim.scpi.Call;
import org.lrbench.sim.scpi.ScpiDevice;
import org.lrbench.sim.scpi.ScpiFault;

/**
 * A simulated relay multiplexer behind SCPI: channels 1 to N, one per fixture position, named in
 * SCPI-1999 channel lists: {@code ROUTe:CLOSe (@1)}, {@code ROUTe:OPEN (@1)}, {@code ROUTe:OPEN:ALL}
 * and {@code ROUTe:CLOSe? (@1)} (1 when closed). A bench file for it names no {@code first_channel}
 * (its default, 1, is this unit's first).
 */
public final class SimSwitch extends ScpiDevice {
    private final int channels;
    private final Set<Integer> closed = new TreeSet<>();

    public SimSwitch(int channels) {
        super("LRBENCH,SIM-SWITCH-" + channels + ",SIM0003,0.1");
        this.channels = channels;
        register("ROUTe:CLOSe", false, c -> {
            closed.addAll(list(c));
            return null;
        });
        register("ROUTe:OPEN", false, c -> {
            closed.removeAll(list(c));
            return null;
        });
        register("ROUTe:OPEN:ALL", false, c -> {
            c.expect(0, 0);
            closed.clear();
            return null;
        });
        register("ROUTe:CLOSe", true, c -> {
            Set<Integer> asked = list(c);
            StringBuilder sb = new StringBuilder();
            for (int ch : asked) {
                sb.append(sb.length() == 0 ? "" : ",").append(closed.contains(ch) ? "1" : "0");
            }
            return sb.toString();
        });
    }

    @Override
    protected void reset() {
        closed.clear();
    }

    /** The one closed position (0-based), or -1 when none or several are closed. */
    public synchronized int connectedPosition() {
        return closed.size() == 1 ? closed.iterator().next() - 1 : -1;
    }

    private Set<Integer> list(Call c) throws ScpiFault {
        c.expect(1, 1);
        String p = c.text(0).replace(" ", "");
        if (!p.startsWith("(@") || !p.endsWith(")")) {
            throw ScpiFault.dataType("channel list expected, as (@1)");
        }
        Set<Integer> out = new TreeSet<>();
        for (String ch : p.substring(2, p.length() - 1).split(",")) {
            int n;
            try {
                n = Integer.parseInt(ch);
            } catch (NumberFormatException e) {
                throw ScpiFault.dataType("channel '" + ch + "'");
            }
            if (n < 1 || n > channels) {
                throw ScpiFault.outOfRange("channel " + n + ", this unit has 1 to " + channels);
            }
            out.add(n);
        }
        return out;
    }
}
