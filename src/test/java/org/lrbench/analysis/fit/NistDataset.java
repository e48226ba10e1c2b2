package org.lrbench.analysis.fit;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;

/**
 * A NIST StRD nonlinear regression dataset (https://www.itl.nist.gov/div898/strd/), read from the
 * copy that Apache Commons Math ships in its test jar: starting values, certified parameters and
 * certified standard deviations, and the observations.
 */
record NistDataset(String name, double[][] starts, double[] certified, double[] certifiedSd, double[] x, double[] y) {

    static NistDataset load(String name) throws IOException {
        String resource = "org/apache/commons/math3/fitting/leastsquares/" + name + ".dat";
        String text;
        try (InputStream in = NistDataset.class.getClassLoader().getResourceAsStream(resource)) {
            if (in == null) {
                throw new IOException("no " + resource + " on the test class path (commons-math3 tests jar)");
            }
            text = new String(in.readAllBytes(), StandardCharsets.US_ASCII);
        }
        List<double[]> params = new ArrayList<>();
        List<double[]> data = new ArrayList<>();
        boolean inData = false;
        for (String line : text.split("\\R")) {
            String t = line.trim();
            if (t.matches("b\\d+\\s*=.*")) {
                String[] f = t.substring(t.indexOf('=') + 1).trim().split("\\s+");
                params.add(new double[] {Double.parseDouble(f[0]), Double.parseDouble(f[1]), Double.parseDouble(f[2]),
                        Double.parseDouble(f[3])});
            } else if (t.matches("Data:\\s+y\\s+x")) {
                inData = true;
            } else if (inData && !t.isEmpty()) {
                String[] f = t.split("\\s+");
                data.add(new double[] {Double.parseDouble(f[0]), Double.parseDouble(f[1])});
            }
        }
        int p = params.size();
        double[][] starts = new double[2][p];
        double[] cert = new double[p];
        double[] sd = new double[p];
        for (int i = 0; i < p; i++) {
            starts[0][i] = params.get(i)[0];
            starts[1][i] = params.get(i)[1];
            cert[i] = params.get(i)[2];
            sd[i] = params.get(i)[3];
        }
        double[] x = new double[data.size()];
        double[] y = new double[data.size()];
        for (int i = 0; i < data.size(); i++) {
            y[i] = data.get(i)[0];
            x[i] = data.get(i)[1];
        }
        return new NistDataset(name, starts, cert, sd, x, y);
    }
}
