package org.orthogon.spec;

import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;

/**
 * A model file's run: the spec in force, its prepared moments and the fit. Every command that
 * estimates goes through {@link #of(RunSpec)}, so `fit`, `compare` and `stability` estimate alike.
 */
public record FittedRun(RunSpec spec, PreparedRun prepared, GmmFit fit) {

    /** Reads the data of {@code spec}, builds its moments and estimates them with its [estimation] choices. */
    public static FittedRun of(RunSpec spec) {
        PreparedRun prepared = ModelAssembler.prepare(spec);
        return new FittedRun(spec, prepared, estimate(spec, prepared));
    }

    /** Estimates prepared moments with the spec's [estimation] choices. */
    public static GmmFit estimate(RunSpec spec, PreparedRun prepared) {
        return GmmEstimator.estimate(prepared.moments(), prepared.startValues(), options(spec));
    }

    /** The estimator options the spec's [estimation] section means. */
    public static GmmOptions options(RunSpec spec) {
        return new GmmOptions(spec.estimation().method(), spec.estimation().longRunOptions());
    }
}
