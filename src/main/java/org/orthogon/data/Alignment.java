package org.orthogon.data;

import java.util.ArrayList;
import java.util.List;

/**
 * Puts tables from several files on one sample: the dates all of them cover, optionally narrowed to
 * requested bounds. Nothing is converted here; tables of different frequencies are refused, so a
 * frequency change is always an explicit step (see {@link ReturnTransforms#compound}).
 */
public final class Alignment {
    private Alignment() {
    }

    /**
     * The common sample of {@code tables}: from the latest first date to the earliest last date,
     * narrowed to the bounds if given. Bounds of another frequency are converted with
     * {@link Period#asStart} and {@link Period#asEnd}.
     *
     * @param startOrNull inclusive first date, or null for the overlap's first date
     * @param endOrNull   inclusive last date, or null for the overlap's last date
     * @throws InputException if the tables differ in frequency (naming both files), a bound lies
     *                        outside a file's dates (naming the file and its first and last date),
     *                        the start is after the end, or the overlap is empty
     */
    public static AlignedSample align(List<SeriesTable> tables, Period startOrNull, Period endOrNull) {
        if (tables.isEmpty()) {
            throw new IllegalArgumentException("no tables to align");
        }
        SeriesTable reference = tables.get(0);
        Frequency frequency = reference.frequency();
        for (SeriesTable table : tables) {
            if (table.frequency() != frequency) {
                throw InputException.in(table.source()).problem(
                        "this file is " + table.frequency().id() + " but " + reference.source() + " is "
                                + frequency.id() + "; files of different frequencies are not aligned silently",
                        "bring " + (table.frequency().isFinerThan(frequency) ? table.source() : reference.source())
                                + " to " + coarser(table.frequency(), frequency).id() + " first: compound its gross"
                                + " returns (returns are compounded, never averaged)");
            }
            if (table.rows() == 0) {
                throw InputException.in(table.source()).problem("the table has no rows",
                        "use a file with data rows");
            }
        }
        Period start = startOrNull == null ? null : startOrNull.asStart(frequency);
        Period end = endOrNull == null ? null : endOrNull.asEnd(frequency);
        if (start != null && end != null && start.compareTo(end) > 0) {
            throw InputException.general().problem(
                    "the sample start " + start + " is after the sample end " + end,
                    "swap the two bounds or correct one of them");
        }

        SeriesTable latestStart = reference;
        SeriesTable earliestEnd = reference;
        for (SeriesTable table : tables) {
            if (first(table).compareTo(first(latestStart)) > 0) {
                latestStart = table;
            }
            if (last(table).compareTo(last(earliestEnd)) < 0) {
                earliestEnd = table;
            }
            if (start != null && (start.compareTo(first(table)) < 0 || start.compareTo(last(table)) > 0)) {
                throw outside(table, "start", start);
            }
            if (end != null && (end.compareTo(first(table)) < 0 || end.compareTo(last(table)) > 0)) {
                throw outside(table, "end", end);
            }
        }
        Period overlapStart = first(latestStart);
        Period overlapEnd = last(earliestEnd);
        if (overlapStart.compareTo(overlapEnd) > 0) {
            throw InputException.in(latestStart.source()).problem(
                    "the files have no date in common: this file starts at " + overlapStart + ", after "
                            + earliestEnd.source() + " ends at " + overlapEnd,
                    "use files that cover a common period");
        }

        List<String> notes = new ArrayList<>();
        Period sampleStart;
        if (start == null) {
            sampleStart = overlapStart;
            notes.add("the files share dates from " + sampleStart + ", the first date of "
                    + latestStart.source().getFileName() + (tables.size() > 1 ? " (the latest-starting file)" : ""));
        } else {
            // A start inside every file is never before the overlap, so the request stands as given.
            sampleStart = start;
            notes.add("sample starts " + sampleStart + ", as requested");
        }
        Period sampleEnd;
        if (end == null) {
            sampleEnd = overlapEnd;
            notes.add("the files share dates to " + sampleEnd + ", the last date of "
                    + earliestEnd.source().getFileName() + (tables.size() > 1 ? " (the earliest-ending file)" : ""));
        } else {
            sampleEnd = end;
            notes.add("sample ends " + sampleEnd + ", as requested");
        }

        List<SeriesTable> cut = new ArrayList<>(tables.size());
        List<Period> dates = null;
        for (SeriesTable table : tables) {
            SeriesTable part = table.between(sampleStart, sampleEnd);
            if (dates == null) {
                dates = part.dates();
            } else if (!part.dates().equals(dates)) {
                throw InputException.in(part.source()).problem(
                        "this file's dates between " + sampleStart + " and " + sampleEnd + " differ from those of "
                                + cut.get(0).source() + " (" + part.rows() + " rows against " + dates.size() + ")",
                        "fill the gaps so that every period of the sample has a row in every file");
            }
            cut.add(part);
        }
        return new AlignedSample(dates, cut, notes);
    }

    private static Frequency coarser(Frequency a, Frequency b) {
        return a.isFinerThan(b) ? b : a;
    }

    private static Period first(SeriesTable table) {
        return table.dates().get(0);
    }

    private static Period last(SeriesTable table) {
        return table.dates().get(table.rows() - 1);
    }

    private static InputException outside(SeriesTable table, String which, Period bound) {
        return InputException.in(table.source()).problem(
                "the requested sample " + which + " " + bound + " lies outside this file's dates, which run from "
                        + first(table) + " to " + last(table),
                "choose a " + which + " between " + first(table) + " and " + last(table)
                        + " (and inside every other file), or extend the file");
    }
}
