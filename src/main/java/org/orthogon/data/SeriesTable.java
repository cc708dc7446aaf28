package org.orthogon.data;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Objects;
import java.util.Set;

/**
 * A wide table of numeric series on one time index, as read from one file. Immutable: the arrays are
 * copied on the way in and on the way out, so a caller cannot change a table another caller holds.
 * Call {@link #columns()} or {@link #column(String)} once and keep the result rather than calling it
 * inside a loop.
 *
 * @param source      the file the table came from (named in every message about it)
 * @param frequency   the frequency of {@code dates}
 * @param dates       one period per row, strictly increasing
 * @param columnNames the series names, in file order, without the date column
 * @param columns     {@code columns[j][t]}: series j at row t
 * @param lineNumbers the 1-based file line of each row, so later checks can point at the cell
 */
public record SeriesTable(Path source, Frequency frequency, List<Period> dates, List<String> columnNames,
                          double[][] columns, int[] lineNumbers) {

    /** Checks the shapes agree and takes private copies. */
    public SeriesTable {
        Objects.requireNonNull(source, "source");
        Objects.requireNonNull(frequency, "frequency");
        dates = List.copyOf(dates);
        columnNames = List.copyOf(columnNames);
        if (columns.length != columnNames.size()) {
            throw new IllegalArgumentException(columns.length + " columns but " + columnNames.size() + " names");
        }
        if (lineNumbers.length != dates.size()) {
            throw new IllegalArgumentException(lineNumbers.length + " line numbers but " + dates.size() + " dates");
        }
        double[][] copy = new double[columns.length][];
        for (int j = 0; j < columns.length; j++) {
            if (columns[j].length != dates.size()) {
                throw new IllegalArgumentException("column " + columnNames.get(j) + " has " + columns[j].length
                        + " values but there are " + dates.size() + " dates");
            }
            copy[j] = columns[j].clone();
        }
        for (Period date : dates) {
            if (date.frequency() != frequency) {
                throw new IllegalArgumentException("date " + date + " is not " + frequency.id());
            }
        }
        columns = copy;
        lineNumbers = lineNumbers.clone();
    }

    /** A copy of all values, {@code [column][row]}. */
    @Override
    public double[][] columns() {
        double[][] copy = new double[columns.length][];
        for (int j = 0; j < columns.length; j++) {
            copy[j] = columns[j].clone();
        }
        return copy;
    }

    /** A copy of the file line of each row. */
    @Override
    public int[] lineNumbers() {
        return lineNumbers.clone();
    }

    /** The number of rows (dates). */
    public int rows() {
        return dates.size();
    }

    /** The file line of row {@code t} (0-based row, 1-based line). */
    public int lineOf(int t) {
        return lineNumbers[t];
    }

    /** The 0-based index of a column, or -1 if there is none of that exact name. */
    public int indexOf(String name) {
        return columnNames.indexOf(name);
    }

    /**
     * A copy of the values of the named column.
     *
     * @throws InputException naming the file, the closest existing column and all of them, if no
     *                        column has exactly that name
     */
    public double[] column(String name) {
        int j = indexOf(name);
        if (j < 0) {
            throw missingColumn(name);
        }
        return columns[j].clone();
    }

    /**
     * The table with only the named columns, in the order asked for.
     *
     * @throws InputException if a name is missing (with a suggestion), repeated, or the list is empty
     */
    public SeriesTable select(List<String> names) {
        if (names.isEmpty()) {
            throw InputException.in(source).problem("no columns were asked for",
                    "name at least one of: " + String.join(", ", columnNames));
        }
        Set<String> seen = new HashSet<>();
        double[][] picked = new double[names.size()][];
        for (int k = 0; k < names.size(); k++) {
            String name = names.get(k);
            if (!seen.add(name)) {
                throw InputException.in(source).column(name).problem(
                        "the column \"" + name + "\" is asked for twice", "list each column once");
            }
            int j = indexOf(name);
            if (j < 0) {
                throw missingColumn(name);
            }
            picked[k] = columns[j];
        }
        return new SeriesTable(source, frequency, dates, names, picked, lineNumbers);
    }

    /**
     * The rows from {@code startInclusive} to {@code endInclusive}. Bounds of another frequency are
     * converted with {@link Period#asStart} and {@link Period#asEnd}.
     *
     * @throws InputException if a bound lies outside the table's dates, the start is after the end,
     *                        or a bound splits a period of this table
     */
    public SeriesTable between(Period startInclusive, Period endInclusive) {
        Period start = startInclusive.asStart(frequency);
        Period end = endInclusive.asEnd(frequency);
        if (start.compareTo(end) > 0) {
            throw InputException.in(source).problem(
                    "the sample start " + start + " is after the sample end " + end,
                    "swap the two bounds or correct one of them");
        }
        if (dates.isEmpty()) {
            throw InputException.in(source).problem("the table has no rows", "use a file with data rows");
        }
        Period first = dates.get(0);
        Period last = dates.get(dates.size() - 1);
        if (start.compareTo(first) < 0 || start.compareTo(last) > 0) {
            throw outside("start", start, first, last);
        }
        if (end.compareTo(first) < 0 || end.compareTo(last) > 0) {
            throw outside("end", end, first, last);
        }
        List<Integer> keep = new ArrayList<>();
        for (int t = 0; t < dates.size(); t++) {
            Period d = dates.get(t);
            if (d.compareTo(start) >= 0 && d.compareTo(end) <= 0) {
                keep.add(t);
            }
        }
        return rowsAt(keep);
    }

    /** The rows at the given 0-based indices, in that order. */
    SeriesTable rowsAt(List<Integer> rows) {
        List<Period> keptDates = new ArrayList<>(rows.size());
        int[] keptLines = new int[rows.size()];
        double[][] kept = new double[columns.length][rows.size()];
        for (int k = 0; k < rows.size(); k++) {
            int t = rows.get(k);
            keptDates.add(dates.get(t));
            keptLines[k] = lineNumbers[t];
            for (int j = 0; j < columns.length; j++) {
                kept[j][k] = columns[j][t];
            }
        }
        return new SeriesTable(source, frequency, keptDates, columnNames, kept, keptLines);
    }

    /** The same index and names with new values, for transforms that act cell by cell. */
    SeriesTable withColumns(double[][] newColumns) {
        return new SeriesTable(source, frequency, dates, columnNames, newColumns, lineNumbers);
    }

    /** Direct read access for this package's transforms, which do not modify the arrays. */
    double value(int column, int row) {
        return columns[column][row];
    }

    private InputException outside(String which, Period bound, Period first, Period last) {
        return InputException.in(source).problem(
                "the requested sample " + which + " " + bound + " lies outside the file's dates, which run from "
                        + first + " to " + last,
                "choose a " + which + " between " + first + " and " + last + ", or extend the file");
    }

    private InputException missingColumn(String name) {
        String hint = Suggestions.closest(name, columnNames).map(s -> "did you mean \"" + s + "\"? ").orElse("");
        // Line 1 is the header row, where the column would have to be named.
        return InputException.in(source).line(1).column(name).problem(
                "there is no column named \"" + name + "\"",
                hint + "the columns are: " + String.join(", ", columnNames));
    }

    /** Tables are equal when source, index, names, values and line numbers all agree. */
    @Override
    public boolean equals(Object o) {
        return o instanceof SeriesTable other
                && source.equals(other.source)
                && frequency == other.frequency
                && dates.equals(other.dates)
                && columnNames.equals(other.columnNames)
                && Arrays.deepEquals(columns, other.columns)
                && Arrays.equals(lineNumbers, other.lineNumbers);
    }

    @Override
    public int hashCode() {
        return Objects.hash(source, frequency, dates, columnNames, Arrays.deepHashCode(columns),
                Arrays.hashCode(lineNumbers));
    }

    /** A one-line summary; the values are left out because tables can be large. */
    @Override
    public String toString() {
        String range = dates.isEmpty() ? "no rows" : dates.get(0) + ".." + dates.get(dates.size() - 1);
        return "SeriesTable[" + source + ", " + frequency.id() + ", " + range + ", " + columnNames + "]";
    }
}
