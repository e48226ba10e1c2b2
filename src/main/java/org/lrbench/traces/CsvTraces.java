package org.lrbench.traces;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.regex.Pattern;

/**
 * Two-channel traces from a plain text file, as any scope or simulator can write them: a header
 * line naming the columns, then one sample per line with time (s), the sense-resistor voltage (V)
 * and the part's voltage (V). The separator is taken from the first data line: a semicolon or a tab
 * (then a decimal comma is read as a decimal point, as many scopes write in such locales), else a
 * comma, else blanks. Sampling must be uniform. A file that is not gives an error naming the line.
 */
public record CsvTraces(String file, double intervalSecond, double[] sense, double[] part) {

    public static CsvTraces read(Path file) throws IOException {
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        int first = -1;
        for (int i = 0; i < lines.size(); i++) {
            if (!lines.get(i).isBlank()) {
                first = i;
                break;
            }
        }
        if (first < 0) {
            throw new IllegalArgumentException(file + ": empty file");
        }
        String head = lines.get(first);
        // the separator from the first data line (a header may hold commas in its names, as v(n1,n2))
        String data = lines.stream().skip(first + 1).filter(l -> !l.isBlank()).findFirst().orElse(head);
        String separator = data.contains(";") ? ";" : data.contains("\t") ? "\t" : data.contains(",") ? "," : "\\s+";
        boolean decimalComma = separator.equals(";") || separator.equals("\t");
        String[] header = split(head, separator);
        if (header.length < 3 || isNumber(header[0])) {
            throw new IllegalArgumentException(file + ":" + (first + 1) + ":1: expected a header naming the columns"
                    + " time (s), sense-resistor voltage (V), part voltage (V)");
        }
        int n = 0;
        double[] t = new double[lines.size()];
        double[] a = new double[lines.size()];
        double[] b = new double[lines.size()];
        for (int i = first + 1; i < lines.size(); i++) {
            if (lines.get(i).isBlank()) {
                continue;
            }
            String[] f = split(lines.get(i), separator);
            if (f.length < 3) {
                throw new IllegalArgumentException(file + ":" + (i + 1) + ":1: expected 3 numbers, found " + f.length);
            }
            try {
                t[n] = number(f[0], decimalComma);
                a[n] = number(f[1], decimalComma);
                b[n] = number(f[2], decimalComma);
            } catch (NumberFormatException e) {
                throw new IllegalArgumentException(file + ":" + (i + 1) + ":1: not a number: " + e.getMessage());
            }
            n++;
        }
        if (n < 16) {
            throw new IllegalArgumentException(file + ": only " + n + " samples; at least 16 are needed");
        }
        double dt = (t[n - 1] - t[0]) / (n - 1);
        for (int i = 1; i < n; i++) {
            if (Math.abs(t[i] - t[i - 1] - dt) > 1e-3 * dt) {
                throw new IllegalArgumentException(file + ": sample " + (i + 1) + " breaks the uniform interval of "
                        + dt + " s (resample the data, or ask the simulator to interpolate)");
            }
        }
        return new CsvTraces(file.toString(), dt, Arrays.copyOf(a, n), Arrays.copyOf(b, n));
    }

    private static String[] split(String line, String separator) {
        String[] parts = line.trim().split(separator.equals("\\s+") ? "\\s+" : "\\s*" + Pattern.quote(separator) + "\\s*");
        return parts;
    }

    private static double number(String field, boolean decimalComma) {
        String f = field.trim();
        return Double.parseDouble(decimalComma ? f.replace(',', '.') : f);
    }

    private static boolean isNumber(String s) {
        try {
            Double.parseDouble(s);
            return true;
        } catch (NumberFormatException e) {
            return false;
        }
    }
}
