package org.orthogon.spec;

import java.nio.file.Path;
import java.util.List;
import org.orthogon.data.SeriesTable;

/**
 * One data file as it was read: what role the model file gave it and what it holds.
 *
 * @param role      the [data] key that named the file (returns, riskfree, factors, macro, instruments)
 * @param file      the path
 * @param frequency "monthly", "quarterly" or "annual"
 * @param first     label of the first date
 * @param last      label of the last date
 * @param rows      number of dated rows
 * @param columns   the file's series names
 */
public record InputSummary(String role, Path file, String frequency, String first, String last, int rows,
        List<String> columns) {
    public InputSummary {
        columns = List.copyOf(columns);
    }

    static InputSummary of(String role, SeriesTable table) {
        return new InputSummary(role, table.source(), table.frequency().id(), table.dates().get(0).label(),
                table.dates().get(table.rows() - 1).label(), table.rows(), table.columnNames());
    }
}
