package org.lrbench.store;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import org.lrbench.results.Attempt;
import org.lrbench.results.Inspection;
import org.lrbench.results.LotTerms;

/**
 * The canonical content of each kind of stored record, and its SHA-256 (FIPS 180-4). Content is a
 * compact JSON array of the record's stored fields in a fixed order, so the same row always gives
 * the same bytes whatever database holds it. The chain hash of a record is SHA-256 over the
 * previous record's chain hash, a colon and the content hash; the first record of a lot follows
 * {@link #GENESIS}.
 */
public final class Canonical {
    public static final String GENESIS = "0".repeat(64);
    private static final ObjectMapper COMPACT = new ObjectMapper();

    private Canonical() {
    }

    public static String terms(Inspection i) {
        LotTerms t = i.terms();
        ArrayNode a = COMPACT.createArrayNode().add("terms").add(t.lot()).add(i.round()).add(t.partNumber())
                .add(t.planPath()).add(t.planSha256()).add(t.bench());
        a.add(t.lotSize()).add(t.sampleSize()).add(t.sampling()).add(t.operator()).add(i.reason()).add(i.createdAt());
        if (t.severity() != null) {
            // terms stored since the switching rules (schema 4); earlier terms keep their content
            a.add(t.supplier()).add(t.severity()).add(t.severityReason());
        }
        if (t.classPlans() != null) {
            // terms stored since the class plans are kept as data (schema 5); earlier terms keep their content
            a.add(ClassPlansJson.text(t.classPlans()));
        }
        if (t.simulated()) {
            // a lot of the simulated bench says so in its chained content (schema 6); real lots keep theirs
            a.add("simulated");
        }
        return text(a);
    }

    public static String attempt(Attempt x, String programVersion, String tracesSha256) {
        ArrayNode a = COMPACT.createArrayNode().add("attempt").add(x.lot()).add(x.serial()).add(x.number()).add(x.round())
                .add(x.position()).add(x.verdict().word());
        a.add(x.inductanceH()).add(x.seriesResistanceOhm()).add(x.measuredAt()).add(programVersion).add(x.operator())
                .add(x.reason()).add(sha256(x.resultJson())).add(x.jsonFile()).add(x.tracesFile());
        a.add(x.tracesBytes()).add(tracesSha256);
        return text(a);
    }

    public static String decision(Inspection i) {
        ArrayNode a = COMPACT.createArrayNode().add("decision").add(i.lot()).add(i.round()).add(i.disposition().word())
                .add(i.dispositionReason()).add(i.finishedAt());
        if (i.switchingStep() != null || i.reinstatesNormal() != null) {
            a.add(i.switchingStep()).add(i.reinstatesNormal());
        }
        return text(a);
    }

    public static String chain(String previous, String contentSha256) {
        return sha256(previous + ":" + contentSha256);
    }

    public static String sha256(String text) {
        return sha256(text.getBytes(StandardCharsets.UTF_8));
    }

    public static String sha256(byte[] bytes) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is part of every Java platform", e);
        }
    }

    private static String text(ArrayNode a) {
        try {
            return COMPACT.writeValueAsString(a);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }
}
