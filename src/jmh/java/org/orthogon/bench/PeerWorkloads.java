package org.orthogon.bench;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.random.MersenneTwister;
import org.orthogon.data.CsvSeries;
import org.orthogon.data.Period;
import org.orthogon.data.SeriesTable;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;

/**
 * The synthetic data of the peer comparison (bench/compare.py and {@link PeerWorkloadBenchmark}), drawn
 * in the Isle of Lumen setting: the Lumen factors MKT, SIZE and TIDE from {@link LumenSimulator}, and a
 * finer size/tide sort of test portfolios whose loadings interpolate the twelve Lumen portfolios'
 * (S size groups by S tide groups, so N = S²), with their idiosyncratic noise. Excess returns have no
 * alpha, so the linear SDF m = 1 - b'F prices them in population. Values are rounded to 6 decimals, as
 * return files are, so the CSV and an in-memory copy hold the same numbers. Seeded: the same arguments
 * always give the same files.
 *
 * <p>{@code java -cp target/benchmarks.jar org.orthogon.bench.PeerWorkloads DIR} writes into DIR:
 * <ul>
 *   <li>{@code supwald-returns.csv}, {@code supwald-factors.csv}, {@code supwald.toml}: N = 25, T = 600
 *       months (1962-2011), two-step GMM, Bartlett kernel with the Newey-West (1994) bandwidth;</li>
 *   <li>{@code fit-returns.csv}, {@code fit-factors.csv}, {@code fit.toml}: N = 100, T = 1200 months
 *       (1900-1999), two-step GMM, Bartlett with 4 lags.</li>
 * </ul>
 */
public final class PeerWorkloads {
    /** Seed of the sup-Wald and rolling-window workload. */
    public static final long SUP_WALD_SEED = 20250601L;
    /** Seed of the single-fit workload. */
    public static final long FIT_SEED = 20250602L;

    private PeerWorkloads() {
    }

    public static void main(String[] args) {
        if (args.length != 1) {
            System.err.println("usage: PeerWorkloads DIR");
            System.exit(2);
        }
        Path dir = Path.of(args[0]);
        write(dir, "supwald", 5, 1962, 50, SUP_WALD_SEED, "bandwidth = \"newey-west\"");
        write(dir, "fit", 10, 1900, 100, FIT_SEED, "lags = 4");
    }

    /** The excess returns and factors of one workload, [t][i] and [t][k], with the month labels. */
    public record Workload(List<String> months, List<String> assets, double[][] excessReturns, double[][] factors) {
    }

    /**
     * Draws a workload: {@code groups} x {@code groups} portfolios over {@code years} years from January of
     * {@code firstYear}.
     */
    public static Workload draw(int groups, int firstYear, int years, long seed) {
        LumenEconomy economy = LumenEconomy.standard();
        LumenSimulator.LumenSample sample = LumenSimulator.simulate(economy, firstYear, years, seed);
        MersenneTwister noise = new MersenneTwister(seed + 1);
        int months = sample.months().size();
        int n = groups * groups;
        double[][] loadings = new double[n][];
        double[] volatility = new double[n];
        List<String> names = new ArrayList<>(n);
        for (int size = 0; size < groups; size++) {
            for (int tide = 0; tide < groups; tide++) {
                // position of this group on the Lumen grid of 3 size and 4 tide groups
                double s = 2.0 * size / (groups - 1);
                double x = 3.0 * tide / (groups - 1);
                int i = size * groups + tide;
                loadings[i] = new double[] {
                    interpolate(new double[] {1.20, 1.15, 1.10, 1.05}, x) - 0.10 * s,
                    interpolate(new double[] {0.90, 0.40, -0.25}, s),
                    interpolate(new double[] {-0.50, 0.00, 0.50, 1.00}, x)};
                volatility[i] = interpolate(new double[] {0.020, 0.016, 0.012}, s);
                names.add(String.format("S%02dT%02d", size + 1, tide + 1));
            }
        }
        double[][] excess = new double[months][n];
        double[][] factors = new double[months][];
        for (int t = 0; t < months; t++) {
            double[] f = sample.factors()[t];
            factors[t] = new double[] {round(f[0]), round(f[1]), round(f[2])};
            for (int i = 0; i < n; i++) {
                double value = volatility[i] * noise.nextGaussian();
                for (int k = 0; k < 3; k++) {
                    value += loadings[i][k] * f[k];
                }
                excess[t][i] = round(value);
            }
        }
        return new Workload(sample.months(), List.copyOf(names), excess, factors);
    }

    /** Writes the returns, factors and model file of one workload; returns the model file. */
    public static Path write(Path dir, String name, int groups, int firstYear, int years, long seed,
            String bandwidthLine) {
        Workload w = draw(groups, firstYear, years, seed);
        List<Period> dates = w.months().stream().map(Period::parse).toList();
        writeTable(dir.resolve(name + "-returns.csv"), dates, w.assets(), w.excessReturns());
        writeTable(dir.resolve(name + "-factors.csv"), dates, List.of("MKT", "SIZE", "TIDE"), w.factors());
        String model = "# Peer comparison workload (bench/compare.py): " + w.assets().size() + " Lumen size/tide "
                + "portfolios, " + w.months().size() + " months, seed " + seed + "\n"
                + "title = \"Linear SDF on " + w.assets().size() + " Lumen portfolios (peer workload)\"\n\n"
                + "[data]\n"
                + "returns = \"" + name + "-returns.csv\"\n"
                + "returns_kind = \"excess\"\n"
                + "units = \"decimal\"\n"
                + "factors = \"" + name + "-factors.csv\"\n\n"
                + "[model]\n"
                + "family = \"linear-factor\"\n"
                + "factor_columns = [\"MKT\", \"SIZE\", \"TIDE\"]\n\n"
                + "[estimation]\n"
                + "method = \"two-step\"\n"
                + "kernel = \"bartlett\"\n"
                + bandwidthLine + "\n";
        Path file = dir.resolve(name + ".toml");
        try {
            Files.createDirectories(dir);
            Files.writeString(file, model);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return file;
    }

    private static void writeTable(Path file, List<Period> dates, List<String> columns, double[][] rows) {
        double[][] byColumn = new double[columns.size()][rows.length];
        int[] lines = new int[rows.length];
        for (int t = 0; t < rows.length; t++) {
            lines[t] = t + 2;
            for (int j = 0; j < columns.size(); j++) {
                byColumn[j][t] = rows[t][j];
            }
        }
        CsvSeries.write(new SeriesTable(file, dates.get(0).frequency(), dates, columns, byColumn, lines), file);
    }

    /** Linear interpolation of values at 0, 1, 2, ... at the point x. */
    private static double interpolate(double[] values, double x) {
        int i = Math.min((int) Math.floor(x), values.length - 2);
        double w = x - i;
        return values[i] * (1 - w) + values[i + 1] * w;
    }

    private static double round(double value) {
        return Math.round(value * 1e6) / 1e6;
    }
}
