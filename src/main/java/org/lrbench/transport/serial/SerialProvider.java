package org.lrbench.transport.serial;

import java.io.IOException;
import java.util.Map;
import org.lrbench.transport.Address;
import org.lrbench.transport.AddressException;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportProvider;

/** {@code serial:///dev/ttyUSB0?baud=...}: a serial line through jSerialComm ({@link SerialSettings}). */
public final class SerialProvider implements TransportProvider {

    @Override
    public String scheme() {
        return "serial";
    }

    @Override
    public String example() {
        return "serial:///dev/ttyUSB0?baud=115200";
    }

    @Override
    public void check(Address address) {
        if (!address.target().startsWith("/")) {
            throw new AddressException("instrument address '" + address.text() + "': the device must be an absolute"
                    + " path, as in " + example());
        }
        SerialSettings.of(address);
    }

    @Override
    public Transport open(Address address, Map<String, ?> simulated) throws IOException {
        return new SerialTransport(address.text(), SerialSettings.of(address));
    }
}
