package org.orthogon.data;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Transforms that change what a series measures or when it is dated: nominal to real returns,
 * consumption levels to per-capita growth, and lags and leads. Each one that needs a neighbouring
 * period loses rows at an edge of the sample; those rows are dropped and named in the result's notes,
 * never inside the sample.
 */
public final class SeriesTransforms {
    private SeriesTransforms() {
    }

    /**
     * Real gross returns from nominal gross returns and a price deflator:
     * R^real_t = R^nominal_t P_{t-1} / P_t, the Fisher relation for gross returns (Fisher 1930, "The
     * Theory of Interest"; cited from memory). A return dated t is deflated with the deflator of the
     * period that return ends in and of the period before it; return rows whose P_{t-1} or P_t the
     * deflator file does not cover lie at the edges and are dropped.
     *
     * @param nominalGross    decimal gross returns
     * @param deflators       a table holding the deflator column, at the same frequency
     * @param deflatorColumn  the deflator's column name, a price level (any base year)
     * @throws InputException if the frequencies differ, the returns do not look gross, a deflator value
     *                        is not positive, or no return row is covered
     */
    public static TableWithNotes realReturns(SeriesTable nominalGross, SeriesTable deflators, String deflatorColumn) {
        if (nominalGross.frequency() != deflators.frequency()) {
            throw InputException.in(deflators.source()).problem(
                    "the deflator is " + deflators.frequency().id() + " but the returns in " + nominalGross.source()
                            + " are " + nominalGross.frequency().id(),
                    "give a deflator at the returns' frequency, or compound the returns to the deflator's frequency first");
        }
        ReturnTransforms.requireGross(nominalGross);
        double[] level = positive(deflators, deflatorColumn, "price deflator");
        Map<Period, Integer> row = rowIndex(deflators);
        List<Integer> kept = new ArrayList<>();
        List<Double> ratios = new ArrayList<>();
        for (int t = 0; t < nominalGross.rows(); t++) {
            Period date = nominalGross.dates().get(t);
            Integer now = row.get(date);
            Integer before = row.get(date.plus(-1));
            if (now != null && before != null) {
                kept.add(t);
                ratios.add(level[before] / level[now]);
            }
        }
        if (kept.isEmpty()) {
            throw InputException.in(deflators.source()).column(deflatorColumn).problem(
                    "the deflator covers none of the return periods with the period before them (returns "
                            + span(nominalGross) + ", deflator " + span(deflators) + ")",
                    "give a deflator that starts one period before the first return");
        }
        SeriesTable covered = nominalGross.rowsAt(kept);
        double[][] real = covered.columns();
        for (double[] column : real) {
            for (int t = 0; t < column.length; t++) {
                column[t] *= ratios.get(t);
            }
        }
        return withDroppedEdges(nominalGross, kept, covered.withColumns(real),
                "no deflator for the period itself or the one before it");
    }

    /**
     * Gross growth of real per-capita consumption from levels:
     * g_t = (C_t / (N_t P_t)) / (C_{t-1} / (N_{t-1} P_{t-1})), with N population and P a price deflator,
     * each optional (common practice, no source). The first row has no predecessor and is dropped; the
     * growth of period t sits on the row of t, as the Euler-equation families expect.
     *
     * @param levels            a table with the consumption level and, optionally, population and deflator
     * @param consumptionColumn aggregate (or already per-capita) consumption, positive
     * @param populationOrNull  population, positive, or null when consumption is already per capita
     * @param deflatorOrNull    a price level, or null when consumption is already real
     * @param outputName        the name of the resulting column, e.g. "cons_growth"
     * @throws InputException if a column is missing or holds a value that is not positive, or the table
     *                        has fewer than two rows
     */
    public static TableWithNotes perCapitaGrowth(SeriesTable levels, String consumptionColumn, String populationOrNull,
            String deflatorOrNull, String outputName) {
        double[] c = positive(levels, consumptionColumn, "consumption level");
        double[] n = populationOrNull == null ? null : positive(levels, populationOrNull, "population");
        double[] p = deflatorOrNull == null ? null : positive(levels, deflatorOrNull, "price deflator");
        if (levels.rows() < 2) {
            throw InputException.in(levels.source()).problem("growth needs at least two periods of levels, the file has "
                    + levels.rows(), "give a longer series of levels");
        }
        int rows = levels.rows();
        double[] perCapita = new double[rows];
        for (int t = 0; t < rows; t++) {
            perCapita[t] = c[t] / (n == null ? 1.0 : n[t]) / (p == null ? 1.0 : p[t]);
        }
        List<Integer> kept = new ArrayList<>();
        double[] growth = new double[rows - 1];
        for (int t = 1; t < rows; t++) {
            kept.add(t);
            growth[t - 1] = perCapita[t] / perCapita[t - 1];
        }
        SeriesTable shape = levels.rowsAt(kept);
        SeriesTable result = new SeriesTable(levels.source(), levels.frequency(), shape.dates(), List.of(outputName),
                new double[][] {growth}, shape.lineNumbers());
        return withDroppedEdges(levels, kept, result, "growth needs the level of the period before");
    }

    /**
     * The series shifted by {@code k} periods: for k &gt; 0 a lag, the row dated t holds the value of
     * t - k; for k &lt; 0 a lead, the value of t + |k|. Rows whose source period lies outside the table
     * (the first k rows of a lag, the last |k| of a lead) are dropped and reported. Each row keeps the
     * file line of the value it holds, so later messages point at the cell that was read. Column names
     * are kept.
     *
     * @throws InputException if |k| is not smaller than the number of rows
     */
    public static TableWithNotes shift(SeriesTable table, int k) {
        if (k == 0) {
            return new TableWithNotes(table, List.of(), List.of());
        }
        int rows = table.rows();
        if (Math.abs(k) >= rows) {
            throw InputException.in(table.source()).problem(
                    "a " + (k > 0 ? "lag" : "lead") + " of " + Math.abs(k) + " periods leaves no row of the " + rows
                            + " in the file", "use a shorter lag or lead, or a longer series");
        }
        List<Integer> source = new ArrayList<>();
        List<Integer> target = new ArrayList<>();
        for (int t = Math.max(0, k); t < Math.min(rows, rows + k); t++) {
            target.add(t);
            source.add(t - k);
        }
        SeriesTable values = table.rowsAt(source);
        SeriesTable dated = table.rowsAt(target);
        SeriesTable result = new SeriesTable(table.source(), table.frequency(), dated.dates(), table.columnNames(),
                values.columns(), values.lineNumbers());
        return withDroppedEdges(table, target, result, (k > 0 ? "lag" : "lead") + " of " + Math.abs(k)
                + " period" + (Math.abs(k) == 1 ? "" : "s") + " reaches outside the file");
    }

    private static TableWithNotes withDroppedEdges(SeriesTable input, List<Integer> kept, SeriesTable result,
            String reason) {
        List<Period> dropped = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        int first = kept.get(0);
        int last = kept.get(kept.size() - 1);
        for (int t = 0; t < input.rows(); t++) {
            if (t < first || t > last) {
                dropped.add(input.dates().get(t));
            }
        }
        if (last - first + 1 != kept.size()) {
            throw new IllegalStateException("a transform dropped an interior row of " + input);
        }
        if (first > 0) {
            notes.add(input.source() + ": dropped " + range(input, 0, first - 1) + " at the start (" + reason + ")");
        }
        if (last < input.rows() - 1) {
            notes.add(input.source() + ": dropped " + range(input, last + 1, input.rows() - 1) + " at the end ("
                    + reason + ")");
        }
        return new TableWithNotes(result, dropped, notes);
    }

    private static String range(SeriesTable table, int from, int to) {
        return from == to ? table.dates().get(from).label()
                : table.dates().get(from) + " to " + table.dates().get(to) + " (" + (to - from + 1) + " rows)";
    }

    private static String span(SeriesTable table) {
        return table.rows() == 0 ? "no rows" : table.dates().get(0) + " to " + table.dates().get(table.rows() - 1);
    }

    private static Map<Period, Integer> rowIndex(SeriesTable table) {
        Map<Period, Integer> row = new HashMap<>();
        for (int t = 0; t < table.rows(); t++) {
            row.put(table.dates().get(t), t);
        }
        return row;
    }

    private static double[] positive(SeriesTable table, String column, String what) {
        double[] v = table.column(column);
        for (int t = 0; t < v.length; t++) {
            if (!(v[t] > 0)) {
                throw InputException.in(table.source()).line(table.lineOf(t)).column(column).problem(
                        "the " + what + " " + v[t] + " at " + table.dates().get(t) + " is not positive",
                        "a " + what + " is a positive level; check the value and the column");
            }
        }
        return v;
    }
}
