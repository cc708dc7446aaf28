package org.orthogon.data;

import java.util.List;

/**
 * Several tables cut to one common index.
 *
 * @param dates  the common dates
 * @param tables the input tables in input order, each cut to {@code dates}
 * @param notes  which file (or requested bound) set the start and the end, for the run's report
 */
public record AlignedSample(List<Period> dates, List<SeriesTable> tables, List<String> notes) {

    /** Takes private copies of the lists. */
    public AlignedSample {
        dates = List.copyOf(dates);
        tables = List.copyOf(tables);
        notes = List.copyOf(notes);
    }

    /** The number of common dates. */
    public int rows() {
        return dates.size();
    }
}
