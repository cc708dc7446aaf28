package org.orthogon.spec;

import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.DeltaMethod;
import org.orthogon.gmm.RiskPremia;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.IdentificationDiagnostics;
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

    /**
     * The factor risk premia λ = Σ_F b of the linear SDF in demeaned factors, with standard errors by the
     * delta method on (b, Σ_F) jointly ({@link RiskPremia#withEstimatedCovariance}: the influence of b uses
     * the fit's own weight, S^{-1} at the estimate for the efficient methods); empty for other families and
     * forms, and when instruments scale the moments. Named by factor.
     */
    public java.util.Optional<RiskPremiumEstimates> riskPremia() {
        if (spec.model().family() != RunSpec.Family.LINEAR_FACTOR || !spec.model().form().equals("demeaned")
                || !spec.model().instrumentColumns().isEmpty() || prepared.factorSample().isEmpty()) {
            return java.util.Optional.empty();
        }
        var sample = prepared.factorSample().get();
        List<String> coefficients = sample.factors().stream().map(f -> "b_" + f).toList();
        DeltaMethod.Transformed premia = RiskPremia.withEstimatedCovariance(sample.factorValues(), prepared.moments(),
                fit, coefficients);
        return java.util.Optional.of(new RiskPremiumEstimates(sample.factors(), premia.values(),
                premia.standardErrors()));
    }

    /** Risk premia per factor with their standard errors. */
    public record RiskPremiumEstimates(List<String> factors, double[] estimates, double[] stdErrors) {
        public RiskPremiumEstimates {
            factors = List.copyOf(factors);
            estimates = estimates.clone();
            stdErrors = stdErrors.clone();
        }

        @Override
        public double[] estimates() {
            return estimates.clone();
        }

        @Override
        public double[] stdErrors() {
            return stdErrors.clone();
        }
    }

    /** Reads the data of {@code spec}, builds its moments and estimates them with its [estimation] choices. */
    public static FittedRun of(RunSpec spec) {
        PreparedRun prepared = ModelAssembler.prepare(spec);
        return new FittedRun(spec, prepared, estimate(spec, prepared));
    }

    /**
     * Estimates prepared moments with the spec's [estimation] choices, and assesses the identification of the
     * estimate ({@link IdentificationDiagnostics}) with the economic ranges of the family.
     */
    public static GmmFit estimate(RunSpec spec, PreparedRun prepared) {
        GmmFit fit = GmmEstimator.estimate(prepared.moments(), prepared.startValues(), options(spec, prepared));
        return IdentificationDiagnostics.assess(prepared.moments(), fit, economicRanges(spec.model().family()));
    }

    /**
     * The economic ranges of a family's parameters: for the utility families the discount factor β in (0, 1.1)
     * (a quarterly or monthly β above 1.1 means the agent values the future far above the present), relative risk
     * aversion γ ≥ 0, and for recursive utility the elasticity of intertemporal substitution ψ &gt; 0 (Epstein and
     * Zin 1989). The linear factor families and formula SDFs have none: their coefficients take any sign.
     */
    public static List<IdentificationDiagnostics.Range> economicRanges(RunSpec.Family family) {
        IdentificationDiagnostics.Range beta = new IdentificationDiagnostics.Range("beta", 0.0, true, 1.1, true,
                "the subjective discount factor");
        IdentificationDiagnostics.Range gamma = new IdentificationDiagnostics.Range("gamma", 0.0, false,
                Double.POSITIVE_INFINITY, true, "relative risk aversion");
        return switch (family) {
            case POWER_UTILITY -> List.of(beta, gamma);
            case RECURSIVE_UTILITY -> List.of(beta, gamma, new IdentificationDiagnostics.Range("psi", 0.0, true,
                    Double.POSITIVE_INFINITY, true, "the elasticity of intertemporal substitution"));
            case LINEAR_FACTOR, EXPRESSION -> List.of();
        };
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
