package org.orthogon.moments;

import java.util.List;

/**
 * The names every family carries: its parameters, in the order of θ, and the assets whose errors it
 * produces, in column order. Kept here once so each family holds only its economics.
 */
abstract class NamedErrors implements ObservationErrors {
    final List<String> parameterNames;
    final List<String> assetNames;

    NamedErrors(List<String> parameterNames, List<String> assetNames) {
        this.parameterNames = List.copyOf(parameterNames);
        this.assetNames = List.copyOf(assetNames);
    }

    @Override
    public final List<String> parameterNames() {
        return parameterNames;
    }

    @Override
    public final List<String> assetNames() {
        return assetNames;
    }
}
