package org.lrbench.transport;

import java.io.IOException;
import java.util.List;
import java.util.Map;
import java.util.ServiceLoader;
import java.util.TreeMap;
import org.lrbench.instrument.InstrumentException;

/** Opens the transport an address names, through the registered {@link TransportProvider}s. */
public final class Transports {
    private static final Map<String, TransportProvider> PROVIDERS = load();

    private Transports() {
    }

    private static Map<String, TransportProvider> load() {
        Map<String, TransportProvider> out = new TreeMap<>();
        for (TransportProvider p : ServiceLoader.load(TransportProvider.class, Transports.class.getClassLoader())) {
            out.put(p.scheme(), p);
        }
        return Map.copyOf(out);
    }

    /** The registered schemes, sorted. */
    public static List<String> schemes() {
        return PROVIDERS.keySet().stream().sorted().toList();
    }

    static boolean known(String scheme) {
        return PROVIDERS.containsKey(scheme);
    }

    /** Checks an address fully (target and options) without opening anything. */
    public static void check(Address address) {
        provider(address).check(address);
        address.terminator();
    }

    /**
     * @param simulated the in-process instruments by name ("generator", "digitizer"), or an empty
     *                  map when no simulated bench runs in this process
     * @throws AddressException for a malformed address or option
     * @throws InstrumentException when the link cannot be opened
     */
    public static Transport open(Address address, Map<String, ?> simulated) {
        check(address);
        try {
            return provider(address).open(address, simulated);
        } catch (IOException e) {
            throw new InstrumentException("cannot open " + address + ": " + e.getMessage(), e);
        }
    }

    private static TransportProvider provider(Address address) {
        TransportProvider p = PROVIDERS.get(address.scheme());
        if (p == null) {
            throw new AddressException("no transport for scheme " + address.scheme() + "; schemes: "
                    + String.join(", ", schemes()));
        }
        return p;
    }
}
