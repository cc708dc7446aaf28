package org.orthogon.longrun;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.ejml.data.DMatrixRMaj;

/**
 * Reads the committed output of src/test/resources/reference/longrun_reference.R (R package
 * sandwich, Debian r-cran-sandwich). Plain comma splitting: the script writes no quotes.
 */
final class ReferenceData {

    /** One S matrix computed by sandwich, with the choices that produced it. */
    record Case(String name, Kernel kernel, String rule, double bandwidth, boolean centered, boolean prewhite,
            DMatrixRMaj s) {
        @Override
        public String toString() {
            return name;
        }
    }

    /** One bandwidth chosen by sandwich's Andrews (1991) or Newey-West (1994) rule. */
    record Bandwidth(String rule, Kernel kernel, boolean centered, boolean prewhite, double value) {
        @Override
        public String toString() {
            return rule + "-" + kernel.id() + (centered ? "-centered" : "-uncentered") + (prewhite ? "-pw" : "");
        }
    }

    private ReferenceData() {}

    static List<String[]> rows(String resource) {
        try (InputStream in = ReferenceData.class.getResourceAsStream("/reference/" + resource)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource /reference/" + resource);
            }
            String[] lines = new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\r?\n");
            List<String[]> out = new ArrayList<>();
            for (int i = 1; i < lines.length; i++) {
                if (!lines[i].isBlank()) {
                    out.add(lines[i].split(","));
                }
            }
            return out;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The T = 120, K = 3 series the R script wrote (its first column is the time index). */
    static DMatrixRMaj series() {
        List<String[]> rows = rows("longrun_series.csv");
        DMatrixRMaj f = new DMatrixRMaj(rows.size(), rows.get(0).length - 1);
        for (int r = 0; r < rows.size(); r++) {
            for (int c = 1; c < rows.get(r).length; c++) {
                f.set(r, c - 1, Double.parseDouble(rows.get(r)[c]));
            }
        }
        return f;
    }

    static List<Case> cases() {
        Map<String, List<String[]>> byCase = new LinkedHashMap<>();
        for (String[] row : rows("longrun_reference.csv")) {
            byCase.computeIfAbsent(row[0], k -> new ArrayList<>()).add(row);
        }
        List<Case> out = new ArrayList<>();
        for (var e : byCase.entrySet()) {
            String[] first = e.getValue().get(0);
            int k = (int) Math.round(Math.sqrt(e.getValue().size()));
            DMatrixRMaj s = new DMatrixRMaj(k, k);
            for (String[] row : e.getValue()) {
                s.set(Integer.parseInt(row[6]), Integer.parseInt(row[7]), Double.parseDouble(row[8]));
            }
            out.add(new Case(e.getKey(), Kernel.fromId(first[1]), first[2], Double.parseDouble(first[3]),
                    Boolean.parseBoolean(first[4].toLowerCase()), Boolean.parseBoolean(first[5].toLowerCase()), s));
        }
        return out;
    }

    static Case find(String name) {
        return cases().stream().filter(c -> c.name().equals(name)).findFirst()
                .orElseThrow(() -> new IllegalStateException("no reference case " + name));
    }

    static List<Bandwidth> bandwidths() {
        List<Bandwidth> out = new ArrayList<>();
        for (String[] row : rows("longrun_bandwidths.csv")) {
            out.add(new Bandwidth(row[0], Kernel.fromId(row[1]), Boolean.parseBoolean(row[2].toLowerCase()),
                    Boolean.parseBoolean(row[3].toLowerCase()), Double.parseDouble(row[4])));
        }
        return out;
    }

    /** max |a - b| ≤ tol · max |b|: relative to the matrix scale, so near-zero entries do not blow up. */
    static double relativeError(DMatrixRMaj actual, DMatrixRMaj expected) {
        double scale = 0.0;
        double diff = 0.0;
        for (int i = 0; i < expected.getNumElements(); i++) {
            scale = Math.max(scale, Math.abs(expected.data[i]));
            diff = Math.max(diff, Math.abs(actual.data[i] - expected.data[i]));
        }
        return diff / scale;
    }
}
