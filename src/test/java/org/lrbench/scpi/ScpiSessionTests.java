package org.lrbench.scpi;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayDeque;
import java.util.Deque;
import java.util.List;
import org.assertj.core.api.Assertions;
import org.junit.jupiter.api.Test;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.transport.Transport;
import org.lrbench.transport.TransportTimeoutException;

/** The session's framing of replies and IEEE 488.2 definite-length blocks, one edge case each. */
class ScpiSessionTests {

    /** A transport that replays canned reply bytes, at most {@code chunk} bytes per read. */
    static final class Scripted implements Transport {
        final Deque<Byte> pending = new ArrayDeque<>();
        final StringBuilder written = new StringBuilder();
        final int chunk;

        Scripted(int chunk, byte[] reply) {
            this.chunk = chunk;
            for (byte b : reply) {
                pending.add(b);
            }
        }

        @Override
        public String address() {
            return "test://scripted";
        }

        @Override
        public void write(byte[] bytes) {
            written.append(new String(bytes, StandardCharsets.US_ASCII));
        }

        @Override
        public int read(byte[] dst, int offset, int length, Duration timeout) throws IOException {
            if (pending.isEmpty()) {
                throw new TransportTimeoutException("nothing");
            }
            int n = 0;
            while (n < Math.min(length, chunk) && !pending.isEmpty()) {
                dst[offset + n++] = pending.poll();
            }
            return n;
        }

        @Override
        public void discardInput() {
            pending.clear();
        }

        @Override
        public void close() {
        }
    }

    static byte[] bytes(String s) {
        return s.getBytes(StandardCharsets.ISO_8859_1);
    }

    static ScpiSession session(int chunk, String reply) {
        return new ScpiSession("scope", new Scripted(chunk, bytes(reply)), Duration.ofMillis(50));
    }

    @Test
    void definiteBlockSplitAcrossManyReadsIsReassembled() {
        // IEEE Std 488.2-1992, 7.7.6.2: #<digit count><length digits><bytes>
        String payload = "\u0001\n\u00ff\u0000#9";
        byte[] block = session(1, "#16" + payload + "\n").queryBlock("TRAC? CH1");
        assertThat(block).containsExactly(bytes(payload));
    }

    @Test
    void blockLongerThanDeclaredIsRefused() {
        assertThatThrownBy(() -> session(4, "#14abcdef\n").queryBlock("TRAC?"))
                .isInstanceOf(InstrumentException.class)
                .hasMessageContaining("followed by 'e' instead of the terminator");
    }

    @Test
    void shortBlockTimesOutWithTheCommandNamed() {
        assertThatThrownBy(() -> session(64, "#210abc").queryBlock("TRAC? CH2"))
                .isInstanceOf(InstrumentException.class)
                .hasMessageContaining("scope").hasMessageContaining("TRAC? CH2").hasMessageContaining("incomplete");
    }

    @Test
    void malformedHeadersAreRefused() {
        assertThatThrownBy(() -> session(64, "12345\n").queryBlock("X?")).hasMessageContaining("expected '#'");
        assertThatThrownBy(() -> session(64, "#x\n").queryBlock("X?")).hasMessageContaining("expected a digit");
        assertThatThrownBy(() -> session(64, "#3a\n").queryBlock("X?")).hasMessageContaining("length digit 1 of 3");
    }

    @Test
    void indefiniteBlockEndsAtANewlineThatNothingFollows() {
        // IEEE Std 488.2-1992, 7.7.6.2: #0<bytes>NL^END; on a byte stream the END is the quiet after NL
        assertThat(session(64, "#0abc\n").queryBlock("X?")).containsExactly(bytes("abc"));
        // a newline that more data follows at once is data
        assertThat(session(2, "#0a\nb\n").queryBlock("X?")).containsExactly(bytes("a\nb"));
    }

    @Test
    void carriageReturnLineFeedTerminatorIsHonoured() {
        Scripted link = new Scripted(3, bytes("LRBENCH,M,1,2\r\n#13xyz\r\n"));
        ScpiSession s = new ScpiSession("meter", link, Duration.ofMillis(50), "\r\n");
        assertThat(s.identify().model()).isEqualTo("M");
        assertThat(s.queryBlock("DATA?")).containsExactly(bytes("xyz"));
        assertThat(link.written.toString()).isEqualTo("*IDN?\r\nDATA?\r\n");
    }

    @Test
    void configurationAndErrorQueryTravelInOneMessage() {
        Scripted link = new Scripted(64, bytes("1.0E+00;0,\"No error\"\n"));
        ScpiSession s = new ScpiSession("scope", link, Duration.ofMillis(50));
        assertThat(s.configure(":RANG 1;:RANG?", ":SYST:ERR?")).containsExactly("1.0E+00");
        assertThat(link.written.toString()).isEqualTo(":RANG 1;:RANG?;:SYST:ERR?\n");
        assertThat(s.queries()).isEqualTo(1);
        Scripted bad = new Scripted(64, bytes("-222,\"Data out of range;x\"\n0,\"No error\"\n"));
        assertThatThrownBy(() -> new ScpiSession("scope", bad, Duration.ofMillis(50)).configure(":RANG 1E9", ":SYST:ERR?"))
                .hasMessage("scope: ':RANG 1E9' caused [-222,\"Data out of range;x\"]");
    }

    @Test
    void noReplyNamesInstrumentCommandAndWait() {
        assertThatThrownBy(() -> session(64, "").query("*IDN?"))
                .isInstanceOf(InstrumentException.class)
                .hasMessageMatching("scope \\(test://scripted\\): no reply to '\\*IDN\\?' after \\d+ ms \\(timeout 50 ms\\)");
    }

    @Test
    void lateRepliesAreFlushedAfterATimeout() {
        Scripted link = new Scripted(64, bytes("#15ab"));
        ScpiSession s = new ScpiSession("scope", link, Duration.ofMillis(5));
        assertThatThrownBy(() -> s.queryBlock("TRAC?")).isInstanceOf(InstrumentException.class);
        assertThat(link.pending).isEmpty();
    }

    @Test
    void commandsCannotCarryASecondMessage() {
        ScpiSession s = session(64, "");
        assertThatThrownBy(() -> s.write("FREQ 1\n*RST")).isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void errorQueueIsDrainedAndReportedWithTheCause() {
        ScpiSession s = session(64, "-222,\"Data out of range\"\n+0,\"No error\"\n");
        assertThatThrownBy(() -> s.checkErrors("SYST:ERR?", "FREQ 9E9"))
                .hasMessage("scope: 'FREQ 9E9' caused [-222,\"Data out of range\"]");
    }

    @Test
    void traceEncodingsDecodeBothByteOrders() {
        assertThat(TraceEncoding.INT16_BIG.decode(new byte[] {0x01, 0x02, (byte) 0xff, (byte) 0xfe}))
                .containsExactly(258, -2);
        assertThat(TraceEncoding.INT16_LITTLE.decode(new byte[] {0x02, 0x01, (byte) 0xfe, (byte) 0xff}))
                .containsExactly(258, -2);
        assertThat(TraceEncoding.INT8.decode(new byte[] {(byte) 0x80, 0x7f})).containsExactly(-128, 127);
        assertThatThrownBy(() -> TraceEncoding.INT16_BIG.decode(new byte[3])).hasMessageContaining("whole number");
    }

    @Test
    void numbersAreSentAsNr3AndNothingElse() {
        assertThat(ScpiNumbers.nr3(1234.5)).isEqualTo("1.234500000E+03");
        assertThatThrownBy(() -> ScpiNumbers.nr3(Double.NaN)).isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void asciiTracesSeparatedByCommasBlanksOrBothDecodeAlike() {
        // SCPI-1999 (Vol. 1, 9.1, from memory): NR1/NR3 numbers in a list; instruments separate them
        // with commas, blanks, or both
        double[] want = {1.5, -0.25, 3e-3, 4};
        for (String reply : new String[] {"1.5,-0.25,3E-3,+4", "1.5 -0.25 3E-3 +4", " 1.5, -0.25,  3E-3 , 4 "}) {
            Assertions.assertThat(TraceEncoding.decodeAscii(reply)).as(reply).containsExactly(want);
        }
    }

    @Test
    void aDefiniteBlockWithoutTrailingTerminatorIsReadWhenTheDriverSaysSo() {
        // IEEE Std 488.2-1992, 7.7.6.2: #<digit count><length digits><bytes>; some instruments send no terminator after it
        byte[] block = session(3, "#14abcd").queryBlock(":DATA?", false);
        Assertions.assertThat(new String(block, StandardCharsets.ISO_8859_1)).isEqualTo("abcd");
        Assertions.assertThatThrownBy(() -> session(3, "#14abcd").queryBlock(":DATA?", true))
                .isInstanceOf(InstrumentException.class);
    }

    @Test
    void anAsciiListOneValuePerLineIsReadLineByLine() {
        ScpiSession s = session(2, "1.5\n-2\n3E-1\n");
        List<String> lines = s.queryLines(":DATA?", 3);
        Assertions.assertThat(TraceEncoding.decodeAscii(String.join(",", lines)))
                .containsExactly(1.5, -2, 0.3);
        // a reply with fewer lines than the record times out and says how many came
        Assertions.assertThatThrownBy(() -> session(2, "1\n2\n").queryLines(":DATA?", 3))
                .hasMessageContaining("2 of 3 lines");
    }

    /** A link that hands over one byte every {@code everyMillis} (sleeping, as a slow instrument would), never faster. */
    static final class Trickle implements Transport {
        final Deque<Byte> pending = new ArrayDeque<>();
        final long everyMillis;

        Trickle(long everyMillis, byte[] reply) {
            this.everyMillis = everyMillis;
            for (byte b : reply) {
                pending.add(b);
            }
        }

        @Override
        public String address() {
            return "test://trickle";
        }

        @Override
        public void write(byte[] bytes) {
        }

        @Override
        public int read(byte[] dst, int offset, int length, Duration timeout) throws IOException {
            if (pending.isEmpty() || timeout.toMillis() < everyMillis) {
                try {
                    Thread.sleep(Math.max(0, Math.min(timeout.toMillis(), everyMillis)));
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
                throw new TransportTimeoutException("nothing within " + timeout.toMillis() + " ms");
            }
            try {
                Thread.sleep(everyMillis);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
            dst[offset] = pending.poll();
            return 1;
        }

        @Override
        public void discardInput() {
            pending.clear();
        }

        @Override
        public void close() {
        }
    }

    @Test
    void aReplyTrickledByteByByteMeetsOneDeadlineForTheWholeReply() {
        // every read gets a byte within the timeout, but the whole reply would take 40 x 100 ms = 4 s
        byte[] idn = "LRBENCH,TRICKLE-1,SN0001,1.0.0.0.0.0.0\n".getBytes(StandardCharsets.US_ASCII);
        ScpiSession s = new ScpiSession("digitizer", new Trickle(100, idn), Duration.ofMillis(800));
        long start = System.nanoTime();
        assertThatThrownBy(() -> s.query("*IDN?")).isInstanceOf(InstrumentException.class)
                .hasMessageContaining("no reply to '*IDN?'");
        assertThat((System.nanoTime() - start) / 1e6).isLessThan(3000);
    }

    @Test
    void aBlockGetsItsBytesTimeAtTheSlowestRateAndNoMore() {
        byte[] data = new byte[300];
        byte[] block = ("#3300").getBytes(StandardCharsets.US_ASCII);
        byte[] whole = new byte[block.length + data.length + 1];
        System.arraycopy(block, 0, whole, 0, block.length);
        whole[whole.length - 1] = '\n';
        // 305 bytes at 20 ms each would take 6 s; the deadline is 0.5 s plus 300 bytes at 1000 bytes/s
        ScpiSession s = new ScpiSession("digitizer", new Trickle(20, whole), Duration.ofMillis(500));
        s.setMinimumTransferRate(1000);
        long start = System.nanoTime();
        assertThatThrownBy(() -> s.queryBlock(":TRACe:DATA? CH1")).isInstanceOf(InstrumentException.class)
                .hasMessageContaining("bytes received").hasMessageContaining("1000 bytes/s");
        double ms = (System.nanoTime() - start) / 1e6;
        assertThat(ms).isBetween(700.0, 4000.0);
        // the same block arriving at a working link's pace is read whole
        ScpiSession fast = new ScpiSession("digitizer", new Scripted(64, whole), Duration.ofMillis(500));
        assertThat(fast.queryBlock(":TRACe:DATA? CH1")).hasSize(300);
    }
}
