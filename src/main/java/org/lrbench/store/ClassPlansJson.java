package org.lrbench.store;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.lrbench.judge.CharacteristicClass;
import org.lrbench.sampling.ClassPlan;
import org.lrbench.sampling.InspectionLevel;
import org.lrbench.sampling.SamplingPlan;
import org.lrbench.sampling.Severity;

/**
 * An inspection's class plans as the store keeps them: a compact JSON array, one object per class
 * with fixed keys in a fixed order (the text enters the lot's hash chain, so it is the same for the
 * same plans on every store and every run).
 */
final class ClassPlansJson {
    private static final ObjectMapper JSON = new ObjectMapper();

    private ClassPlansJson() {
    }

    /** The plans as stored text; null stays null (inspections stored before class plans were kept). */
    static String text(List<ClassPlan> plans) {
        if (plans == null) {
            return null;
        }
        ArrayNode a = JSON.createArrayNode();
        for (ClassPlan c : plans) {
            SamplingPlan p = c.plan();
            ObjectNode o = a.addObject();
            o.put("class", c.classWord());
            o.put("severity", c.severity().word());
            o.put("lot_size", p.lotSize());
            o.put("level", p.level().name());
            o.put("aql", p.aql());
            o.put("code_letter", String.valueOf(p.codeLetter()));
            o.put("plan_letter", String.valueOf(p.planLetter()));
            o.put("n", p.sampleSize());
            o.put("ac", p.acceptance());
            o.put("re", p.rejection());
            o.put("full_inspection", p.fullInspection());
        }
        try {
            return JSON.writeValueAsString(a);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("class plans cannot be written as JSON", e);
        }
    }

    /** The stored text read back; a text lrbench did not write is a store fault naming the lot. */
    static List<ClassPlan> read(String text, String lot) {
        if (text == null) {
            return null;
        }
        try {
            List<ClassPlan> out = new ArrayList<>();
            for (JsonNode o : JSON.readTree(text)) {
                SamplingPlan p = new SamplingPlan(o.required("lot_size").asInt(),
                        InspectionLevel.valueOf(o.required("level").asText()), o.required("aql").asDouble(),
                        o.required("code_letter").asText().charAt(0), o.required("plan_letter").asText().charAt(0),
                        o.required("n").asInt(), o.required("ac").asInt(), o.required("re").asInt(),
                        o.required("full_inspection").asBoolean());
                out.add(new ClassPlan(CharacteristicClass.valueOf(o.required("class").asText().toUpperCase(Locale.ROOT)),
                        Severity.of(o.required("severity").asText()), p));
            }
            return List.copyOf(out);
        } catch (JsonProcessingException | IllegalArgumentException | StringIndexOutOfBoundsException e) {
            throw new StoreException("lot " + lot + ": the stored class plans are not as lrbench writes them ("
                    + e.getMessage() + "); run lrbench verify", e);
        }
    }
}
