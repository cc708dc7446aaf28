package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * A table of a report: an id (also the file name of its CSV, Markdown and LaTeX forms), a caption,
 * a header, rows of cells and footer notes.
 *
 * <p>Parameter tables in papers show each standard error in parentheses under its estimate. A table
 * declares that with {@link Builder#errorUnder(String, String)}: the error column is then drawn
 * under the estimate column by the paper-style writers (LaTeX, Markdown, HTML), while CSV keeps
 * both as separate columns so that a spreadsheet gets plain numbers.
 *
 * @param id       a file-name-safe identifier: lower-case letters, digits and hyphens
 * @param caption  one line saying what the table shows
 * @param header   column names
 * @param rows     the body; every row has as many cells as the header
 * @param notes    footer lines (tests, p-values, definitions)
 * @param errorUnder for each error column index, the index of the estimate column it goes under
 */
public record Table(String id, String caption, List<String> header, List<List<Cell>> rows, List<String> notes,
        Map<Integer, Integer> errorUnder) {

    public Table {
        if (!id.matches("[a-z0-9]+(-[a-z0-9]+)*")) {
            throw new IllegalArgumentException("table id \"" + id + "\" must be lower-case words joined by hyphens");
        }
        header = List.copyOf(header);
        rows = rows.stream().map(List::copyOf).toList();
        notes = List.copyOf(notes);
        errorUnder = Map.copyOf(errorUnder);
        for (List<Cell> row : rows) {
            if (row.size() != header.size()) {
                throw new IllegalArgumentException("table " + id + ": a row has " + row.size() + " cells, the header "
                        + header.size());
            }
        }
    }

    /** Starts a table. */
    public static Builder builder(String id, String caption, String... header) {
        return new Builder(id, caption, List.of(header));
    }

    /** Starts a table whose header is computed (e.g. one column per model). */
    public static Builder builder(String id, String caption, List<String> header) {
        return new Builder(id, caption, header);
    }

    /** True when column {@code c} is drawn under another column in the paper-style layout. */
    public boolean isErrorColumn(int c) {
        return errorUnder.containsKey(c);
    }

    /** The error column drawn under estimate column {@code c}, or -1. */
    public int errorColumnUnder(int c) {
        for (Map.Entry<Integer, Integer> e : errorUnder.entrySet()) {
            if (e.getValue() == c) {
                return e.getKey();
            }
        }
        return -1;
    }

    /** The columns the paper-style layout shows side by side (error columns removed), in order. */
    public List<Integer> shownColumns() {
        List<Integer> shown = new ArrayList<>();
        for (int c = 0; c < header.size(); c++) {
            if (!isErrorColumn(c)) {
                shown.add(c);
            }
        }
        return shown;
    }

    /**
     * The lines one row takes in the paper-style layout, as plain (unescaped) text per shown column:
     * the row itself, then, when the table pairs estimates with errors, the errors in parentheses
     * under their estimates (blank elsewhere).
     */
    public List<List<String>> paperLines(List<Cell> row) {
        List<String> main = new ArrayList<>();
        List<String> under = new ArrayList<>();
        for (int c : shownColumns()) {
            main.add(row.get(c).text());
            int error = errorColumnUnder(c);
            under.add(error >= 0 ? "(" + row.get(error).text() + ")" : "");
        }
        return errorUnder.isEmpty() ? List.of(main) : List.of(main, under);
    }

    /** True when column {@code c} holds only numbers (header excluded); decides right alignment. */
    public boolean isNumericColumn(int c) {
        return !rows.isEmpty() && rows.stream().allMatch(row -> row.get(c).numeric());
    }

    /** Builds a {@link Table} row by row. */
    public static final class Builder {
        private final String id;
        private final String caption;
        private final List<String> header;
        private final List<List<Cell>> rows = new ArrayList<>();
        private final List<String> notes = new ArrayList<>();
        private final Map<Integer, Integer> errorUnder = new TreeMap<>();

        private Builder(String id, String caption, List<String> header) {
            this.id = id;
            this.caption = caption;
            this.header = List.copyOf(header);
        }

        /** Adds a row. */
        public Builder row(Cell... cells) {
            return row(List.of(cells));
        }

        /** Adds a row. */
        public Builder row(List<Cell> cells) {
            rows.add(List.copyOf(cells));
            return this;
        }

        /** Adds a footer note. */
        public Builder note(String note) {
            notes.add(note);
            return this;
        }

        /** Draws column {@code errorColumn} in parentheses under column {@code estimateColumn} (by header name). */
        public Builder errorUnder(String estimateColumn, String errorColumn) {
            int estimate = indexOf(estimateColumn);
            int error = indexOf(errorColumn);
            if (estimate == error || errorUnder.containsKey(estimate) || errorUnder.containsValue(estimate)
                    || errorUnder.containsKey(error) || errorUnder.containsValue(error)) {
                throw new IllegalArgumentException("columns " + estimateColumn + " and " + errorColumn
                        + " cannot pair: each column takes part in at most one estimate/error pair");
            }
            errorUnder.put(error, estimate);
            return this;
        }

        private int indexOf(String column) {
            int at = header.indexOf(column);
            if (at < 0) {
                throw new IllegalArgumentException("no column \"" + column + "\" in " + header);
            }
            return at;
        }

        /** The finished table. */
        public Table build() {
            return new Table(id, caption, header, rows, notes, errorUnder);
        }
    }
}
