package org.lrbench.transport.usbtmc;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.lrbench.transport.TransportTimeoutException;

/**
 * The USBTMC transport's file I/O and timeouts, against a named pipe standing in for
 * {@code /dev/usbtmcN}: what is written comes back on read, as a loopback. No USB instrument is
 * involved; the kernel driver's own protocol is not exercised here.
 */
class UsbtmcTransportTests {

    static Path fifo(Path dir) throws Exception {
        Path p = dir.resolve("usbtmc0");
        boolean made = new ProcessBuilder("mkfifo", p.toString()).start().waitFor() == 0;
        assumeTrue(made, "mkfifo is not available: USBTMC file I/O test skipped");
        return p;
    }

    @Test
    void writesAndReadsThroughTheDeviceFileWithTimeouts(@TempDir Path dir) throws Exception {
        Path device = fifo(dir);
        try (UsbtmcTransport t = new UsbtmcTransport("usbtmc://" + device, device)) {
            byte[] buf = new byte[64];
            assertThatThrownBy(() -> t.read(buf, 0, buf.length, Duration.ofMillis(100)))
                    .isInstanceOf(TransportTimeoutException.class);
            // the read left waiting gets the next bytes; they are late input and are thrown away
            t.write("late\n".getBytes(StandardCharsets.US_ASCII));
            Thread.sleep(100);
            t.discardInput();
            t.write("*IDN?\n".getBytes(StandardCharsets.US_ASCII));
            int n = t.read(buf, 0, buf.length, Duration.ofSeconds(2));
            assertThat(new String(buf, 0, n, StandardCharsets.US_ASCII)).isEqualTo("*IDN?\n");
        }
    }

    @Test
    void aMissingDeviceSaysWhatToCheck(@TempDir Path dir) {
        assertThatThrownBy(() -> new UsbtmcTransport("usbtmc:///nope", dir.resolve("usbtmc9")))
                .hasMessageContaining("does not exist").hasMessageContaining("usbtmc kernel module");
    }
}
