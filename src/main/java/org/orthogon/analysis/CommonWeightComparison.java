package org.orthogon.analysis;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.distribution.NormalDistribution;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.EstimationException;
import org.orthogon.gmm.HansenJagannathan;
import org.orthogon.gmm.InitialWeight;
import org.orthogon.gmm.WeightedMinimizer;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * Models compared at one weight for all: each estimated with W = G^{-1}, G = E_T[x x'] the second moments of
 * the payoffs they all price, which is the Hansen-Jagannathan (1997) distance
 * δ² = min_θ g_T(θ)'G^{-1}g_T(θ) and does not depend on the model, unlike each model's own efficient weight.
 * The cross-sectional fit at that estimate is then like for like.
 *
 * <p>Tests of equal distances, Kan and Robotti (2009, "Model comparison using the Hansen-Jagannathan
 * distance", Review of Financial Studies 22, 3449-3490), with a = G^{-1}g at each model's estimate,
 * u_t = a'x_t and f_t the model's contributions:
 * <ul>
 *   <li><b>Nested</b> linear SDFs (one model is the other with the parameters θ_2 at zero): in the sample
 *       δ_r² - δ_u² = θ̂_2'[(D'G^{-1}D)^{-1}_22]^{-1}θ̂_2 exactly, and under H0 θ_2 = 0 the statistic T(δ̂_r² - δ̂_u²)
 *       converges to Σ ξ_i χ²_1, ξ the eigenvalues of [(D'G^{-1}D)^{-1}_22]^{-1} V_22, V the
 *       misspecification-robust asymptotic covariance of √T θ̂ from the influence
 *       ψ_t = -(D'G^{-1}D)^{-1}[J_t'a - D'G^{-1}x_t u_t + D'G^{-1}(f_t - g)], J_t = ∂f_t/∂θ' (the terms account for
 *       the sampling error of D and of G when the model is misspecified). The p-value is simulated.</li>
 *   <li><b>Non-nested</b>: δ̂² has influence φ_t = 2a'f_t - u_t² (up to a constant), so when the two SDFs differ
 *       √T(δ̂_1² - δ̂_2²) → N(0, long-run variance of φ_1,t - φ_2,t), two-sided. When both are linear, the SDFs
 *       are the same exactly when every parameter the two do not share is zero in both; that Wald test
 *       (robust covariance from ψ of both) is reported first: the normal test means something only when it
 *       rejects.</li>
 * </ul>
 * Long-run variances use the run's kernel and bandwidth choices on the influence series.
 */
public final class CommonWeightComparison {
    private static final NormalDistribution NORMAL = new NormalDistribution(null, 0.0, 1.0);

    private CommonWeightComparison() {
    }

    /**
     * One model at the common weight.
     *
     * @param title          the model's title
     * @param parameterNames the parameters of its distance moments
     * @param estimates      θ̂ minimising g'G^{-1}g
     * @param crossSection   pricing errors, R², mean |α| at θ̂
     * @param distance       δ̂
     * @param discountFactor m_t(θ̂), for the volatility bound
     */
    public record ModelAtCommonWeight(String title, List<String> parameterNames, double[] estimates,
            CrossSectionFit crossSection, double distance, double[] discountFactor) {
        public ModelAtCommonWeight {
            parameterNames = List.copyOf(parameterNames);
            estimates = estimates.clone();
            discountFactor = discountFactor.clone();
        }

        @Override
        public double[] estimates() {
            return estimates.clone();
        }

        @Override
        public double[] discountFactor() {
            return discountFactor.clone();
        }
    }

    /**
     * A test of equal HJ distances.
     *
     * @param first     the restricted model when nested
     * @param second    the unrestricted model when nested
     * @param nested    which limit applies
     * @param statistic nested: T(δ̂_first² - δ̂_second²); non-nested: √T(δ̂_first² - δ̂_second²)/se
     * @param pValue    nested: simulated weighted chi-square; non-nested: two-sided normal
     * @param sameSdf   non-nested linear models: the Wald test that the SDFs coincide; null otherwise
     */
    public record DistanceTest(String first, String second, boolean nested, double statistic, double pValue,
            ChiSquareTest sameSdf) {
    }

    /** The models at the common weight (those with an SDF), the pairwise tests and what was left out. */
    public record Result(List<ModelAtCommonWeight> models, List<DistanceTest> tests, List<String> notes,
            MomentModel payoffModel) {
        public Result {
            models = List.copyOf(models);
            tests = List.copyOf(tests);
            notes = List.copyOf(notes);
        }
    }

    /** Estimates every entry at the common weight and tests every pair. */
    public static Result compare(List<ModelComparison.Entry> entries, LongRunOptions longRun, long seed, int draws) {
        List<Pieces> pieces = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        for (ModelComparison.Entry entry : entries) {
            var priced = entry.model().distanceMoments();
            if (priced.isEmpty()) {
                notes.add(entry.title() + ": its moments price no payoff with an SDF, so it has no HJ distance");
                continue;
            }
            pieces.add(new Pieces(entry, priced.get()));
        }
        List<DistanceTest> tests = new ArrayList<>();
        for (int i = 0; i < pieces.size(); i++) {
            for (int j = i + 1; j < pieces.size(); j++) {
                Pieces a = pieces.get(i);
                Pieces b = pieces.get(j);
                if (!a.model.momentNames().equals(b.model.momentNames())) {
                    notes.add(a.title + " and " + b.title + " price different payoffs; their distances are not compared");
                } else if (ModelComparison.nests(b.model, a.model)) {
                    tests.add(nested(a, b, longRun, seed, draws));
                } else if (ModelComparison.nests(a.model, b.model)) {
                    tests.add(nested(b, a, longRun, seed, draws));
                } else {
                    tests.add(nonNested(a, b, longRun));
                }
            }
        }
        List<ModelAtCommonWeight> models = pieces.stream().map(p -> new ModelAtCommonWeight(p.title,
                p.model.parameterNames(), p.theta, CrossSectionFit.of(p.model, p.theta), Math.sqrt(p.squared),
                p.model.discountFactors(p.theta))).toList();
        return new Result(models, tests, notes, pieces.isEmpty() ? null : pieces.get(0).model);
    }

    private static DistanceTest nested(Pieces restricted, Pieces unrestricted, LongRunOptions longRun, long seed,
            int draws) {
        int t = unrestricted.model.observations();
        List<String> names = unrestricted.model.parameterNames();
        List<Integer> extra = new ArrayList<>();
        for (int j = 0; j < names.size(); j++) {
            if (!restricted.model.parameterNames().contains(names.get(j))) {
                extra.add(j);
            }
        }
        DMatrixRMaj v = longRunVariance(unrestricted.influence(), longRun); // of √T θ̂
        DMatrixRMaj bread = unrestricted.bread;
        int m = extra.size();
        DMatrixRMaj b22 = new DMatrixRMaj(m, m);
        DMatrixRMaj v22 = new DMatrixRMaj(m, m);
        for (int a = 0; a < m; a++) {
            for (int c = 0; c < m; c++) {
                b22.set(a, c, bread.get(extra.get(a), extra.get(c)));
                v22.set(a, c, v.get(extra.get(a), extra.get(c)));
            }
        }
        CommonOps_DDRM.invert(b22);
        DMatrixRMaj product = new DMatrixRMaj(m, m);
        CommonOps_DDRM.mult(b22, v22, product);
        double statistic = t * (restricted.squared - unrestricted.squared);
        double pValue = HansenJagannathan.weightedChiSquareUpperTail(statistic, eigenvalues(product), seed, draws);
        return new DistanceTest(restricted.title, unrestricted.title, true, statistic, pValue, null);
    }

    private static DistanceTest nonNested(Pieces a, Pieces b, LongRunOptions longRun) {
        int t = a.model.observations();
        double[] phiA = a.distanceInfluence();
        double[] phiB = b.distanceInfluence();
        DMatrixRMaj difference = new DMatrixRMaj(t, 1);
        for (int s = 0; s < t; s++) {
            difference.set(s, 0, phiA[s] - phiB[s]);
        }
        double variance = longRunVariance(difference, longRun).get(0, 0);
        double z = Math.sqrt(t) * (a.squared - b.squared) / Math.sqrt(variance);
        ChiSquareTest same = null;
        if (a.model.isLinear() && b.model.isLinear()) {
            same = sameSdf(a, b, longRun);
        }
        return new DistanceTest(a.title, b.title, false, z, 2.0 * NORMAL.cumulativeProbability(-Math.abs(z)), same);
    }

    /** Wald test that every parameter of either model that the other lacks is zero, jointly. */
    private static ChiSquareTest sameSdf(Pieces a, Pieces b, LongRunOptions longRun) {
        List<Integer> onlyA = only(a, b);
        List<Integer> onlyB = only(b, a);
        int m = onlyA.size() + onlyB.size();
        int t = a.model.observations();
        DMatrixRMaj psiA = a.influence();
        DMatrixRMaj psiB = b.influence();
        DMatrixRMaj stacked = new DMatrixRMaj(t, m);
        DMatrixRMaj estimate = new DMatrixRMaj(m, 1);
        for (int j = 0; j < onlyA.size(); j++) {
            estimate.set(j, a.theta[onlyA.get(j)]);
            for (int s = 0; s < t; s++) {
                stacked.set(s, j, psiA.get(s, onlyA.get(j)));
            }
        }
        for (int j = 0; j < onlyB.size(); j++) {
            estimate.set(onlyA.size() + j, b.theta[onlyB.get(j)]);
            for (int s = 0; s < t; s++) {
                stacked.set(s, onlyA.size() + j, psiB.get(s, onlyB.get(j)));
            }
        }
        DMatrixRMaj v = longRunVariance(stacked, longRun);
        CommonOps_DDRM.divide(v, t);
        DMatrixRMaj inverse = v.copy();
        if (!CommonOps_DDRM.invert(inverse)) {
            return new ChiSquareTest("same-sdf", Double.NaN, m, Double.NaN);
        }
        DMatrixRMaj temp = new DMatrixRMaj(m, 1);
        CommonOps_DDRM.mult(inverse, estimate, temp);
        return ChiSquareTest.of("same-sdf", CommonOps_DDRM.dot(estimate, temp), m);
    }

    private static List<Integer> only(Pieces a, Pieces b) {
        List<Integer> out = new ArrayList<>();
        List<String> names = a.model.parameterNames();
        for (int j = 0; j < names.size(); j++) {
            if (!b.model.parameterNames().contains(names.get(j))) {
                out.add(j);
            }
        }
        return out;
    }

    /** S of a T x q series by the run's long-run estimator: the asymptotic covariance of √T times its mean. */
    private static DMatrixRMaj longRunVariance(DMatrixRMaj series, LongRunOptions longRun) {
        return LongRunCovariance.estimate(series, longRun).covariance();
    }

    private static double[] eigenvalues(DMatrixRMaj a) {
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(a.numRows, false, false);
        if (!eig.decompose(a.copy())) {
            throw new IllegalStateException("eigen-decomposition of the nested distance limit failed");
        }
        double[] out = new double[a.numRows];
        for (int i = 0; i < out.length; i++) {
            out[i] = Math.max(eig.getEigenvalue(i).real, 0.0);
        }
        return out;
    }

    /** One model's estimate at the common weight and the series its tests need. */
    private static final class Pieces {
        final String title;
        final MomentModel model;
        final double[] theta;
        final double squared;
        final DMatrixRMaj gInverse;
        final DMatrixRMaj a; // G^{-1} g
        final DMatrixRMaj contributions;
        final DMatrixRMaj payoffs;
        final DMatrixRMaj g;
        DMatrixRMaj bread; // (D'G^{-1}D)^{-1}, linear models

        Pieces(ModelComparison.Entry entry, MomentModel model) {
            this.title = entry.title();
            this.model = model;
            gInverse = new InitialWeight.SecondMoment().matrix(model);
            double[] start = new double[model.parameterCount()];
            double[] own = entry.fit().estimates();
            for (int j = 0; j < start.length; j++) {
                int at = entry.model().parameterNames().indexOf(model.parameterNames().get(j));
                start[j] = own[at];
            }
            WeightedMinimizer.Minimum minimum = WeightedMinimizer.minimize(model, gInverse, start);
            if (!minimum.converged()) {
                throw new EstimationException("the estimate of " + title + " at the common (second-moment) weight "
                        + "did not converge", minimum.notes(), "compare at each model's own weight only, or try other "
                        + "start values");
            }
            theta = minimum.theta();
            g = model.meanMoments(theta);
            a = new DMatrixRMaj(g.numRows, 1);
            CommonOps_DDRM.mult(gInverse, g, a);
            squared = Math.max(CommonOps_DDRM.dot(g, a), 0.0);
            contributions = model.contributions(theta);
            payoffs = model.payoffs();
        }

        /** φ_t = 2a'f_t - (a'x_t)², the influence of δ̂² up to a constant. */
        double[] distanceInfluence() {
            int t = contributions.numRows;
            DMatrixRMaj af = new DMatrixRMaj(t, 1);
            DMatrixRMaj ax = new DMatrixRMaj(t, 1);
            CommonOps_DDRM.mult(contributions, a, af);
            CommonOps_DDRM.mult(payoffs, a, ax);
            double[] out = new double[t];
            for (int s = 0; s < t; s++) {
                out[s] = 2.0 * af.get(s) - ax.get(s) * ax.get(s);
            }
            return out;
        }

        /** ψ_t (T x P), the influence of θ̂ at the common weight; linear models only. */
        DMatrixRMaj influence() {
            int t = contributions.numRows;
            int k = model.momentCount();
            int p = model.parameterCount();
            DMatrixRMaj d = model.meanJacobian(theta);
            DMatrixRMaj gInvD = new DMatrixRMaj(k, p);
            CommonOps_DDRM.mult(gInverse, d, gInvD);
            DMatrixRMaj dgd = new DMatrixRMaj(p, p);
            CommonOps_DDRM.multTransA(d, gInvD, dgd);
            bread = dgd.copy();
            CommonOps_DDRM.invert(bread);
            // Per-period Jacobians J_t: the model is affine in θ, so unit steps give them exactly.
            DMatrixRMaj[] steps = new DMatrixRMaj[p];
            for (int j = 0; j < p; j++) {
                double[] moved = theta.clone();
                moved[j] += 1.0;
                steps[j] = model.contributions(moved);
                CommonOps_DDRM.subtractEquals(steps[j], contributions);
            }
            DMatrixRMaj out = new DMatrixRMaj(t, p);
            double[] inner = new double[p];
            for (int s = 0; s < t; s++) {
                double u = 0.0;
                for (int i = 0; i < k; i++) {
                    u += payoffs.get(s, i) * a.get(i);
                }
                for (int j = 0; j < p; j++) {
                    double value = 0.0;
                    for (int i = 0; i < k; i++) {
                        value += steps[j].get(s, i) * a.get(i)
                                + gInvD.get(i, j) * (contributions.get(s, i) - g.get(i) - payoffs.get(s, i) * u);
                    }
                    inner[j] = value;
                }
                for (int j = 0; j < p; j++) {
                    double value = 0.0;
                    for (int c = 0; c < p; c++) {
                        value -= bread.get(j, c) * inner[c];
                    }
                    out.set(s, j, value);
                }
            }
            return out;
        }
    }
}
