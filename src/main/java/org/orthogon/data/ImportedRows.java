package org.orthogon.data;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.function.Predicate;
import java.util.stream.Collectors;

/**
 * Turns rows of cells already split by an importer into a {@link SeriesTable}: dates and numbers are
 * read exactly as {@link CsvSeries} reads them, missing codes become gaps that {@link MissingEdges}
 * trims at the edges, and the remaining dates go through the same index checks (no duplicates, sorted,
 * no gaps, one frequency) as a wide CSV file.
 */
final class ImportedRows {
    private ImportedRows() {
    }

    /**
     * @param rows      data rows, each a date cell then one cell per name
     * @param names     the series names
     * @param dateName  the name of the date column, for messages
     * @param isMissing which cell texts are missing codes
     * @param codes     the missing codes as the user should read them
     * @param notations the date notations this layout allows
     */
    static TableWithNotes toTable(Path file, List<CsvSeries.RawRow> rows, List<String> names, String dateName,
            Predicate<String> isMissing, String codes, Set<Period.Notation> notations) {
        int count = rows.size();
        double[][] values = new double[count][names.size()];
        int[] lines = new int[count];
        List<Period.Parsed> dates = new ArrayList<>(count);
        List<String> dateTexts = new ArrayList<>(count);
        for (int t = 0; t < count; t++) {
            CsvSeries.RawRow row = rows.get(t);
            lines[t] = row.line();
            if (row.cells().size() != names.size() + 1) {
                throw InputException.in(file).line(row.line()).column(Math.min(row.cells().size(), names.size() + 1) + 1,
                        null).problem("this row has " + row.cells().size() + " cells but the header names "
                                + names.size() + " series, so the row needs " + (names.size() + 1) + " (date first)",
                        "give every row a date and one value per series; a row cut short is often a truncated"
                                + " download: fetch the file again");
            }
            Period.Parsed date = CsvSeries.parseDate(file, row, dateName, dates.isEmpty() ? null : dates.get(0),
                    rows.get(0).line());
            if (!notations.contains(date.notation())) {
                throw InputException.in(file).line(row.line()).column(1, dateName).problem(
                        "the date " + date.text() + " is written as " + date.notation().shape
                                + ", which this layout does not use",
                        "write dates as " + notations.stream().map(n -> n.shape).collect(Collectors.joining(" or ")));
            }
            dates.add(date);
            dateTexts.add(date.text());
            for (int j = 0; j < names.size(); j++) {
                String cell = row.cells().get(j + 1);
                values[t][j] = isMissing.test(cell) ? Double.NaN
                        : CsvSeries.parseNumber(file, row.line(), j + 2, names.get(j), cell);
            }
        }
        MissingEdges.Kept kept = MissingEdges.trim(file, values, dateTexts, lines, names, 1, codes);
        List<Period.Parsed> keptDates = dates.subList(kept.from(), kept.to());
        int[] keptLines = java.util.Arrays.copyOfRange(lines, kept.from(), kept.to());
        List<Period> index = CsvSeries.index(file, keptDates, keptLines, dateName);
        double[][] columns = new double[names.size()][index.size()];
        for (int t = 0; t < index.size(); t++) {
            for (int j = 0; j < names.size(); j++) {
                columns[j][t] = values[kept.from() + t][j];
            }
        }
        List<Period> dropped = new ArrayList<>();
        for (int t = 0; t < count; t++) {
            if (t < kept.from() || t >= kept.to()) {
                dropped.add(dates.get(t).period());
            }
        }
        SeriesTable table = new SeriesTable(file, index.get(0).frequency(), index, names, columns, keptLines);
        return new TableWithNotes(table, dropped, kept.notes());
    }
}
