package org.orthogon.spec;

import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.DeltaMethod;
import org.orthogon.gmm.RiskPremia;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.IdentificationDiagnostics;
import org.orthogon.gmm.ManyMoments;
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

    /**
     * The factor risk premia λ = Σ_F b of the linear SDF in demeaned factors, with standard errors by the
     * delta method on (b, Σ_F) jointly ({@link RiskPremia#withEstimatedCovariance}: the influence of b uses
     * the fit's own weight, S^{-1} at the estimate for the efficient methods); empty for other families and
     * forms, and when instruments scale the moments. Named by factor.
     */
    public java.util.Optional<RiskPremiumEstimates> riskPremia() {
        if (!(spec.model() instanceof LinearFactorSpec linear) || linear.form() != LinearFactorSpec.Form.DEMEANED
                || !linear.instrumentColumns().isEmpty() || prepared.factorSample().isEmpty()) {
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
        GmmFit fit = estimate(spec, prepared);
        // The fit's many-moments warning uses the bandwidth actually selected; the preparation's is then redundant.
        boolean fitWarns = fit.warnings().stream().anyMatch(ManyMoments::describes);
        return new FittedRun(spec, fitWarns ? prepared.withoutWarning("many-moments") : prepared, fit);
    }

    /**
     * Estimates prepared moments with the spec's [estimation] choices, and assesses the identification of the
     * estimate ({@link IdentificationDiagnostics}) with the economic ranges of the family
     * ({@link ModelSpec#economicRanges()}).
     */
    public static GmmFit estimate(RunSpec spec, PreparedRun prepared) {
        GmmFit fit = GmmEstimator.estimate(prepared.moments(), prepared.startValues(), options(spec, prepared));
        return IdentificationDiagnostics.assess(prepared.moments(), fit, spec.model().economicRanges());
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
