package org.orthogon.data;

import java.util.Locale;

/**
 * How often a series is observed. Daily and weekly data are out of scope: asset-pricing tests with
 * consumption or macro series live at monthly, quarterly or annual frequency.
 */
public enum Frequency {
    /** Twelve periods a year. */
    MONTHLY(12),
    /** Four periods a year. */
    QUARTERLY(4),
    /** One period a year. */
    ANNUAL(1);

    private final int periodsPerYear;

    Frequency(int periodsPerYear) {
        this.periodsPerYear = periodsPerYear;
    }

    /** The number of periods in a calendar year: 12, 4 or 1. */
    public int periodsPerYear() {
        return periodsPerYear;
    }

    /** The number of months one period spans: 1, 3 or 12. */
    public int monthsPerPeriod() {
        return 12 / periodsPerYear;
    }

    /** True if every period of {@code coarser} is made of whole periods of this frequency. */
    public boolean isFinerThan(Frequency coarser) {
        return periodsPerYear > coarser.periodsPerYear;
    }

    /** The lower-case word used in messages and output, e.g. "monthly". */
    public String id() {
        return name().toLowerCase(Locale.ROOT);
    }
}
