package org.orthogon.spec;

import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.InitialWeight;
import org.orthogon.gmm.ParameterBounds;
import org.orthogon.data.InputException;
import org.orthogon.data.Suggestions;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A model file's run: the spec in force, its prepared moments and the fit. Every command that
 * estimates goes through {@link #of(RunSpec)}, so `fit`, `compare` and `stability` estimate alike.
 */
public record FittedRun(RunSpec spec, PreparedRun prepared, GmmFit fit) {

    /** A Wald test of the restrictions written in the model file or on the command line. */
    public record RestrictionTest(String restrictions, ChiSquareTest test) {
    }

    /**
     * Wald tests of every restriction of the [estimation] section (and --restrict), at the estimate; a
     * restriction that does not parse is an input error naming the model-file line and the position.
     */
    public List<RestrictionTest> restrictionTests() {
        List<RestrictionTest> tests = new java.util.ArrayList<>();
        for (String text : spec.estimation().restrictions()) {
            try {
                tests.add(new RestrictionTest(text, fit.waldTest(text)));
            } catch (IllegalArgumentException e) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("estimation", "restrictions"))
                        .problem("the restriction \"" + text + "\" cannot be tested: " + e.getMessage(),
                                "write linear restrictions over the parameters " + fit.parameterNames()
                                        + ", e.g. \"b_SIZE = 0, b_TIDE = 0\"");
            }
        }
        return tests;
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
     * The estimator options the spec means for these moments: the [estimation] section, and the
     * [model] bounds by parameter name (power and recursive utility keep beta above zero by default,
     * where their SDF is defined).
     */
    public static GmmOptions options(RunSpec spec, PreparedRun prepared) {
        RunSpec.EstimationSpec e = spec.estimation();
        List<String> names = prepared.moments().parameterNames();
        Map<String, double[]> bounds = new LinkedHashMap<>();
        if (names.contains("beta") && spec.model().family() != RunSpec.Family.LINEAR_FACTOR) {
            bounds.put("beta", new double[] {0.0, Double.POSITIVE_INFINITY});
        }
        for (Map.Entry<String, double[]> entry : spec.model().bounds().entrySet()) {
            if (!names.contains(entry.getKey())) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "bounds"))
                        .problem("bounds names \"" + entry.getKey() + "\", which is not a parameter of this model",
                                "use the parameter names " + names + Suggestions.didYouMean(entry.getKey(), names));
            }
            bounds.put(entry.getKey(), entry.getValue());
        }
        double[] start = prepared.startValues();
        for (int i = 0; i < names.size(); i++) {
            double[] range = bounds.get(names.get(i));
            if (range != null && !(start[i] >= range[0] && start[i] <= range[1])) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "start_values"))
                        .problem("the start value " + start[i] + " of " + names.get(i) + " lies outside its bounds ["
                                + range[0] + ", " + range[1] + "]", "choose a start value inside the bounds");
            }
        }
        return new GmmOptions(e.method(), e.longRunOptions())
                .withInitialWeight(InitialWeight.fromId(e.initialWeight()))
                .withBounds(ParameterBounds.byName(names, bounds))
                .withMaxIterations(e.maxIterations())
                .withConfidenceLevel(e.confidenceLevel())
                .withHjSimulation(e.hjSeed(), e.hjDraws())
                .withSmallSample(e.smallSample());
    }
}
