package org.lrbench.sampling;

import java.util.Map;
import org.lrbench.judge.CharacteristicClass;

/** A plan's sampling: the inspection level and the AQL (percent nonconforming) of each class it uses. */
public record SamplingScheme(InspectionLevel level, Map<CharacteristicClass, Double> aql) {
}
