package org.orthogon.spec;

import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.ParameterBounds;
import java.util.List;

/**
 * A model file's run: the spec in force, its prepared moments and the fit. Every command that
 * estimates goes through {@link #of(RunSpec)}, so `fit`, `compare` and `stability` estimate alike.
 */
public record FittedRun(RunSpec spec, PreparedRun prepared, GmmFit fit) {

    /** A Wald test of the restrictions written in the model file or on the command line. */
    public record RestrictionTest(String restrictions, ChiSquareTest test) {
    }

    /**
     * Wald tests of every restriction of the [estimation] section (and --restrict), at the estimate.
     * The restrictions were parsed when the run was prepared, so none is refused here.
     */
    public List<RestrictionTest> restrictionTests() {
        return spec.estimation().restrictions().stream()
                .map(text -> new RestrictionTest(text, fit.waldTest(text))).toList();
    }

    /** Reads the data of {@code spec}, builds its moments and estimates them with its [estimation] choices. */
    public static FittedRun of(RunSpec spec) {
        PreparedRun prepared = ModelAssembler.prepare(spec);
        return new FittedRun(spec, prepared, estimate(spec, prepared));
    }

    /** Estimates prepared moments with the spec's [estimation] choices. */
    public static GmmFit estimate(RunSpec spec, PreparedRun prepared) {
        return GmmEstimator.estimate(prepared.moments(), prepared.startValues(), options(spec, prepared));
    }

    /**
     * The estimator options the spec means for these moments: the [estimation] section, and the bounds
     * the preparation resolved (the family's defaults, such as β &gt; 0 for the consumption families,
     * and the [model] bounds).
     */
    public static GmmOptions options(RunSpec spec, PreparedRun prepared) {
        RunSpec.EstimationSpec e = spec.estimation();
        List<String> names = prepared.moments().parameterNames();
        return new GmmOptions(e.method(), e.longRunOptions())
                .withInitialWeight(e.initialWeight())
                .withBounds(ParameterBounds.byName(names, prepared.bounds()))
                .withMaxIterations(e.maxIterations())
                .withConfidenceLevel(e.confidenceLevel())
                .withHjSimulation(e.hjSeed(), e.hjDraws())
                .withSmallSample(e.smallSample());
    }
}
