package org.lrbench.plan;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.lrbench.judge.Limit;
import org.lrbench.units.Dimension;
import org.lrbench.units.Units;

/**
 * Warnings on a plan that is valid but questionable: things a plan may ask for, that an engineer
 * rarely means. {@code check} prints them and still exits 0.
 */
public final class PlanAdvice {

    private PlanAdvice() {
    }

    public static List<String> warnings(Plan plan) {
        List<String> out = new ArrayList<>();
        for (Limit l : plan.limits()) {
            if (Double.isFinite(l.lower()) && Double.isFinite(l.upper())) {
                double nominal = (l.lower() + l.upper()) / 2;
                double relative = (l.upper() - l.lower()) / 2 / nominal;
                if (relative > 0.5) {
                    out.add(String.format(Locale.ROOT, "limit '%s': a tolerance of +/- %.0f %% is unusually wide for a"
                            + " purchase specification", l.name(), 100 * relative));
                }
            }
        }
        if (plan.sweep().settleSecond() > 10) {
            out.add("sine_sweep.settle: " + Units.format(plan.sweep().settleSecond(), Dimension.TIME) + " per frequency"
                    + " is long; each part takes " + Units.format(plan.sweep().settleSecond() * plan.sweep().frequenciesHz().size(),
                    Dimension.TIME) + " of settling alone");
        }
        if (plan.sweep().distortionLimit() > 0.2) {
            out.add(String.format(Locale.ROOT, "sine_sweep.distortion_limit: %.0f %% lets a saturating core pass without a"
                    + " warning", 100 * plan.sweep().distortionLimit()));
        }
        DcResistanceStep dc = plan.dcResistance();
        if (dc != null && (dc.temperatureC() < 10 || dc.temperatureC() > 40)) {
            out.add("dc_resistance.temperature: " + Units.format(dc.temperatureC(), Dimension.TEMPERATURE)
                    + " is an unusual bench temperature; check it was entered in degrees Celsius");
        }
        return out;
    }
}
