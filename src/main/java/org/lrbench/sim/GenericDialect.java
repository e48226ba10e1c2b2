package org.lrbench.sim;

import java.util.Arrays;
import org.lrbench.sim.scpi.ScpiFault;

/**
 * The {@code generic} dialect of the simulated digitizer: the SCPI-1999 instrument-class subsystems
 * (SENSe, INPut, TRIGger:SEQuence, INITiate, FORMat, TRACe), any range from 10 mV to 100 V
 * peak-to-peak, a four-number scale query, and the bench's converter resolution.
 */
final class GenericDialect {

    private GenericDialect() {
    }

    static void install(SimDigitizer d) {
        register(d);
    }

    private static void register(SimDigitizer d) {
        d.on("SENSe#:VOLTage[:DC]:RANGe[:UPPer]", false, c -> {
            c.expect(1, 1);
            d.range[c.suffixUpTo(SimDigitizer.CHANNELS)] = c.number(0, SimDigitizer.MIN_RANGE, SimDigitizer.MAX_RANGE, 10.0);
            d.record = null;
            return null;
        });
        d.on("SENSe#:VOLTage[:DC]:RANGe[:UPPer]", true, c -> {
            c.expect(0, 1);
            int ch = c.suffixUpTo(SimDigitizer.CHANNELS);
            return SimDigitizer.nr3(c.count() == 0 ? d.range[ch] : c.number(0, SimDigitizer.MIN_RANGE, SimDigitizer.MAX_RANGE, 10.0));
        });
        d.on("SENSe#:VOLTage[:DC]:OFFSet", false, c -> {
            c.expect(1, 1);
            d.offset[c.suffixUpTo(SimDigitizer.CHANNELS)] = c.number(0, -SimDigitizer.MAX_RANGE, SimDigitizer.MAX_RANGE, 0);
            d.record = null;
            return null;
        });
        d.on("SENSe#:VOLTage[:DC]:OFFSet", true, c -> SimDigitizer.nr3(d.offset[c.suffixUpTo(SimDigitizer.CHANNELS)]));
        d.on("INPut#:COUPling", false, c -> {
            c.expect(1, 1);
            d.acCoupled[c.suffixUpTo(SimDigitizer.CHANNELS)] = c.word(0, "AC", "DC").equals("AC");
            d.record = null;
            return null;
        });
        d.on("INPut#:COUPling", true, c -> d.acCoupled[c.suffixUpTo(SimDigitizer.CHANNELS)] ? "AC" : "DC");
        d.on("[SENSe#]:SWEep:TINTerval", false, c -> {
            c.expect(1, 1);
            double requested = c.number(0, SimDigitizer.CLOCK_INTERVAL, 1.0, 1e-6);
            // the clock divides down by whole numbers: the interval is rounded down to a multiple of it
            d.interval = Math.max(1, Math.floor(requested / SimDigitizer.CLOCK_INTERVAL + 1e-9)) * SimDigitizer.CLOCK_INTERVAL;
            d.record = null;
            return null;
        });
        d.on("[SENSe#]:SWEep:TINTerval", true, c -> SimDigitizer.nr3(d.interval));
        d.on("[SENSe#]:SWEep:POINts", false, c -> {
            c.expect(1, 1);
            d.points = (int) Math.round(c.number(0, 16, SimDigitizer.MAX_POINTS, 1000));
            d.record = null;
            return null;
        });
        d.on("[SENSe#]:SWEep:POINts", true, c -> Integer.toString(d.points));
        d.on("TRIGger[:SEQuence]:SOURce", false, c -> {
            c.expect(1, 1);
            d.triggerSource = c.word(0, "CH1", "CH2", "EXTernal", "IMMediate");
            return null;
        });
        d.on("TRIGger[:SEQuence]:SOURce", true, c -> d.triggerSource);
        d.on("TRIGger[:SEQuence]:LEVel", false, c -> {
            c.expect(1, 1);
            d.triggerLevel = c.number(0, -SimDigitizer.MAX_RANGE, SimDigitizer.MAX_RANGE, 0);
            return null;
        });
        d.on("TRIGger[:SEQuence]:LEVel", true, c -> SimDigitizer.nr3(d.triggerLevel));
        d.on("TRIGger[:SEQuence]:SLOPe", false, c -> {
            c.expect(1, 1);
            d.triggerRising = c.word(0, "POSitive", "NEGative").equals("POS");
            return null;
        });
        d.on("TRIGger[:SEQuence]:SLOPe", true, c -> d.triggerRising ? "POS" : "NEG");
        d.on("FORMat[:DATA]", false, c -> {
            c.expect(1, 2);
            String type = c.word(0, "ASCii", "INTeger", "REAL");
            int length = c.count() > 1 ? (int) c.number(1, 8, 64, 8) : (type.equals("REAL") ? 32 : 8);
            Arrays.fill(d.encoded, null);
            d.format = switch (type + length) {
                case "ASC8" -> SimDigitizer.Format.ASCII;
                case "INT8" -> SimDigitizer.Format.INT8;
                case "INT16" -> SimDigitizer.Format.INT16;
                case "REAL32" -> SimDigitizer.Format.REAL32;
                case "REAL64" -> SimDigitizer.Format.REAL64;
                default -> throw ScpiFault.illegalValue("FORMat " + type + "," + length);
            };
            return null;
        });
        d.on("FORMat:BORDer", false, c -> {
            c.expect(1, 1);
            d.littleEndian = c.word(0, "NORMal", "SWAPped").equals("SWAP");
            Arrays.fill(d.encoded, null);
            return null;
        });
        d.on("INITiate[:IMMediate]", false, c -> {
            c.expect(0, 0);
            d.acquire();
            return null;
        });
        d.on("TRACe:SCALe", true, c -> {
            int ch = d.channelParameter(c);
            double yIncrement = switch (d.format) {
                case INT8 -> d.range[ch] / 256;
                case INT16 -> d.range[ch] / 65536;
                default -> 1.0;
            };
            double yOrigin = d.format == SimDigitizer.Format.INT8 || d.format == SimDigitizer.Format.INT16 ? d.offset[ch] : 0.0;
            return SimDigitizer.nr3(d.interval) + "," + SimDigitizer.nr3(d.firstSampleAfterTrigger) + "," + SimDigitizer.nr3(yIncrement) + "," + SimDigitizer.nr3(yOrigin);
        });
        d.on("TRACe[:DATA]", true, c -> {
            int ch = d.channelParameter(c);
            return d.encoded(ch);
        });
    }
}
