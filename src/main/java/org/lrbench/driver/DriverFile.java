package org.lrbench.driver;

import java.time.Duration;
import java.util.Map;
import java.util.regex.Pattern;
import org.lrbench.instrument.Identity;
import org.lrbench.scpi.TraceEncoding;

/**
 * A loaded, validated driver: command templates per logical operation, word tables, the trace
 * encoding and the {@link DigitizerTraits} (digitizers), the ratio of a source's amplitude and offset
 * settings to its open-circuit EMF (1 when the settings are the EMF, below 1 when they are referred
 * to a load the instrument assumes), the error query, the reply timeout, and patterns for the {@code *IDN?}
 * fields of the instruments it is written for.
 */
public record DriverFile(String name, String source, DriverKind kind, String description,
                         Map<String, Pattern> identity, Duration timeout, String errorQuery,
                         Map<String, CommandTemplate> commands, Map<String, Map<String, String>> words,
                         TraceEncoding traceEncoding, DigitizerTraits digitizer, double levelPerEmf,
                         InstrumentLimits limits, double frequencySettleSecond, String arbitraryEncoding,
                         double minimumTransferRate) {

    /** A driver with the default slowest block transfer ({@link org.lrbench.scpi.ScpiSession#DEFAULT_MINIMUM_RATE}). */
    public DriverFile(String name, String source, DriverKind kind, String description, Map<String, Pattern> identity,
                      Duration timeout, String errorQuery, Map<String, CommandTemplate> commands,
                      Map<String, Map<String, String>> words, TraceEncoding traceEncoding, DigitizerTraits digitizer,
                      double levelPerEmf, InstrumentLimits limits, double frequencySettleSecond, String arbitraryEncoding) {
        this(name, source, kind, description, identity, timeout, errorQuery, commands, words, traceEncoding, digitizer,
                levelPerEmf, limits, frequencySettleSecond, arbitraryEncoding,
                org.lrbench.scpi.ScpiSession.DEFAULT_MINIMUM_RATE);
    }

    /** How a source's arbitrary waveform goes: an ASCII list, or a block of 16-bit words. */
    public static final java.util.List<String> ARBITRARY_ENCODINGS = java.util.List.of("ascii", "int16-big", "int16-little");

    /** Whether the driver has a template for the operation (some are needed only for some traits). */
    public boolean has(String operation) {
        return commands.containsKey(operation);
    }

    public CommandTemplate command(String operation) {
        CommandTemplate t = commands.get(operation);
        if (t == null) {
            throw new IllegalStateException("driver " + name + " has no operation " + operation);
        }
        return t;
    }

    /** The SCPI word for a logical word of a table ("shapes", "sine" -> "SINusoid"). */
    /** The instrument's word for a logical one, or null when the driver does not give it. */
    public String word(String table, String logical) {
        Map<String, String> t = words.get(table);
        return t == null ? null : t.get(logical);
    }

    /** Whether an instrument's identity matches every identity pattern of this driver. */
    public boolean matches(Identity id) {
        return fieldMatches("manufacturer", id.manufacturer()) && fieldMatches("model", id.model())
                && fieldMatches("serial", id.serial()) && fieldMatches("firmware", id.firmware());
    }

    private boolean fieldMatches(String field, String value) {
        Pattern p = identity.get(field);
        return p == null || p.matcher(value).matches();
    }
}
