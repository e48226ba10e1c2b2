package org.lrbench.transport.usbtmc;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;
import java.util.Set;
import org.lrbench.transport.Address;
import org.lrbench.transport.AddressException;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportProvider;

/** {@code usbtmc:///dev/usbtmc0}: a USBTMC instrument through the Linux device file. */
public final class UsbtmcProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "usbtmc";
    }

    @Override
    public String example() {
        return "usbtmc:///dev/usbtmc0";
    }

    @Override
    public void check(Address address) {
        if (!address.target().startsWith("/")) {
            throw new AddressException("instrument address '" + address.text() + "': the device must be an absolute"
                    + " path, as in " + example());
        }
        address.requireOptions(Set.of("term"));
    }

    @Override
    public Transport open(Address address, Map<String, ?> simulated) throws IOException {
        return new UsbtmcTransport(address.text(), Path.of(address.target()));
    }
}
