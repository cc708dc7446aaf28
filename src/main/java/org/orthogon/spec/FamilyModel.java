package org.orthogon.spec;

import java.util.Map;
import org.orthogon.moments.ObservationErrors;

/**
 * What a family's {@link ModelSpec#assemble} returns: its pricing errors on the aligned sample, the
 * alignment (for the instruments and the dates), and its default start values by parameter name
 * (parameters not listed start at 0).
 */
public record FamilyModel(ObservationErrors errors, DataLoader.Aligned aligned, Map<String, Double> defaultStarts) {
    public FamilyModel {
        defaultStarts = Map.copyOf(defaultStarts);
    }
}
