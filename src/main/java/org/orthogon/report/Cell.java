package org.orthogon.report;

import java.util.Locale;

/**
 * One table cell: either text, or a number with the text it displays. Writers keep the two apart so
 * that numbers align right, CSV keeps full precision, and only text is escaped against spreadsheet
 * formulas. A text cell may name a parameter ({@link #parameter}), which paper-style writers set as
 * mathematics (β, b_MKT as b with a subscript) and the others keep as the plain name.
 *
 * @param text      what a reader sees ("n/a" for a number that does not exist)
 * @param value     the number behind the text; NaN for text cells and for missing numbers
 * @param numeric   true for a number column entry (including a missing number)
 * @param parameter true for a text cell that names a model parameter
 */
public record Cell(String text, double value, boolean numeric, boolean parameter) {
    /** What a missing number displays. */
    public static final String MISSING = "n/a";

    public Cell {
        if (text == null) {
            throw new IllegalArgumentException("a cell's text may not be null");
        }
    }

    /** A cell that names no parameter. */
    public Cell(String text, double value, boolean numeric) {
        this(text, value, numeric, false);
    }

    /** A text cell holding a parameter's name, e.g. "beta" or "b_MKT". */
    public static Cell parameter(String name) {
        return new Cell(name, Double.NaN, false, true);
    }

    /** A text cell. */
    public static Cell text(String text) {
        return new Cell(text, Double.NaN, false);
    }

    /** A number shown with six significant digits (scientific notation when very small or large). */
    public static Cell number(double value) {
        return new Cell(ConsoleReport.number(value), value, true);
    }

    /** A number shown with a fixed count of decimals (t-statistics, p-values, test statistics). */
    public static Cell fixed(double value, int decimals) {
        return new Cell(ConsoleReport.fixed(value, decimals), value, true);
    }

    /** A whole number such as degrees of freedom or an observation count. */
    public static Cell count(long value) {
        return new Cell(Long.toString(value), value, true);
    }

    /** True when this is a number that exists (not text, not missing). */
    public boolean hasValue() {
        return numeric && Double.isFinite(value);
    }

    /**
     * The number at full double precision for machine-readable files (shortest text that reads back
     * to the same double); empty for a missing number; the text itself for a text cell.
     */
    public String exact() {
        if (!numeric) {
            return text;
        }
        if (!Double.isFinite(value)) {
            return "";
        }
        if (value == Math.rint(value) && Math.abs(value) < 1e15) {
            return String.format(Locale.ROOT, "%d", (long) value);
        }
        return Double.toString(value);
    }
}
