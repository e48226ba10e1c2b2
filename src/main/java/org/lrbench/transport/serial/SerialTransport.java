package org.lrbench.transport.serial;

import com.fazecast.jSerialComm.SerialPort;
import com.fazecast.jSerialComm.SerialPortInvalidPortException;
import java.io.IOException;
import java.time.Duration;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportTimeoutException;

/** SCPI over an RS-232 or USB virtual serial port, with jSerialComm. */
public final class SerialTransport implements Transport {
    private final String address;
    private final SerialPort port;
    private int lastTimeoutMillis = -1;

    public SerialTransport(String address, SerialSettings settings) throws IOException {
        this.address = address;
        try {
            port = SerialPort.getCommPort(settings.device());
        } catch (SerialPortInvalidPortException e) {
            throw new IOException("serial device " + settings.device() + " does not exist", e);
        }
        port.setComPortParameters(settings.baud(), settings.dataBits(),
                settings.stopBits() == 2 ? SerialPort.TWO_STOP_BITS : SerialPort.ONE_STOP_BIT, parity(settings.parity()));
        port.setFlowControl(switch (settings.flow()) {
            case "rtscts" -> SerialPort.FLOW_CONTROL_RTS_ENABLED | SerialPort.FLOW_CONTROL_CTS_ENABLED;
            case "xonxoff" -> SerialPort.FLOW_CONTROL_XONXOFF_IN_ENABLED | SerialPort.FLOW_CONTROL_XONXOFF_OUT_ENABLED;
            default -> SerialPort.FLOW_CONTROL_DISABLED;
        });
        if (!port.openPort()) {
            throw new IOException("cannot open serial device " + settings.device() + " (error "
                    + port.getLastErrorCode() + "; does it exist, and may this user open it?)");
        }
        setReadTimeout(1000);
    }

    private static int parity(String p) {
        return switch (p) {
            case "even" -> SerialPort.EVEN_PARITY;
            case "odd" -> SerialPort.ODD_PARITY;
            case "mark" -> SerialPort.MARK_PARITY;
            case "space" -> SerialPort.SPACE_PARITY;
            default -> SerialPort.NO_PARITY;
        };
    }

    private void setReadTimeout(int millis) {
        if (millis != lastTimeoutMillis) {
            port.setComPortTimeouts(SerialPort.TIMEOUT_READ_SEMI_BLOCKING | SerialPort.TIMEOUT_WRITE_BLOCKING, millis, 0);
            lastTimeoutMillis = millis;
        }
    }

    @Override
    public String address() {
        return address;
    }

    @Override
    public synchronized void write(byte[] bytes) throws IOException {
        int done = 0;
        while (done < bytes.length) {
            int n = port.writeBytes(bytes, bytes.length - done, done);
            if (n <= 0) {
                throw new IOException("writing to " + address + " failed (error " + port.getLastErrorCode() + ")");
            }
            done += n;
        }
    }

    @Override
    public synchronized int read(byte[] dst, int offset, int length, Duration timeout) throws IOException {
        setReadTimeout((int) Math.max(1, Math.min(Integer.MAX_VALUE, timeout.toMillis())));
        int n = port.readBytes(dst, length, offset);
        if (n < 0) {
            throw new IOException("reading from " + address + " failed (error " + port.getLastErrorCode()
                    + "; was the device unplugged?)");
        }
        if (n == 0) {
            throw new TransportTimeoutException("no data from " + address + " within " + timeout.toMillis() + " ms");
        }
        return n;
    }

    @Override
    public synchronized void discardInput() {
        port.flushIOBuffers();
        byte[] sink = new byte[4096];
        while (port.bytesAvailable() > 0 && port.readBytes(sink, Math.min(sink.length, port.bytesAvailable()), 0) > 0) {
            // drop what was already received
        }
    }

    @Override
    public synchronized void close() {
        port.closePort();
    }
}
