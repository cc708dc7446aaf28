package org.orthogon.spec;

import java.util.Map;
import java.util.Optional;
import org.orthogon.moments.ObservationErrors;
import org.orthogon.twopass.FactorSample;

/**
 * What a family's {@link ModelSpec#assemble} returns: its pricing errors on the aligned sample, the
 * alignment (for the instruments and the dates), its default start values by parameter name
 * (parameters not listed start at 0), and, for linear factor models, the excess returns and factors
 * on the moment rows that the two-pass regressions and the risk premia use.
 */
public record FamilyModel(ObservationErrors errors, DataLoader.Aligned aligned, Map<String, Double> defaultStarts,
        Optional<FactorSample> factorSample) {
    public FamilyModel {
        defaultStarts = Map.copyOf(defaultStarts);
    }

    /** A family with no factor sample. */
    public FamilyModel(ObservationErrors errors, DataLoader.Aligned aligned, Map<String, Double> defaultStarts) {
        this(errors, aligned, defaultStarts, Optional.empty());
    }
}
