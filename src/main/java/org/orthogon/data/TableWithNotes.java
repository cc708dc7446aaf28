package org.orthogon.data;

import java.util.List;

/**
 * A table produced by a transform or an importer that had to leave rows out, with an account of
 * them. Rows are only ever left out at the edges of the sample (never silently inside it).
 *
 * @param table       the result
 * @param droppedRows the dates that were left out, oldest first
 * @param notes       one sentence per reason, naming the file, for the run's report
 */
public record TableWithNotes(SeriesTable table, List<Period> droppedRows, List<String> notes) {

    /** Takes private copies of the lists. */
    public TableWithNotes {
        droppedRows = List.copyOf(droppedRows);
        notes = List.copyOf(notes);
    }
}
