package org.lrbench.analysis;

import java.util.List;

/**
 * Weighted least squares of the series model Z(f) = R + j 2 pi f L over the sweep points, each
 * weighted by the inverse variance of its components. Real and imaginary parts decouple:
 * R = sum(w Re Z) / sum(w), L = sum(w w_k X) / sum(w w_k^2) with w_k = 2 pi f_k, and
 * u(R) = 1/sqrt(sum w), u(L) = 1/sqrt(sum w w_k^2). When the reduced chi-square exceeds 1, the
 * uncertainties are scaled by its square root (the scatter is larger than the points claim).
 */
public final class SeriesModelFit {
    /** Floor on a point's relative uncertainty, so an ideal noise-free point cannot take all weight. */
    static final double MIN_RELATIVE_UNCERTAINTY = 1e-12;

    private SeriesModelFit() {
    }

    public static SeriesModel fit(List<ImpedancePoint> points) {
        if (points.isEmpty()) {
            throw new IllegalArgumentException("the series model needs at least one sweep point");
        }
        double sw = 0, swr = 0, swo2 = 0, swox = 0;
        double[] weights = new double[points.size()];
        for (int i = 0; i < points.size(); i++) {
            ImpedancePoint p = points.get(i);
            double u = Math.max(p.componentUncertaintyOhm(), MIN_RELATIVE_UNCERTAINTY * p.impedanceOhm().abs());
            double w = 1 / (u * u);
            double omega = 2 * Math.PI * p.frequencyHz();
            weights[i] = w;
            sw += w;
            swr += w * p.resistanceOhm();
            swo2 += w * omega * omega;
            swox += w * omega * p.reactanceOhm();
        }
        double r = swr / sw;
        double l = swox / swo2;
        double chi2 = 0;
        for (int i = 0; i < points.size(); i++) {
            ImpedancePoint p = points.get(i);
            double omega = 2 * Math.PI * p.frequencyHz();
            double dr = p.resistanceOhm() - r;
            double dx = p.reactanceOhm() - omega * l;
            chi2 += weights[i] * (dr * dr + dx * dx);
        }
        int dof = 2 * points.size() - 2;
        double reduced = dof > 0 ? chi2 / dof : Double.NaN;
        double scale = dof > 0 && reduced > 1 ? Math.sqrt(reduced) : 1;
        return new SeriesModel(r, l, scale / Math.sqrt(sw), scale / Math.sqrt(swo2), reduced, points.size());
    }
}
