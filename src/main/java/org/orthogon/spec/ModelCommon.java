package org.orthogon.spec;

import java.util.List;
import java.util.Map;

/**
 * The [model] keys every family reads.
 *
 * @param instrumentColumns columns of the [data] instruments file that scale the moments, f_t = e_t ⊗ z_{t-1}
 *                          ("const" is the built-in column of ones)
 * @param startValues       start values by parameter name; the family's defaults fill the rest
 * @param bounds            closed bounds [lower, upper] by parameter name
 */
public record ModelCommon(List<String> instrumentColumns, Map<String, Double> startValues,
        Map<String, double[]> bounds) {
    /** The keys of this record, as the model file spells them. */
    public static final List<String> KEYS = List.of("family", "instrument_columns", "start_values", "bounds");

    public ModelCommon {
        instrumentColumns = List.copyOf(instrumentColumns);
        startValues = Map.copyOf(startValues);
        bounds = Map.copyOf(bounds);
    }
}
