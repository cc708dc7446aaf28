package org.orthogon.analysis;

import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;

/**
 * The default simulations of the sup-Wald null ({@link SupWaldDistribution#DEFAULT_SEED},
 * {@link SupWaldDistribution#DEFAULT_DRAWS}, trimming 0.15, p = 1..{@link #LARGEST_P}) kept in the jar
 * as their sorted draws: a deterministic computation done once at release instead of at every run, as
 * printed tables of critical values are (Andrews 1993 has one). A stored table is bit for bit the
 * simulation it replaces, which the tests check by drawing it again; any other seed, draw count,
 * trimming or p is simulated at run time.
 *
 * <p>Regenerate after a change to the simulation, from the project root:
 * {@code java -cp target/classes:<commons-math3 jar> org.orthogon.analysis.SupWaldTables src/main/resources/org/orthogon/analysis}
 */
public final class SupWaldTables {
    /** The largest number of parameters with a stored table. */
    static final int LARGEST_P = 8;
    static final double TRIMMING = 0.15;

    private SupWaldTables() {
    }

    /** The stored draws for these arguments, when there is a table for them. */
    static Optional<SupWaldDistribution> stored(int parameters, double trimming, long seed, int draws) {
        if (seed != SupWaldDistribution.DEFAULT_SEED || draws != SupWaldDistribution.DEFAULT_DRAWS
                || trimming != TRIMMING || parameters < 1 || parameters > LARGEST_P) {
            return Optional.empty();
        }
        try (InputStream in = SupWaldTables.class.getResourceAsStream(fileName(parameters))) {
            if (in == null) {
                return Optional.empty();
            }
            DataInputStream data = new DataInputStream(new java.io.BufferedInputStream(in));
            double[] sorted = new double[draws];
            for (int i = 0; i < draws; i++) {
                sorted[i] = data.readDouble();
            }
            return Optional.of(new SupWaldDistribution(parameters, trimming, seed, draws, sorted));
        } catch (IOException e) {
            throw new UncheckedIOException("the stored sup-Wald table for p = " + parameters + " cannot be read", e);
        }
    }

    static String fileName(int parameters) {
        return "sup-wald-null-p" + parameters + ".bin";
    }

    /** Writes the tables for p = 1..{@link #LARGEST_P} into the folder given as the only argument. */
    public static void main(String[] args) throws IOException {
        Path folder = Path.of(args[0]);
        Files.createDirectories(folder);
        for (int p = 1; p <= LARGEST_P; p++) {
            SupWaldDistribution d = SupWaldDistribution.draw(p, TRIMMING, SupWaldDistribution.DEFAULT_SEED,
                    SupWaldDistribution.DEFAULT_DRAWS, ParallelRunner.defaultThreads());
            try (OutputStream out = Files.newOutputStream(folder.resolve(fileName(p)));
                 DataOutputStream data = new DataOutputStream(new java.io.BufferedOutputStream(out))) {
                for (double value : d.sorted()) {
                    data.writeDouble(value);
                }
            }
        }
    }
}
