package org.orthogon.report;

import java.util.List;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.ConfidenceInterval;
import org.orthogon.gmm.GmmDiagnostics;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.gmm.PricingError;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.SampleInfo;
import org.orthogon.spec.Warning;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * The results JSON described in docs/output.md. Field names are a contract: add, never rename. Numbers
 * are decimals at full double precision; a value that does not exist (a p-value with zero degrees
 * of freedom) is written as null.
 */
public final class JsonResults {
    private JsonResults() {
    }

    /** An empty JSON object to fill. */
    public static ObjectNode newObject() {
        return JsonNodeFactory.instance.objectNode();
    }

    /** The results object of one fit. */
    public static ObjectNode fit(RunSpec spec, SampleInfo sample, GmmFit fit) {
        ObjectNode root = JsonNodeFactory.instance.objectNode();
        root.put("title", spec.title());
        root.put("family", spec.model().family().id());
        root.put("method", fit.method().id());
        ObjectNode sampleNode = root.putObject("sample");
        sampleNode.put("start", sample.start());
        sampleNode.put("end", sample.end());
        sampleNode.put("observations", sample.observations());
        sampleNode.put("frequency", sample.frequency());
        ObjectNode longRun = root.putObject("long_run_covariance");
        longRun.put("kernel", fit.longRun().kernel().id());
        number(longRun, "bandwidth", fit.longRun().bandwidth());
        longRun.put("prewhitened", fit.longRun().prewhitened());
        longRun.put("centered", fit.longRun().centered());
        // T/(T-P) is always reported, applied only when the model file asks (off by default).
        longRun.put("small_sample_adjusted", spec.estimation().smallSample());
        number(longRun, "small_sample_factor", LongRunCovariance.smallSampleFactor(fit.observations(),
                fit.parameters().size()));
        java.util.Optional<BetaPricingView> beta = BetaPricingView.of(spec, fit);
        List<ConfidenceInterval> intervals = fit.confidenceIntervals();
        int headline = beta.map(view -> view.headline().size()).orElse(fit.parameters().size());
        parameters(root.putArray("parameters"), fit, intervals, 0, headline);
        if (beta.isPresent()) {
            // a and β of every asset: many rows, so they stand apart from the cross-sectional coefficients.
            parameters(root.putArray("time_series_parameters"), fit, intervals, headline, fit.parameters().size());
            ObjectNode system = root.putObject("beta_pricing");
            system.put("cross_section", beta.get().crossSection());
            system.put("intercept", beta.get().intercept());
            system.put("time_series_moments", beta.get().timeSeriesMoments());
        }
        number(root, "confidence_level", fit.confidenceLevel());
        test(root.putObject("overidentification"), fit.overidentification());
        ArrayNode errors = root.putArray("pricing_errors");
        for (PricingError e : beta.map(BetaPricingView::pricingErrors).orElse(fit.pricingErrors())) {
            ObjectNode node = errors.addObject();
            node.put("asset", e.asset());
            number(node, "error", e.error());
            number(node, "std_error", e.stdError());
            number(node, "t_stat", e.tStat());
        }
        test(root.putObject("pricing_errors_joint"), fit.pricingErrorsJoint());
        fit.hj().ifPresent(hj -> {
            ObjectNode node = root.putObject("hj_distance");
            number(node, "value", hj.value());
            number(node, "p_value", hj.pValue());
            node.put("p_value_method", hj.method().id());
            node.put("seed", hj.seed());
            node.put("draws", hj.draws());
        });
        GmmDiagnostics d = fit.diagnostics();
        ObjectNode diagnostics = root.putObject("diagnostics");
        number(diagnostics, "condition_s", d.conditionS());
        number(diagnostics, "condition_dwd", d.conditionDWD());
        diagnostics.put("moments", d.moments());
        diagnostics.put("observations", d.observations());
        diagnostics.put("parameters", d.parameters());
        diagnostics.put("solver_iterations", d.solverIterations());
        diagnostics.put("weight_updates", d.weightUpdates());
        diagnostics.put("converged", d.converged());
        ArrayNode atBounds = diagnostics.putArray("parameters_at_bounds");
        d.parametersAtBounds().forEach(atBounds::add);
        number(diagnostics, "smallest_singular_value_scaled_d", d.smallestSingularValue());
        diagnostics.put("clean", d.clean());
        ArrayNode identification = diagnostics.putArray("identification_problems");
        d.identificationProblems().forEach(identification::add);
        ArrayNode warnings = root.putArray("warnings");
        fit.warnings().forEach(warnings::add);
        root.put("caution", Caution.TEXT);
        return root;
    }

    private static void parameters(ArrayNode array, GmmFit fit, List<ConfidenceInterval> intervals, int from, int to) {
        for (int i = from; i < to; i++) {
            ParameterEstimate p = fit.parameters().get(i);
            ObjectNode node = array.addObject();
            node.put("name", p.name());
            number(node, "estimate", p.estimate());
            number(node, "std_error", p.stdError());
            number(node, "t_stat", p.tStat());
            number(node, "p_value", p.pValue());
            number(node, "conf_low", intervals.get(i).lower());
            number(node, "conf_high", intervals.get(i).upper());
        }
    }

    /** Adds the Wald tests of the model file's restrictions as the field "restrictions". */
    public static void addRestrictions(ObjectNode results, List<FittedRun.RestrictionTest> tests) {
        ArrayNode array = results.putArray("restrictions");
        for (FittedRun.RestrictionTest restriction : tests) {
            ObjectNode node = array.addObject();
            node.put("restrictions", restriction.restrictions());
            number(node, "statistic", restriction.test().statistic());
            node.put("df", restriction.test().df());
            number(node, "p_value", restriction.test().pValue());
        }
    }

    /**
     * Adds the warnings found while the model file and its data were prepared as the field
     * "input_warnings": [{"code", "text"}] (codes such as "many-moments" are stable; scripts may match them).
     */
    public static void addInputWarnings(ObjectNode results, List<Warning> warnings) {
        ArrayNode array = results.putArray("input_warnings");
        for (Warning warning : warnings) {
            ObjectNode node = array.addObject();
            node.put("code", warning.code());
            node.put("text", warning.text());
        }
    }

    /** Adds the risk premia λ = Σ_F b of the demeaned linear SDF as "risk_premia": [{"factor", "estimate", "std_error"}]. */
    public static void addRiskPremia(ObjectNode results, FittedRun.RiskPremiumEstimates premia) {
        ArrayNode array = results.putArray("risk_premia");
        for (int k = 0; k < premia.factors().size(); k++) {
            ObjectNode node = array.addObject();
            node.put("factor", premia.factors().get(k));
            number(node, "estimate", premia.estimates()[k]);
            number(node, "std_error", premia.stdErrors()[k]);
        }
    }

    /**
     * Adds Windmeijer's (2005) corrected standard errors: "std_error_windmeijer" on every parameter (null where
     * the correction does not apply) and "windmeijer_correction" with the first-step estimate and bandwidth it
     * used, or the reason it does not apply.
     */
    public static void addWindmeijer(ObjectNode results, GmmFit fit,
            java.util.Optional<org.orthogon.gmm.WindmeijerCorrection.Result> correction) {
        ArrayNode parameters = (ArrayNode) results.get("parameters");
        ObjectNode node = results.putObject("windmeijer_correction");
        for (int i = 0; i < parameters.size(); i++) {
            ObjectNode parameter = (ObjectNode) parameters.get(i);
            if (correction.isPresent()) {
                number(parameter, "std_error_windmeijer", correction.get().stdErrors()[i]);
            } else {
                parameter.putNull("std_error_windmeijer");
            }
        }
        if (correction.isEmpty()) {
            node.put("applied", false);
            node.put("reason", org.orthogon.gmm.WindmeijerCorrection.notApplicable(fit).orElse(""));
            return;
        }
        node.put("applied", true);
        ObjectNode first = node.putObject("first_step_estimates");
        double[] theta = correction.get().firstStep();
        for (int i = 0; i < theta.length; i++) {
            number(first, fit.parameters().get(i).name(), theta[i]);
        }
        number(node, "bandwidth_held_fixed", correction.get().bandwidth());
    }

    /** Pretty-printed JSON text with a final newline. */
    public static String text(ObjectNode node) {
        return JsonText.of(node) + "\n";
    }

    private static void test(ObjectNode node, ChiSquareTest test) {
        node.put("kind", test.kind());
        number(node, "statistic", test.statistic());
        node.put("df", test.df());
        number(node, "p_value", test.pValue());
    }

    static void number(ObjectNode node, String field, double value) {
        if (Double.isFinite(value)) {
            node.put(field, value);
        } else {
            node.putNull(field);
        }
    }

    /** Names of the top-level fields every fit object carries (for the contract test). */
    public static List<String> contractFields() {
        return List.of("title", "family", "method", "sample", "long_run_covariance", "parameters",
                "overidentification", "pricing_errors", "pricing_errors_joint");
    }
}
