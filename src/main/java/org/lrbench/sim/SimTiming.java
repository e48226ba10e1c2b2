package org.lrbench.sim;

import org.lrbench.sim.scpi.SimulatedTime;

import java.util.Locale;

/**
 * How long the simulated instruments take, so that a part costs on the simulator what it would on
 * a bench: each message's processing, the link's transfer rate (both ways), the generator's time to
 * settle after a frequency change, and the digitizer's arming and trigger latency, after which an
 * acquisition lasts its record. Off ({@link #NONE}) for unit tests; profiles for benchmarks and
 * rehearsals. The figures of the profiles are from memory of typical bench instruments on each
 * link, not from a datasheet: common practice, no source.
 */
public record SimTiming(String name, double messageSecond, double bytesPerSecond, double frequencyChangeSecond,
                        double armSecond) {

    /** Instruments that answer at once. */
    public static final SimTiming NONE = new SimTiming("none", 0, 0, 0, 0);
    /** Ethernet (VXI-11 or raw socket): 1 ms per message, 10 MB/s, 10 ms frequency change, 2 ms arming. */
    public static final SimTiming LAN = new SimTiming("lan", 1e-3, 10e6, 10e-3, 2e-3);
    /** USB full speed (USBTMC): 0.5 ms per message, 1 MB/s, 10 ms frequency change, 2 ms arming. */
    public static final SimTiming USB = new SimTiming("usb", 0.5e-3, 1e6, 10e-3, 2e-3);
    /** RS-232 at 115200 baud (8N1, 11520 bytes/s): 2 ms per message, 10 ms frequency change, 2 ms arming. */
    public static final SimTiming SERIAL = new SimTiming("serial", 2e-3, 11520, 10e-3, 2e-3);

    public boolean none() {
        return messageSecond == 0 && bytesPerSecond == 0 && frequencyChangeSecond == 0 && armSecond == 0;
    }

    /** Seconds to carry {@code bytes} over the link (0 for an instant link). */
    public double transfer(long bytes) {
        return bytesPerSecond > 0 ? bytes / bytesPerSecond : 0;
    }

    public static SimTiming named(String name) {
        return switch (name.toLowerCase(Locale.ROOT)) {
            case "none" -> NONE;
            case "lan" -> LAN;
            case "usb" -> USB;
            case "serial" -> SERIAL;
            default -> throw new IllegalArgumentException("'" + name + "' is not a timing profile; allowed: none, lan, usb, serial");
        };
    }

    /** Sleeps {@code seconds} of simulated instrument time (nothing when 0). */
    public static void pass(double seconds) {
        SimulatedTime.passSince(System.nanoTime(), seconds);
    }

    /** As {@link SimulatedTime#passSince}: the simulator's computing since the start is hidden in it. */
    public static void passSince(long startNanos, double seconds) {
        SimulatedTime.passSince(startNanos, seconds);
    }
}
