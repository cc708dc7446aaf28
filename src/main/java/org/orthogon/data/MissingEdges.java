package org.orthogon.data;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * The one rule for missing values in imported series: a series may start late or stop early, so
 * rows with a missing cell are dropped at the start and the end of the sample, and reported; a
 * missing cell between observed rows is refused, because dropping it would put a hole in the time
 * index and filling it would invent data.
 */
final class MissingEdges {
    private MissingEdges() {
    }

    /** The rows kept, {@code [from, to)}, and one note per dropped edge. */
    record Kept(int from, int to, List<String> notes) {
    }

    /**
     * Finds the rows to keep, refusing a missing value between observed rows.
     *
     * @param values    {@code [row][column]}, NaN where a missing code was read
     * @param dateTexts the date of each row as written
     * @param lines     the file line of each row
     * @param names     the column names
     * @param columnOffset the 1-based file column of value 0 minus one (1 when the date is column 1)
     * @param codes     how the missing values were written, for messages ("\".\" or an empty cell")
     */
    static Kept trim(Path file, double[][] values, List<String> dateTexts, int[] lines, List<String> names,
            int columnOffset, String codes) {
        int rows = values.length;
        int from = 0;
        while (from < rows && hasMissing(values[from])) {
            from++;
        }
        if (from == rows) {
            throw InputException.in(file).line(rows == 0 ? 0 : lines[0]).problem(
                    "no row has a value in every column: every row holds a missing value (" + codes + ")",
                    "give at least one period with all values present");
        }
        int to = rows;
        while (hasMissing(values[to - 1])) {
            to--;
        }
        for (int t = from; t < to; t++) {
            for (int j = 0; j < values[t].length; j++) {
                if (Double.isNaN(values[t][j])) {
                    throw InputException.in(file).line(lines[t]).column(j + 1 + columnOffset, names.get(j)).problem(
                            "a missing value (" + codes + ") at " + dateTexts.get(t) + " sits inside the sample, between"
                                    + " observed values (" + dateTexts.get(from) + " to " + dateTexts.get(to - 1) + ")",
                            "fill in the value from the source, or end or start the sample so that the gap lies outside"
                                    + " it; missing values are dropped only at the start or end of a series");
                }
            }
        }
        List<String> notes = new ArrayList<>();
        if (from > 0) {
            notes.add(file + ": dropped " + describe(dateTexts, 0, from) + " at the start (missing values, "
                    + lineSpan(lines, 0, from - 1) + ")");
        }
        if (to < rows) {
            notes.add(file + ": dropped " + describe(dateTexts, to, rows) + " at the end (missing values, "
                    + lineSpan(lines, to, rows - 1) + ")");
        }
        return new Kept(from, to, notes);
    }

    private static String lineSpan(int[] lines, int from, int to) {
        return from == to ? "line " + lines[from] : "lines " + lines[from] + "-" + lines[to];
    }

    private static String describe(List<String> dates, int from, int to) {
        return to - from == 1 ? "the row " + dates.get(from)
                : "the " + (to - from) + " rows " + dates.get(from) + " to " + dates.get(to - 1);
    }

    private static boolean hasMissing(double[] row) {
        for (double v : row) {
            if (Double.isNaN(v)) {
                return true;
            }
        }
        return false;
    }
}
