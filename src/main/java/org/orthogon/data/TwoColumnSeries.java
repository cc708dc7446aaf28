package org.orthogon.data;

import java.nio.file.Path;
import java.util.List;
import java.util.Set;

/**
 * Reads a single series stored as two columns, {@code date,value}, the way statistical offices and
 * central banks distribute one macro series per file. An optional header row names the series; a
 * value of "." or an empty cell marks a missing observation, allowed only at the start or the end
 * (dropped there and reported, see {@link TableWithNotes}).
 *
 * <pre>
 * date,lumen_deflator
 * 1961Q4,.
 * 1962Q1,100.0
 * 1962Q2,100.41
 * </pre>
 */
public final class TwoColumnSeries {

    private static final Set<Period.Notation> ANY_NOTATION = Set.of(Period.Notation.values());

    private TwoColumnSeries() {
    }

    /**
     * Reads the file.
     *
     * @param file          the file, comma-separated
     * @param nameIfNoHeader the series name to use when the first row is already data; when null the
     *                      file name without its extension is used
     * @return the one-column table and the rows dropped at the edges
     * @throws InputException for an unreadable or empty file, a row that does not have exactly two cells,
     *                        an unreadable date or number, a missing value inside the sample, and
     *                        duplicate, unsorted or missing dates (each naming file, line and column)
     */
    public static TableWithNotes read(Path file, String nameIfNoHeader) {
        List<CsvSeries.RawRow> rows = CsvSeries.parse(file, CsvSeries.readText(file));
        if (rows.isEmpty()) {
            throw InputException.in(file).problem("the file is empty",
                    "write one row per period: the date, a comma, the value (a header row date,name may come first)");
        }
        CsvSeries.RawRow first = rows.get(0);
        boolean headed = Period.parseNotation(first.cells().get(0)) == null;
        String dateName = CsvSeries.DATE_HEADER;
        String name;
        if (headed) {
            requireTwoCells(file, first, "the header");
            if (first.cells().get(1).isEmpty()) {
                throw InputException.in(file).line(first.line()).column(2, null).problem(
                        "the header gives the series no name", "write a name after the comma, e.g. date,cons_level");
            }
            if (!first.cells().get(0).isEmpty()) {
                dateName = first.cells().get(0);
            }
            name = first.cells().get(1);
            rows = rows.subList(1, rows.size());
            if (rows.isEmpty()) {
                throw InputException.in(file).line(first.line() + 1).problem("the file has a header but no data rows",
                        "add one row per period below the header: the date, a comma, the value");
            }
        } else {
            name = nameIfNoHeader != null ? nameIfNoHeader : stem(file);
        }
        for (CsvSeries.RawRow row : rows) {
            requireTwoCells(file, row, "this row");
        }
        return ImportedRows.toTable(file, rows, List.of(name), dateName, cell -> cell.isEmpty() || cell.equals("."),
                "\".\" or an empty cell", ANY_NOTATION);
    }

    private static void requireTwoCells(Path file, CsvSeries.RawRow row, String what) {
        if (row.cells().size() != 2) {
            throw InputException.in(file).line(row.line()).problem(
                    what + " has " + row.cells().size() + " cells; a series file has exactly two, date and value",
                    "write each row as date,value; for several series use a wide CSV file (date, then one column per"
                            + " series)");
        }
    }

    private static String stem(Path file) {
        String name = file.getFileName().toString();
        int dot = name.lastIndexOf('.');
        return dot > 0 ? name.substring(0, dot) : name;
    }
}
