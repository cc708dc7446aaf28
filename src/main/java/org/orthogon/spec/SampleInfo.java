package org.orthogon.spec;

/**
 * The sample a run used, after alignment and any compounding.
 *
 * @param start        label of the first period whose moments enter g_T
 * @param end          label of the last period
 * @param observations T
 * @param frequency    "monthly", "quarterly" or "annual"
 */
public record SampleInfo(String start, String end, int observations, String frequency) {
}
