package org.orthogon.data;

import java.util.List;

/**
 * Gross returns compounded to a coarser frequency, with an account of what was left out.
 *
 * @param table                 the compounded gross returns
 * @param droppedPartialPeriods the periods at the sample edges that the input covered only in part
 *                              and that were therefore dropped (at most one at each edge)
 * @param notes                 one sentence per dropped period, for the run's report
 */
public record CompoundedSeries(SeriesTable table, List<Period> droppedPartialPeriods, List<String> notes) {

    /** Takes private copies of the lists. */
    public CompoundedSeries {
        droppedPartialPeriods = List.copyOf(droppedPartialPeriods);
        notes = List.copyOf(notes);
    }
}
