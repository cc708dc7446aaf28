package org.orthogon.demo;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import org.orthogon.data.CsvSeries;
import org.orthogon.data.InputException;
import org.orthogon.data.Period;
import org.orthogon.data.SeriesTable;

/**
 * Writes a simulated Lumen sample as the CSV files of demo-data/. Values are rounded to six decimals,
 * the precision of a typical published return file; the rounding error (at most 5e-7 per month) is far
 * below sampling error, so the documented truths still hold for the written data.
 */
public final class DemoData {
    public static final String PORTFOLIOS = "lumen-portfolios-monthly.csv";
    public static final String RISKFREE = "lumen-riskfree-monthly.csv";
    public static final String FACTORS = "lumen-factors-monthly.csv";
    public static final String CONSUMPTION = "lumen-consumption-quarterly.csv";
    /** Every file {@link #write} produces, in the order it writes them. */
    public static final List<String> FILES = List.of(PORTFOLIOS, RISKFREE, FACTORS, CONSUMPTION);
    public static final String WEALTH = "lumen-wealth-quarterly.csv";
    public static final String MACRO_LEVELS = "lumen-macro-levels-quarterly.csv";
    public static final String DEFLATOR_SERIES = "lumen-deflator-series.csv";
    public static final String PORTFOLIO_SECTIONS = "lumen-portfolios-sections.txt";
    /**
     * Instruments known at the end of each quarter: that quarter's consumption growth and wealth return.
     * The draws are independent over time, so any such instrument is valid: E[e_{t+1} z_t] = 0.
     */
    public static final String INSTRUMENTS = "lumen-instruments-quarterly.csv";
    /**
     * Every file {@link #writeExtensions} produces: the series the recursive-utility family and the
     * importers need, added after the first four files were published, which stay unchanged.
     */
    public static final List<String> EXTENSION_FILES = List.of(WEALTH, MACRO_LEVELS, DEFLATOR_SERIES,
            PORTFOLIO_SECTIONS, INSTRUMENTS);
    /** Every file `simulate` writes: the core files and the extensions. */
    public static final List<String> ALL_FILES = java.util.stream.Stream.concat(FILES.stream(), EXTENSION_FILES.stream())
            .toList();
    private static final double ROUNDING = 1e6;

    private DemoData() {
    }

    /**
     * Writes the four files into {@code folder} (created if missing). Each file is written completely
     * to a temporary name and then moved into place, so an interrupted run leaves no half file.
     */
    public static List<Path> write(LumenEconomy economy, LumenSimulator.LumenSample sample, Path folder) {
        prepare(folder);
        List<Period> months = sample.months().stream().map(Period::parse).toList();
        List<Period> quarters = sample.quarters().stream().map(Period::parse).toList();
        List<Path> written = new ArrayList<>();
        written.add(writeTable(folder, PORTFOLIOS, months, economy.portfolioNames(),
                transpose(sample.portfolioReturns())));
        written.add(writeTable(folder, RISKFREE, months, List.of("RF"), new double[][] {sample.riskfree()}));
        written.add(writeTable(folder, FACTORS, months, economy.factorNames(), transpose(sample.factors())));
        written.add(writeTable(folder, CONSUMPTION, quarters, List.of("cons_growth"),
                new double[][] {sample.consumptionGrowth()}));
        return written;
    }

    /**
     * Writes {@link #EXTENSION_FILES} into {@code folder}: the quarterly wealth-proxy returns (real and
     * nominal), nominal consumption, population and the price level ({@link LumenMacro}), the price level
     * again as a two-column series file with the not yet published next quarter written ".", and the
     * monthly portfolio returns as a multi-section text file in percent with a monthly and an annual
     * table (see {@link org.orthogon.data.SectionedTables}).
     *
     * @param seed the seed the sample was drawn with; the nominal series use {@code seed + 1}
     */
    public static List<Path> writeExtensions(LumenEconomy economy, LumenSimulator.LumenSample sample, long seed,
            Path folder) {
        prepare(folder);
        LumenMacro macro = LumenMacro.of(sample, seed);
        List<Period> quarters = macro.quarters().stream().map(Period::parse).toList();
        List<Period> levelQuarters = macro.levelQuarters().stream().map(Period::parse).toList();
        List<Path> written = new ArrayList<>();
        written.add(writeTable(folder, WEALTH, quarters, List.of("wealth_return", "wealth_nominal"),
                new double[][] {macro.realWealth(), macro.nominalWealth()}));
        written.add(writeTable(folder, MACRO_LEVELS, levelQuarters, List.of("cons_nominal", "population", "deflator"),
                new double[][] {macro.nominalConsumption(), macro.population(), macro.deflator()}));
        StringBuilder series = new StringBuilder("date,deflator\n");
        for (int q = 0; q < levelQuarters.size(); q++) {
            series.append(levelQuarters.get(q).label()).append(',').append(CsvSeries.formatNumber(round(macro.deflator()[q])))
                    .append('\n');
        }
        series.append(levelQuarters.get(levelQuarters.size() - 1).plus(1).label()).append(",.\n");
        written.add(writeText(folder, DEFLATOR_SERIES, series.toString()));
        written.add(writeText(folder, PORTFOLIO_SECTIONS, sections(economy, sample)));
        written.add(writeTable(folder, INSTRUMENTS, quarters, List.of("z_cons", "z_wealth"),
                new double[][] {sample.consumptionGrowth(), macro.realWealth()}));
        return written;
    }

    private static String sections(LumenEconomy economy, LumenSimulator.LumenSample sample) {
        List<String> names = economy.portfolioNames();
        StringBuilder out = new StringBuilder();
        out.append("Lumen Exchange research desk: size/tide portfolio returns (simulated demo data).\n")
                .append("Firms are sorted into 3 size groups (S1 small .. S3 large) and 4 tide-exposure groups\n")
                .append("(T1 low .. T4 high). Returns are real, in percent. Missing values would be -99.99.\n\n")
                .append("Lumen size/tide portfolios, value-weighted monthly returns\n");
        header(out, names);
        double[][] r = sample.portfolioReturns();
        for (int m = 0; m < r.length; m++) {
            out.append(sample.months().get(m).replace("-", ""));
            for (int i = 0; i < names.size(); i++) {
                out.append(String.format("%12s", CsvSeries.formatNumber(Math.round(r[m][i] * ROUNDING) / 1e4)));
            }
            out.append('\n');
        }
        out.append("\nLumen size/tide portfolios, value-weighted annual returns\n");
        header(out, names);
        for (int y = 0; y < r.length / 12; y++) {
            out.append(String.format("%-6s", sample.months().get(12 * y).substring(0, 4)));
            for (int i = 0; i < names.size(); i++) {
                double gross = 1.0;
                for (int m = 12 * y; m < 12 * y + 12; m++) {
                    gross *= 1.0 + r[m][i];
                }
                out.append(String.format("%12s", CsvSeries.formatNumber(Math.round((gross - 1.0) * ROUNDING) / 1e4)));
            }
            out.append('\n');
        }
        return out.toString();
    }

    private static void header(StringBuilder out, List<String> names) {
        out.append("      ");
        for (String name : names) {
            out.append(String.format("%12s", name));
        }
        out.append('\n');
    }

    private static double round(double value) {
        return Math.round(value * ROUNDING) / ROUNDING;
    }

    private static Path writeText(Path folder, String name, String text) {
        Path target = folder.resolve(name);
        Path temporary = folder.resolve("." + name + ".part");
        try {
            Files.writeString(temporary, text, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw InputException.in(target).problem("cannot write the file (" + e.getMessage() + ")",
                    "check that the folder is writable");
        }
        moveIntoPlace(temporary, target);
        return target;
    }

    private static void prepare(Path folder) {
        try {
            Files.createDirectories(folder);
        } catch (IOException e) {
            throw InputException.in(folder).problem("cannot create the output folder (" + e.getMessage() + ")",
                    "choose a folder you can write to");
        }
        if (!Files.isDirectory(folder)) {
            throw InputException.in(folder).problem("this is a file, not a folder", "give a folder for --out");
        }
    }

    private static void moveIntoPlace(Path temporary, Path target) {
        try {
            Files.move(temporary, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            throw InputException.in(target).problem("cannot move the finished file into place (" + e.getMessage()
                    + ")", "check that the folder is writable");
        }
    }

    private static Path writeTable(Path folder, String name, List<Period> dates, List<String> columns,
            double[][] values) {
        double[][] rounded = new double[values.length][];
        for (int j = 0; j < values.length; j++) {
            rounded[j] = new double[values[j].length];
            for (int t = 0; t < values[j].length; t++) {
                rounded[j][t] = round(values[j][t]);
            }
        }
        Path target = folder.resolve(name);
        Path temporary = folder.resolve("." + name + ".part");
        int[] lines = new int[dates.size()];
        for (int t = 0; t < lines.length; t++) {
            lines[t] = t + 2;
        }
        CsvSeries.write(new SeriesTable(target, dates.get(0).frequency(), dates, columns, rounded, lines), temporary);
        moveIntoPlace(temporary, target);
        return target;
    }

    private static double[][] transpose(double[][] rows) {
        int columns = rows[0].length;
        double[][] out = new double[columns][rows.length];
        for (int t = 0; t < rows.length; t++) {
            for (int j = 0; j < columns; j++) {
                out[j][t] = rows[t][j];
            }
        }
        return out;
    }
}
