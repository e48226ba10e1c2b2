package org.lrbench.transport.serial;

import java.util.Set;
import org.lrbench.transport.Address;

/**
 * Serial line settings from a {@code serial://DEVICE?...} address: {@code baud} (default 9600),
 * {@code data} bits 5 to 8 (default 8), {@code parity} none|even|odd|mark|space (default none),
 * {@code stop} 1|2 (default 1), {@code flow} none|rtscts|xonxoff (default none), and the common
 * {@code term} option.
 */
public record SerialSettings(String device, int baud, int dataBits, String parity, int stopBits, String flow) {

    public static final Set<String> OPTIONS = Set.of("baud", "data", "parity", "stop", "flow", "term");

    public static SerialSettings of(Address address) {
        address.requireOptions(OPTIONS);
        return new SerialSettings(address.target(),
                address.intOption("baud", 9600, 50, 4_000_000),
                address.intOption("data", 8, 5, 8),
                address.wordOption("parity", "none", Set.of("none", "even", "odd", "mark", "space")),
                address.intOption("stop", 1, 1, 2),
                address.wordOption("flow", "none", Set.of("none", "rtscts", "xonxoff")));
    }
}
