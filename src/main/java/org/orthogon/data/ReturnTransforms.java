package org.orthogon.data;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Units, kinds and frequencies of returns: percent to decimal, plausibility checks that catch the
 * common declaration mistakes, gross and excess conversions, and compounding to a coarser frequency.
 *
 * <p>All methods except {@link #toDecimal} and the plausibility checks expect decimal values.
 * Returns are never averaged or summed across periods: a multi-period return is the product of
 * the gross returns in it, and that is the only frequency conversion offered.
 */
public final class ReturnTransforms {

    /**
     * A decimal net or excess return at least this large in absolute value is a 150% move in one
     * period. Real portfolio returns do this in a handful of months at most (small firms in a
     * crash recovery), while returns written in percent do it in most rows.
     */
    static final double LARGE_DECIMAL_RETURN = 1.5;

    /** Share of rows with a {@link #LARGE_DECIMAL_RETURN} above which a column is taken for percent. */
    static final double LARGE_SHARE = 0.05;

    /** A column with fewer large returns than this is never refused for them, however short it is. */
    static final int LARGE_MIN_COUNT = 3;

    /** Share of values near 1 (or near 100 in percent) above which net returns look gross. */
    static final double NEAR_ONE_SHARE = 0.9;

    private ReturnTransforms() {
    }

    /**
     * The table in decimal units: unchanged for {@link Units#DECIMAL}, divided by 100 for
     * {@link Units#PERCENT} (which turns gross returns around 100 into gross returns around 1 too).
     */
    public static SeriesTable toDecimal(SeriesTable table, Units units) {
        if (units == Units.DECIMAL) {
            return table;
        }
        double[][] columns = table.columns();
        for (double[] column : columns) {
            for (int t = 0; t < column.length; t++) {
                column[t] /= 100.0;
            }
        }
        return table.withColumns(columns);
    }

    /**
     * Refuses a return table whose values contradict its declared kind and units, naming the file,
     * the line and the column of the first offending cell. The values are checked as written (before
     * {@link #toDecimal}). Each column is judged on its own.
     *
     * <p>The thresholds, chosen so that monthly and quarterly returns of a real economy pass while the
     * usual mistakes fail by a wide margin:
     * <ul>
     * <li>Declared gross: a negative value is refused (a gross return is a payoff per unit invested).
     *     In decimal, a median above 10 means percent (gross returns around 100), a median below 0.5
     *     means net or excess returns (real gross returns have medians near 1.01 and fall below 0.5
     *     only in a crash month). In percent, a median below 10 means decimal or net values.</li>
     * <li>Declared net or excess: if at least 90% of the values lie within 0.5 of 1 (or within 50 of
     *     100) they are gross returns (decimal net returns are that close to 1 almost never).</li>
     * <li>Declared net or excess in decimal: percent is suspected if |r| &ge; 1.5 in at least 5% of the
     *     rows (and in at least 3 rows), or if the median |r| exceeds 0.2 (0.5 for annual data).
     *     A decimal monthly or quarterly portfolio return has a median |r| of 0.02 to 0.10 and a 150%
     *     move is a rare event; percent returns have a median |r| of 2 to 10. The 0.2 median bound
     *     also catches a risk-free rate written in percent (typically 0.3 to 1 a month). Annual
     *     returns of volatile portfolios have median |r| near 0.2, hence the wider bound for them.</li>
     * <li>Declared net in decimal: a value below -1 (a loss of more than everything invested) is
     *     refused; in percent, a value below -100.</li>
     * <li>Declared net or excess in percent: decimal is suspected if every |r| is below 0.5 (every
     *     return of the sample under half a percent). This rule is wrong for a risk-free rate in a
     *     period of near-zero rates, which is why {@link #checkPlausibleRiskfree} leaves it out.</li>
     * </ul>
     *
     * @throws InputException at the first offending cell
     */
    public static void checkPlausible(SeriesTable table, ReturnKind kind, Units units) {
        check(table, kind, units, true);
    }

    /**
     * As {@link #checkPlausible}, for a risk-free rate: the same rules except "every value under 0.5
     * when percent is declared", because a short-rate at or near zero is small in any units.
     *
     * @throws InputException at the first offending cell
     */
    public static void checkPlausibleRiskfree(SeriesTable table, ReturnKind kind, Units units) {
        check(table, kind, units, false);
    }

    private static void check(SeriesTable table, ReturnKind kind, Units units, boolean tooSmallForPercent) {
        double[][] columns = table.columns();
        for (int j = 0; j < columns.length; j++) {
            String name = table.columnNames().get(j);
            double[] v = columns[j];
            if (v.length == 0) {
                continue;
            }
            checkMissingCodes(table, name, v);
            if (kind == ReturnKind.GROSS) {
                checkGross(table, name, v, units);
            } else {
                checkNetOrExcess(table, name, v, kind, units, tooSmallForPercent);
            }
            checkAbsurd(table, name, v, kind, units);
        }
    }

    /**
     * Published return files often write a missing value as -99.99 or -999; in percent units -99.99
     * would otherwise pass as a plausible total loss and silently enter every moment (common practice,
     * no source).
     */
    private static void checkMissingCodes(SeriesTable table, String name, double[] v) {
        int t = firstIndex(v, x -> x == -99.99 || x == -999 || x == -9999 || x == -99.9);
        if (t >= 0) {
            throw cell(table, t, name, "the value " + v[t] + " looks like a missing-value code, not a return",
                    "missing values are not supported: remove the row, or set the sample start/end to exclude it");
        }
    }

    /**
     * A single return of more than 1000% in one period (in size, after the declared units) is far more
     * likely a typing or units mistake in one cell than a real payoff, and one such cell dominates every
     * moment; it is refused rather than averaged in.
     */
    private static void checkAbsurd(SeriesTable table, String name, double[] v, ReturnKind kind, Units units) {
        double scale = units == Units.PERCENT ? 0.01 : 1.0;
        double offset = kind == ReturnKind.GROSS ? 1.0 : 0.0;
        int t = firstIndex(v, x -> Math.abs(x * scale - offset) > ABSURD_RETURN);
        if (t >= 0) {
            throw cell(table, t, name, "the " + kind.id() + " return " + v[t] + " is a move of more than "
                            + Math.round(ABSURD_RETURN * 100) + "% in one " + periodWord(table.frequency()),
                    "check this cell for a typing or units mistake (returns are per period, in the declared units)");
        }
    }

    /** Largest plausible size of one period's net return, as a decimal (1000%). */
    private static final double ABSURD_RETURN = 10.0;

    private static void checkGross(SeriesTable table, String name, double[] v, Units units) {
        // The level comes first: net returns declared gross contain negatives too, and "declare net"
        // is the fix that helps there, not "a gross return cannot be negative".
        double median = median(v);
        if (units == Units.DECIMAL) {
            if (median > 10) {
                int t = firstIndex(v, x -> x > 10);
                throw cell(table, t, name, "the gross return " + v[t] + " looks like percent (this column's values"
                                + " are around " + round(median) + ", decimal gross returns are around 1)",
                        "declare units = \"percent\"");
            }
            if (median < 0.5) {
                int t = firstIndex(v, x -> x < 0.5);
                throw cell(table, t, name, "the value " + v[t] + " is not a plausible gross return (this column's"
                                + " values are around " + round(median) + ", gross returns are around 1)",
                        "declare returns_kind = \"net\" or \"excess\" if these are returns minus 1 or minus the"
                                + " risk-free rate");
            }
        } else if (median < 10) {
            int t = firstIndex(v, x -> x < 10);
            boolean nearOne = median > 0.5 && median < 1.5;
            throw cell(table, t, name, "the value " + v[t] + " is not a plausible gross return in percent (this"
                            + " column's values are around " + round(median) + ", gross returns in percent are around 100)",
                    nearOne ? "declare units = \"decimal\"" : "declare returns_kind = \"net\" or \"excess\"");
        }
        int negative = firstIndex(v, x -> x < 0);
        if (negative >= 0) {
            throw cell(table, negative, name, "the gross return " + v[negative] + " is negative",
                    "gross returns are payoffs per unit invested and cannot be below 0; if the file holds net or"
                            + " excess returns, declare returns_kind = \"net\" or \"excess\"");
        }
    }

    private static void checkNetOrExcess(SeriesTable table, String name, double[] v, ReturnKind kind, Units units,
                                         boolean tooSmallForPercent) {
        String declared = kind.id();
        if (share(v, x -> Math.abs(x - 1) < 0.5) >= NEAR_ONE_SHARE) {
            int t = firstIndex(v, x -> Math.abs(x - 1) < 0.5);
            throw cell(table, t, name, "the " + declared + " return " + v[t] + " looks like a gross return in decimal"
                            + " (most values of this column are near 1)",
                    "declare returns_kind = \"gross\" and units = \"decimal\"");
        }
        if (share(v, x -> Math.abs(x - 100) < 50) >= NEAR_ONE_SHARE) {
            int t = firstIndex(v, x -> Math.abs(x - 100) < 50);
            throw cell(table, t, name, "the " + declared + " return " + v[t] + " looks like a gross return in percent"
                            + " (most values of this column are near 100)",
                    "declare returns_kind = \"gross\" and units = \"percent\"");
        }
        if (units == Units.DECIMAL) {
            int large = count(v, x -> Math.abs(x) >= LARGE_DECIMAL_RETURN);
            double medianAbs = median(abs(v));
            double medianBound = table.frequency() == Frequency.ANNUAL ? 0.5 : 0.2;
            if (large >= Math.max(LARGE_MIN_COUNT, Math.ceil(LARGE_SHARE * v.length))) {
                int t = firstIndex(v, x -> Math.abs(x) >= LARGE_DECIMAL_RETURN);
                throw cell(table, t, name, "the " + declared + " return " + v[t] + " looks like percent: " + large
                                + " of " + v.length + " values are 1.5 (150%) or more in size",
                        "declare units = \"percent\", or divide the column by 100");
            }
            if (medianAbs > medianBound) {
                int t = firstIndex(v, x -> Math.abs(x) > medianBound);
                throw cell(table, t, name, "the " + declared + " return " + v[t] + " looks like percent: the typical"
                                + " size of this column's values is " + round(medianAbs) + ", more than " + medianBound
                                + " (" + Math.round(medianBound * 100) + "%) a " + periodWord(table.frequency()),
                        "declare units = \"percent\", or divide the column by 100");
            }
            if (kind == ReturnKind.NET) {
                int t = firstIndex(v, x -> x < -1);
                if (t >= 0) {
                    throw cell(table, t, name, "the net return " + v[t] + " is a loss of more than 100%",
                            "check the value; with limited liability a net return cannot be below -1");
                }
            }
        } else {
            if (tooSmallForPercent && count(v, x -> Math.abs(x) < 0.5) == v.length) {
                throw cell(table, 0, name, "the " + declared + " returns look like decimals: every value of this"
                                + " column is under 0.5 in size, i.e. under half a percent when read as percent",
                        "declare units = \"decimal\"");
            }
            if (kind == ReturnKind.NET) {
                int t = firstIndex(v, x -> x < -100);
                if (t >= 0) {
                    throw cell(table, t, name, "the net return " + v[t] + "% is a loss of more than 100%",
                            "check the value; with limited liability a net return cannot be below -100%");
                }
            }
        }
    }

    /**
     * Decimal returns of any kind as gross returns: gross as they are, net plus one, excess plus the
     * gross risk-free rate of the same row (R = R^e + R_f, which holds whether R^e was formed from
     * gross or from net returns).
     *
     * @param riskfreeGrossOrNull the gross risk-free rate, one value per row; required for excess
     * @throws InputException if excess returns come without a risk-free rate or its length differs
     */
    public static SeriesTable toGross(SeriesTable table, ReturnKind kind, double[] riskfreeGrossOrNull) {
        double[][] columns = table.columns();
        switch (kind) {
            case GROSS -> {
                return table;
            }
            case NET -> {
                for (double[] column : columns) {
                    for (int t = 0; t < column.length; t++) {
                        column[t] += 1.0;
                    }
                }
            }
            case EXCESS -> {
                if (riskfreeGrossOrNull == null) {
                    throw InputException.in(table.source()).problem(
                            "the file holds excess returns, which need a risk-free rate to become gross returns",
                            "give a riskfree file (and riskfree_column) in the model file's [data] section");
                }
                requireSameLength(table, riskfreeGrossOrNull);
                for (double[] column : columns) {
                    for (int t = 0; t < column.length; t++) {
                        column[t] += riskfreeGrossOrNull[t];
                    }
                }
            }
            default -> throw new IllegalStateException(kind.toString());
        }
        return table.withColumns(columns);
    }

    /**
     * Excess returns: each column minus the risk-free rate of the same row. Returns and rate must be
     * both gross or both net (the difference is the same either way) and in decimal.
     *
     * @throws InputException if the lengths differ, or if the result is centred far from zero, which
     *                        happens when one side is gross and the other net
     */
    public static SeriesTable excess(SeriesTable grossOrNet, double[] riskfree) {
        requireSameLength(grossOrNet, riskfree);
        double[][] columns = grossOrNet.columns();
        for (double[] column : columns) {
            for (int t = 0; t < column.length; t++) {
                column[t] -= riskfree[t];
            }
        }
        for (int j = 0; j < columns.length; j++) {
            double median = median(columns[j]);
            if (Math.abs(median) > 0.5) {
                throw InputException.in(grossOrNet.source()).column(grossOrNet.columnNames().get(j)).problem(
                        "the excess returns of this column are around " + round(median)
                                + " instead of near 0, so the returns and the risk-free rate are not both gross"
                                + " or both net",
                        "make the returns and the risk-free rate the same kind before subtracting: both gross or"
                                + " both net");
            }
        }
        return grossOrNet.withColumns(columns);
    }

    /**
     * Compounds gross returns to a coarser frequency: the return of a quarter (or year) is the
     * product of the gross returns of its months (or quarters). This is the usual definition of a
     * holding-period return (common practice, no source).
     *
     * <p>A period the input covers only in part is dropped if it sits at the start or the end of the
     * sample, and reported in the result; in the interior it is refused, because dropping it would
     * leave a hole in the index. Each result row carries the file line of its period's first input
     * row. A table already at {@code target} frequency is returned unchanged, with nothing dropped.
     *
     * @param gross  decimal gross returns, finer than {@code target}
     * @param target the coarser frequency
     * @throws InputException if the input is not finer than {@code target}, does not look like gross
     *                        returns, has an incomplete interior period, or has no complete period
     */
    public static CompoundedSeries compound(SeriesTable gross, Frequency target) {
        if (gross.frequency() == target) {
            return new CompoundedSeries(gross, List.of(), List.of());
        }
        if (!gross.frequency().isFinerThan(target)) {
            throw InputException.in(gross.source()).problem(
                    "the file is " + gross.frequency().id() + " and cannot be turned into " + target.id() + " returns",
                    "compound the finer series to " + gross.frequency().id() + " instead; finer returns cannot be"
                            + " made up from coarser ones");
        }
        requireGross(gross);
        int perTarget = target.monthsPerPeriod() / gross.frequency().monthsPerPeriod();
        List<List<Integer>> groups = new ArrayList<>();
        List<Period> groupPeriods = new ArrayList<>();
        for (int t = 0; t < gross.rows(); t++) {
            Period container = gross.dates().get(t).containingPeriod(target);
            if (groupPeriods.isEmpty() || !groupPeriods.get(groupPeriods.size() - 1).equals(container)) {
                groupPeriods.add(container);
                groups.add(new ArrayList<>());
            }
            groups.get(groups.size() - 1).add(t);
        }
        List<Period> dropped = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        List<Period> dates = new ArrayList<>();
        List<Integer> lines = new ArrayList<>();
        List<double[]> rows = new ArrayList<>();
        double[][] columns = gross.columns();
        for (int g = 0; g < groups.size(); g++) {
            List<Integer> members = groups.get(g);
            Period period = groupPeriods.get(g);
            if (members.size() < perTarget) {
                String have = members.size() + " of " + perTarget + " " + gross.frequency().id() + " returns ("
                        + gross.dates().get(members.get(0)) + (members.size() > 1
                        ? " to " + gross.dates().get(members.get(members.size() - 1)) : "") + ")";
                boolean edge = g == 0 || g == groups.size() - 1;
                if (!edge) {
                    throw InputException.in(gross.source()).line(gross.lineOf(members.get(0))).problem(
                            "the " + target.id() + " period " + period + " inside the sample is incomplete: only " + have,
                            "add the missing rows; only a partial period at the start or end of the sample is dropped");
                }
                dropped.add(period);
                notes.add(gross.source() + ": dropped the partial " + target.id() + " period " + period + " at the "
                        + (g == 0 ? "start" : "end") + " of the sample (it has " + have + ")");
                continue;
            }
            if (!dates.isEmpty() && dates.get(dates.size() - 1).until(period) != 1) {
                Period missing = dates.get(dates.size() - 1).plus(1);
                throw InputException.in(gross.source()).line(gross.lineOf(members.get(0))).problem(
                        "the " + target.id() + " period " + missing + " has no rows at all",
                        "add the missing rows so the sample has no gap");
            }
            double[] product = new double[columns.length];
            Arrays.fill(product, 1.0);
            for (int t : members) {
                for (int j = 0; j < columns.length; j++) {
                    product[j] *= columns[j][t];
                }
            }
            dates.add(period);
            lines.add(gross.lineOf(members.get(0)));
            rows.add(product);
        }
        if (dates.isEmpty()) {
            throw InputException.in(gross.source()).problem(
                    "the file holds no complete " + target.id() + " period to compound",
                    "give at least one full " + periodWord(target) + " of " + gross.frequency().id() + " returns");
        }
        double[][] out = new double[columns.length][dates.size()];
        for (int t = 0; t < dates.size(); t++) {
            for (int j = 0; j < columns.length; j++) {
                out[j][t] = rows.get(t)[j];
            }
        }
        int[] lineArray = lines.stream().mapToInt(Integer::intValue).toArray();
        SeriesTable result = new SeriesTable(gross.source(), target, dates, gross.columnNames(), out, lineArray);
        return new CompoundedSeries(result, dropped, notes);
    }

    static void requireGross(SeriesTable table) {
        double[][] columns = table.columns();
        for (int j = 0; j < columns.length; j++) {
            String name = table.columnNames().get(j);
            double[] v = columns[j];
            if (v.length > 0 && median(v) < 0.5) {
                int t = firstIndex(v, x -> x < 0.5);
                throw cell(table, t, name, "the value " + v[t] + " does not look like a gross return (the column is"
                                + " around " + round(median(v)) + ", gross returns are around 1)",
                        "compounding multiplies gross returns (1 + r); convert net returns to gross first, since"
                                + " adding or averaging returns across periods is wrong and is not offered");
            }
            int negative = firstIndex(v, x -> x < 0);
            if (negative >= 0) {
                throw cell(table, negative, name, "the gross return " + v[negative] + " is negative",
                        "compounding multiplies gross returns (1 + r); convert net or excess returns to gross first");
            }
        }
    }

    private static void requireSameLength(SeriesTable table, double[] riskfree) {
        if (riskfree.length != table.rows()) {
            throw InputException.in(table.source()).problem(
                    "the risk-free rate has " + riskfree.length + " values but the file has " + table.rows() + " rows",
                    "align the return and risk-free files to the same dates first");
        }
    }

    private static InputException cell(SeriesTable table, int row, String column, String problem, String fix) {
        return InputException.in(table.source()).line(table.lineOf(row)).column(column).problem(problem, fix);
    }

    private interface DoubleTest {
        boolean test(double x);
    }

    private static int firstIndex(double[] v, DoubleTest test) {
        for (int t = 0; t < v.length; t++) {
            if (test.test(v[t])) {
                return t;
            }
        }
        return -1;
    }

    private static int count(double[] v, DoubleTest test) {
        int n = 0;
        for (double x : v) {
            if (test.test(x)) {
                n++;
            }
        }
        return n;
    }

    private static double share(double[] v, DoubleTest test) {
        return v.length == 0 ? 0 : (double) count(v, test) / v.length;
    }

    private static double[] abs(double[] v) {
        double[] a = new double[v.length];
        for (int t = 0; t < v.length; t++) {
            a[t] = Math.abs(v[t]);
        }
        return a;
    }

    static double median(double[] v) {
        double[] s = v.clone();
        Arrays.sort(s);
        int n = s.length;
        return n % 2 == 1 ? s[n / 2] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
    }

    /** Three significant digits without trailing zeros, for "around ..." in messages. */
    private static String round(double x) {
        java.math.BigDecimal rounded = new java.math.BigDecimal(x).round(new java.math.MathContext(3)).stripTrailingZeros();
        return rounded.scale() < 0 ? rounded.setScale(0).toPlainString() : rounded.toPlainString();
    }

    private static String periodWord(Frequency frequency) {
        return switch (frequency) {
            case MONTHLY -> "month";
            case QUARTERLY -> "quarter";
            case ANNUAL -> "year";
        };
    }
}
