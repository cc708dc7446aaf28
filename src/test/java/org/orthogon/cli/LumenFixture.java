package org.orthogon.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.TreeMap;

/**
 * A small Isle of Lumen data set and three model files over it, written into a folder: three tide
 * portfolios and three factors over 60 months, a monthly risk-free rate and 20 quarters of
 * consumption growth. Small on purpose, so one check of it costs about a millisecond and thousands of
 * mutated copies fit in the test suite; the numbers are drawn from a fixed seed so every copy is alike.
 */
final class LumenFixture {
    static final String RETURNS = "data/tides-monthly.csv";
    static final String RISKFREE = "data/riskfree-monthly.csv";
    static final String FACTORS = "data/factors-monthly.csv";
    static final String CONSUMPTION = "data/consumption-quarterly.csv";
    static final String LINEAR = "models/tide-factors.toml";
    static final String POWER = "models/tide-power.toml";
    static final String EXPRESSION = "models/tide-expression.toml";

    /** The [data] section of both consumption models, and the [model] header after it. */
    private static final String CONSUMPTION_DATA = """

            [data]
            returns = "../data/tides-monthly.csv"
            returns_kind = "net"
            units = "decimal"
            macro = "../data/consumption-quarterly.csv"

            [model]
            """;

    private LumenFixture() {
    }

    /** The file name (relative to the folder) -> its text. */
    static Map<String, String> files() {
        Random random = new Random(20240611L);
        StringBuilder returns = new StringBuilder("date,TIDE_LO,TIDE_MID,TIDE_HI\n");
        StringBuilder riskfree = new StringBuilder("date,RF\n");
        StringBuilder factors = new StringBuilder("date,MKT,SIZE,TIDE\n");
        StringBuilder consumption = new StringBuilder("date,cons_growth\n");
        double quarterShock = 0;
        for (int month = 0; month < 60; month++) {
            String date = String.format(Locale.ROOT, "%d-%02d", 1970 + month / 12, month % 12 + 1);
            if (month % 3 == 0) {
                quarterShock = random.nextGaussian();
                consumption.append(String.format(Locale.ROOT, "%dQ%d,%.6f%n", 1970 + month / 12, month % 12 / 3 + 1,
                        Math.exp(0.005 + 0.01 * quarterShock)));
            }
            double market = 0.006 + 0.04 * random.nextGaussian() + 0.01 * quarterShock;
            double size = 0.002 + 0.02 * random.nextGaussian();
            double tide = 0.004 + 0.025 * random.nextGaussian();
            factors.append(String.format(Locale.ROOT, "%s,%.6f,%.6f,%.6f%n", date, market, size, tide));
            riskfree.append(String.format(Locale.ROOT, "%s,%.6f%n", date, 0.003));
            returns.append(date);
            for (int asset = 0; asset < 3; asset++) {
                double r = 0.003 + (0.8 + 0.2 * asset) * market + (0.5 - 0.4 * asset) * size + 0.3 * asset * tide
                        + 0.015 * random.nextGaussian();
                returns.append(String.format(Locale.ROOT, ",%.6f", r));
            }
            returns.append('\n');
        }
        Map<String, String> files = new TreeMap<>();
        files.put(RETURNS, returns.toString());
        files.put(RISKFREE, riskfree.toString());
        files.put(FACTORS, factors.toString());
        files.put(CONSUMPTION, consumption.toString());
        files.put(LINEAR, """
                title = "Lumen tide factors"

                [data]
                returns = "../data/tides-monthly.csv"
                returns_kind = "net"
                units = "decimal"
                riskfree = "../data/riskfree-monthly.csv"
                riskfree_column = "RF"
                factors = "../data/factors-monthly.csv"

                [model]
                family = "linear-factor"
                factor_columns = ["MKT", "SIZE"]

                [estimation]
                method = "two-step"
                kernel = "bartlett"
                lags = 2
                """);
        files.put(POWER, "title = \"Lumen tide power utility\"\n" + CONSUMPTION_DATA + """
                family = "power-utility"
                consumption_column = "cons_growth"
                start_values = { beta = 0.99, gamma = 2.0 }

                [estimation]
                method = "two-step"
                kernel = "bartlett"
                lags = 1
                """);
        files.put(EXPRESSION, "title = \"Lumen tide expression SDF\"\n" + CONSUMPTION_DATA + """
                family = "expression"
                sdf = "beta * cons_growth^(-gamma)"
                parameters = ["beta", "gamma"]
                payoff = "gross"
                start_values = { beta = 0.99, gamma = 2.0 }

                [estimation]
                method = "one-step"
                kernel = "none"
                """);
        return files;
    }

    /** Writes every file under {@code root}; returns the same map for restoring files later. */
    static Map<String, String> writeTo(Path root) throws IOException {
        Map<String, String> files = files();
        for (Map.Entry<String, String> file : files.entrySet()) {
            Path path = root.resolve(file.getKey());
            Files.createDirectories(path.getParent());
            Files.writeString(path, file.getValue());
        }
        return files;
    }
}
