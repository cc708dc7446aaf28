package org.orthogon.bootstrap;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A stated alternative for a Monte Carlo power study: pricing errors added to named moments of the
 * bootstrap population (E*[f*_i(θ̂)] = δ_i instead of 0), and shifts of the values the parameter t tests
 * test (H0: θ_p = θ̂_p + Δ_p while the truth stays θ̂_p). Empty maps are the null.
 *
 * @param pricingErrors   moment name → δ, in the moment's units (decimals per period)
 * @param parameterShifts parameter name → Δ
 */
public record Alternative(Map<String, Double> pricingErrors, Map<String, Double> parameterShifts) {
    public Alternative {
        pricingErrors = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(pricingErrors));
        parameterShifts = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(parameterShifts));
    }

    /** The null: no pricing error, every t test of the truth. */
    public static Alternative none() {
        return new Alternative(Map.of(), Map.of());
    }

    /** Whether this is the null. */
    public boolean isNull() {
        return pricingErrors.isEmpty() && parameterShifts.isEmpty();
    }

    /** δ in moment order. */
    double[] delta(List<String> momentNames) {
        double[] delta = new double[momentNames.size()];
        pricingErrors.forEach((name, value) -> delta[requireIndex(momentNames, name, "moment")] = value);
        return delta;
    }

    /** Δ in parameter order. */
    double[] shifts(List<String> parameterNames) {
        double[] shift = new double[parameterNames.size()];
        parameterShifts.forEach((name, value) -> shift[requireIndex(parameterNames, name, "parameter")] = value);
        return shift;
    }

    private static int requireIndex(List<String> names, String name, String what) {
        int at = names.indexOf(name);
        if (at < 0) {
            throw new IllegalArgumentException("no " + what + " named \"" + name + "\"");
        }
        return at;
    }
}
