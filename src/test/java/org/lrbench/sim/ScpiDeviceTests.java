package org.lrbench.sim;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;
import org.lrbench.instrument.Identity;
import org.lrbench.instrument.Waveform;
import org.lrbench.sim.scpi.ScpiDevice;

/** The simulated instruments' SCPI front end. */
class ScpiDeviceTests {

    private static String ask(SimGenerator g, String message) {
        g.receive((message + "\n").getBytes(StandardCharsets.US_ASCII));
        byte[] buf = new byte[4096];
        int n = g.transmit(buf, 0, buf.length);
        return new String(buf, 0, n, StandardCharsets.US_ASCII).strip();
    }

    @Test
    void identityHasTheFourFieldsOfIeee4882() {
        // IEEE Std 488.2-1992, 10.14: *IDN? answers manufacturer, model, serial number, firmware level
        Identity id = Identity.parse(ask(new SimGenerator(50), "*IDN?"));
        assertThat(id.manufacturer()).isEqualTo("LRBENCH");
        assertThat(id.model()).isNotBlank();
    }

    @Test
    void longAndShortFormsAnyCaseReachTheSameCommand() {
        // SCPI-1999 Vol. 1, 6.2.1: a mnemonic is accepted in its long or short form, case-insensitively
        SimGenerator g = new SimGenerator(50);
        ask(g, ":SOURce1:FREQuency:FIXed 2500");
        assertThat(Double.parseDouble(ask(g, "sour:freq?"))).isEqualTo(2500);
        ask(g, "FREQ 3.5KHZ");
        assertThat(Double.parseDouble(ask(g, ":source:frequency:cw?"))).isEqualTo(3500);
        ask(g, "FUNC TRIangle");
        assertThat(g.waveform()).isEqualTo(Waveform.TRIANGLE);
        assertThat(ask(g, "SYST:ERR?")).isEqualTo("0,\"No error\"");
    }

    @Test
    void compoundMessagesContinueFromThePreviousPath() {
        // SCPI-1999 Vol. 1, 6.2.4: after ';' a header without a leading colon is relative to the
        // previous header's path
        SimGenerator g = new SimGenerator(50);
        ask(g, ":OUTPut1:LOAD INF;:SOURce1:VOLTage:LEVel:IMMediate:AMPLitude 2;OFFSet 0.5");
        assertThat(Double.parseDouble(ask(g, ":VOLT:OFFS?"))).isEqualTo(0.5);
        assertThat(ask(g, "*OPC?;:SOURce:FREQuency?")).matches("1;1\\.0+E\\+03");
    }

    @Test
    void undefinedHeaderQueuesError113() {
        // SCPI-1999 Vol. 2, 21.8.4: -113 "Undefined header" (error number from memory)
        SimGenerator g = new SimGenerator(50);
        ask(g, ":SOURce1:FREQuenzy 1000");
        assertThat(ask(g, "SYSTem:ERRor?")).startsWith("-113,\"Undefined header");
        assertThat(ask(g, "SYSTem:ERRor?")).isEqualTo("0,\"No error\"");
    }

    @Test
    void outOfRangeValueQueuesError222AndKeepsTheSetting() {
        // SCPI-1999 Vol. 2, 21.8.6: -222 "Data out of range" (error number from memory)
        SimGenerator g = new SimGenerator(50);
        ask(g, ":FREQ 1000");
        ask(g, ":FREQ 9E9");
        assertThat(ask(g, ":SYST:ERR?")).startsWith("-222,\"Data out of range");
        assertThat(g.frequency()).isEqualTo(1000);
    }

    @Test
    void unreadResponseIsInterruptedByTheNextMessage() {
        // IEEE Std 488.2-1992, 6.3.2.3: a new message before the response is read -> -410 Query INTERRUPTED
        SimGenerator g = new SimGenerator(50);
        g.receive("*IDN?\n".getBytes(StandardCharsets.US_ASCII));
        assertThat(ask(g, "SYST:ERR?")).isEqualTo("-410,\"Query INTERRUPTED\"");
    }

    @Test
    void errorQueueOverflowEndsInError350() {
        // SCPI-1999 Vol. 2, 21.8.10: a full queue replaces its last entry by -350 "Queue overflow"
        SimGenerator g = new SimGenerator(50);
        for (int i = 0; i < 30; i++) {
            ask(g, "BOGUS");
        }
        String last = "";
        for (int i = 0; i < ScpiDeviceConstants.DEPTH; i++) {
            last = ask(g, "SYST:ERR?");
        }
        assertThat(last).isEqualTo("-350,\"Queue overflow\"");
        assertThat(ask(g, "SYST:ERR?")).isEqualTo("0,\"No error\"");
    }

    @Test
    void generatorAmplitudeRefersToTheLoadSetting() {
        // common practice, no source: a generator set for a 50 ohm load doubles its EMF compared
        // with the same setting for a high-impedance load
        SimGenerator g = new SimGenerator(50);
        ask(g, "VOLT 2;:OUTP ON");
        assertThat(g.emfPeak()).isEqualTo(2.0);
        ask(g, "OUTP:LOAD INF");
        assertThat(g.emfPeak()).isEqualTo(1.0);
        ask(g, "OUTP OFF");
        assertThat(g.emfPeak()).isZero();
    }

    /** The queue depth the device promises. */
    static final class ScpiDeviceConstants {
        static final int DEPTH = ScpiDevice.QUEUE_DEPTH;
    }

    @Test
    void aDefiniteBlockIsFramedByItsCountWhateverBytesItHolds() {
        // IEEE Std 488.2-1992, 7.7.6: #, a digit d, d digits of byte count, then that many bytes of any
        // value; a newline, ';' or ',' inside is data. 32 words whose bytes include 0x0A, ';', ',' and
        // a last byte that is white space
        SimGenerator g = new SimGenerator(50);
        byte[] data = new byte[64];
        for (int i = 0; i < 32; i++) {
            short w = (short) (i % 4 == 0 ? 0x0A3B : i % 4 == 1 ? 0x2C20 : i % 4 == 2 ? -32767 : 32767);
            data[2 * i] = (byte) (w >> 8);
            data[2 * i + 1] = (byte) w;
        }
        data[63] = 0x20;
        String block = org.lrbench.scpi.DefiniteBlock.of(data);
        byte[] message = (":TRACe:DATA " + block + ";:TRACe:RATE 3.2E4;:FUNC USER;:SYST:ERR?\n")
                .getBytes(StandardCharsets.ISO_8859_1);
        // in three pieces, as a link may deliver it
        g.receive(java.util.Arrays.copyOfRange(message, 0, 15));
        g.receive(java.util.Arrays.copyOfRange(message, 15, 40));
        g.receive(java.util.Arrays.copyOfRange(message, 40, message.length));
        byte[] buf = new byte[256];
        int n = g.transmit(buf, 0, buf.length);
        assertThat(new String(buf, 0, n, StandardCharsets.US_ASCII).strip()).isEqualTo("0,\"No error\"");
        assertThat(g.waveform()).isEqualTo(Waveform.ARBITRARY);
        assertThat(ask(g, "TRACe:POINts?")).isEqualTo("32");
        // 32 points repeated at 32 kpoints/s: the waveform repeats at 1 kHz
        assertThat(g.frequency()).isEqualTo(1000.0);
        // a block one byte short of a word is refused (SCPI-1999 -161, invalid block data)
        ask(g, ":TRACe:DATA #13abc");
        assertThat(ask(g, "SYST:ERR?")).startsWith("-161");
    }
}
