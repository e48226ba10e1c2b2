package org.lrbench.analysis;

import java.util.function.ToDoubleFunction;

/** A reported quantity computed from the lumped model's parameters, with its name and unit. */
public record Evaluation(String name, String unit, ToDoubleFunction<double[]> function) {

    public double at(double[] parameters) {
        return function.applyAsDouble(parameters);
    }
}
