package org.orthogon.robust;

import java.util.List;

/**
 * A weak-identification-robust confidence set for one parameter: a union of intervals within a stated
 * search range, possibly empty.
 *
 * @param parameter     the parameter's name
 * @param level         confidence level
 * @param method        "S" (Stock and Wright 2000) or "K" (Kleibergen 2005)
 * @param kind          "concentrated" (the others minimise S at each value) or "joint-projection" (the joint
 *                      set's projection on this axis, at the joint grid's resolution)
 * @param df            degrees of freedom of the chi-square critical value
 * @param criticalValue the chi-square quantile at the level
 * @param searchLow     lower end of the search range
 * @param searchHigh    upper end of the search range
 * @param intervals     the set, in increasing order; an end that is null is open: the set reaches the end of
 *                      the search range there and may go on beyond it
 * @param containsEstimate whether the point estimate lies in the set
 * @param undefinedPoints grid points where the statistic could not be computed (counted outside the set)
 * @param notes         why an end is open or where it stops, why the set is empty, and what to read with care
 */
public record RobustSet(String parameter, double level, String method, String kind, int df, double criticalValue,
        double searchLow, double searchHigh, List<Interval> intervals, boolean containsEstimate, int undefinedPoints,
        List<String> notes) {
    public RobustSet {
        intervals = List.copyOf(intervals);
        notes = List.copyOf(notes);
    }

    /** One interval; null ends are open (unbounded within what was searched). */
    public record Interval(Double lower, Double upper) {
        public boolean contains(double x) {
            return (lower == null || x >= lower) && (upper == null || x <= upper);
        }
    }

    /** True when no value of the search range is in the set. */
    public boolean isEmpty() {
        return intervals.isEmpty();
    }
}
