package org.orthogon.analysis;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.Inference;
import org.orthogon.gmm.WeightedMinimizer;
import org.orthogon.moments.MomentModel;

/**
 * Compares several models fitted to the same test assets over the same sample: the cross-sectional
 * fit of each, and for every pair in which one model is the other with some parameters fixed at zero,
 * the difference test of Newey and West (1987, "Hypothesis testing with efficient method of moments
 * estimation", International Economic Review 28): both models are estimated with the unrestricted
 * model's efficient weight W_u = S_u^{-1}, and T g_r' W_u g_r - T g_u' W_u g_u is χ²(P_u - P_r) under the
 * restriction. Using one weight for both makes the statistic non-negative by construction.
 */
public final class ModelComparison {
    private ModelComparison() {
    }

    /** One fitted model in a comparison. */
    public record Entry(String title, MomentModel model, double[] start, GmmFit fit) {
        public Entry {
            start = start.clone();
        }

        @Override
        public double[] start() {
            return start.clone();
        }
    }

    /** A model's row of the comparison. */
    public record ModelSummary(String title, GmmFit fit, CrossSectionFit crossSection) {
    }

    /**
     * The difference test for a nested pair.
     *
     * @param restricted   title of the model with fewer parameters
     * @param unrestricted title of the model that nests it
     * @param test         the χ² test of the restriction
     */
    public record NestedTest(String restricted, String unrestricted, ChiSquareTest test) {
    }

    /** The whole comparison. */
    public record Result(List<ModelSummary> models, List<NestedTest> nestedTests) {
        public Result {
            models = List.copyOf(models);
            nestedTests = List.copyOf(nestedTests);
        }
    }

    /** Compares the entries; they must share test assets and observations (checked by the caller with file context). */
    public static Result compare(List<Entry> entries) {
        List<ModelSummary> summaries = new ArrayList<>();
        for (Entry entry : entries) {
            summaries.add(new ModelSummary(entry.title(), entry.fit(),
                    CrossSectionFit.of(entry.model(), entry.fit().estimates())));
        }
        List<NestedTest> nested = new ArrayList<>();
        for (Entry restricted : entries) {
            for (Entry unrestricted : entries) {
                if (restricted != unrestricted && nests(unrestricted.model(), restricted.model())) {
                    nested.add(new NestedTest(restricted.title(), unrestricted.title(),
                            differenceTest(restricted, unrestricted)));
                }
            }
        }
        return new Result(summaries, nested);
    }

    /**
     * True when {@code restricted} is {@code unrestricted} with some parameters fixed at zero: the same
     * moments, and a strict subset of the parameter names. This holds for linear SDFs whose factor set is
     * a subset of the other's, where dropping a factor is setting its b to zero.
     */
    public static boolean nests(MomentModel unrestricted, MomentModel restricted) {
        if (!unrestricted.momentNames().equals(restricted.momentNames())
                || unrestricted.observations() != restricted.observations()
                || !unrestricted.isLinear() || !restricted.isLinear()) {
            return false;
        }
        Set<String> bigger = new HashSet<>(unrestricted.parameterNames());
        return bigger.size() > restricted.parameterCount() && bigger.containsAll(restricted.parameterNames());
    }

    /** T g_r' W_u g_r - T g_u' W_u g_u, both minimised with W_u = S_u^{-1} at the unrestricted estimate. */
    static ChiSquareTest differenceTest(Entry restricted, Entry unrestricted) {
        DMatrixRMaj weight = Inference.efficientWeight(unrestricted.fit().longRun().covariance());
        double qUnrestricted = WeightedMinimizer.minimize(unrestricted.model(), weight, unrestricted.fit().estimates())
                .objective();
        double qRestricted = WeightedMinimizer.minimize(restricted.model(), weight, restricted.fit().estimates())
                .objective();
        int df = unrestricted.model().parameterCount() - restricted.model().parameterCount();
        return ChiSquareTest.of("newey-west-difference", qRestricted - qUnrestricted, df);
    }
}
