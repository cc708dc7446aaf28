package org.orthogon.demo;

import java.io.IOException;
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
    private static final double ROUNDING = 1e6;

    private DemoData() {
    }

    /**
     * Writes the four files into {@code folder} (created if missing). Each file is written completely
     * to a temporary name and then moved into place, so an interrupted run leaves no half file.
     */
    public static List<Path> write(LumenEconomy economy, LumenSimulator.LumenSample sample, Path folder) {
        try {
            Files.createDirectories(folder);
        } catch (IOException e) {
            throw InputException.in(folder).problem("cannot create the output folder (" + e.getMessage() + ")",
                    "choose a folder you can write to");
        }
        if (!Files.isDirectory(folder)) {
            throw InputException.in(folder).problem("this is a file, not a folder", "give a folder for --out");
        }
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

    private static Path writeTable(Path folder, String name, List<Period> dates, List<String> columns,
            double[][] values) {
        double[][] rounded = new double[values.length][];
        for (int j = 0; j < values.length; j++) {
            rounded[j] = new double[values[j].length];
            for (int t = 0; t < values[j].length; t++) {
                rounded[j][t] = Math.round(values[j][t] * ROUNDING) / ROUNDING;
            }
        }
        Path target = folder.resolve(name);
        Path temporary = folder.resolve("." + name + ".part");
        int[] lines = new int[dates.size()];
        for (int t = 0; t < lines.length; t++) {
            lines[t] = t + 2;
        }
        CsvSeries.write(new SeriesTable(target, dates.get(0).frequency(), dates, columns, rounded, lines), temporary);
        try {
            Files.move(temporary, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            throw InputException.in(target).problem("cannot move the finished file into place (" + e.getMessage()
                    + ")", "check that the folder is writable");
        }
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
