package org.orthogon.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.orthogon.TestLog;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ScaledMoments;

class ModelComparisonTest {
    private static final GmmOptions TWO_STEP_HC = new GmmOptions(EstimationMethod.TWO_STEP,
            LongRunOptions.heteroskedasticityConsistent());

    /**
     * Two independent factors with E[F2] = 0 and no alphas: b_2 = 0 in m = 1 - b'F (b = Σ^{-1}μ/(1 + μ'Σ^{-1}μ),
     * Cochrane 2005 section 6.3), so the one-factor model is correctly specified and nested in the two-factor one.
     */
    private static double[][][] sample(Random random, int months, int assets) {
        double[][] factors = new double[months][2];
        double[][] excess = new double[months][assets];
        for (int t = 0; t < months; t++) {
            factors[t][0] = 0.006 + 0.045 * random.nextGaussian();
            factors[t][1] = 0.030 * random.nextGaussian();
            for (int i = 0; i < assets; i++) {
                double beta1 = 0.8 + 0.1 * i;
                double beta2 = -0.6 + 0.25 * i;
                excess[t][i] = beta1 * factors[t][0] + beta2 * factors[t][1] + 0.02 * random.nextGaussian();
            }
        }
        return new double[][][] {excess, factors};
    }

    private static ModelComparison.Entry entry(String title, double[][] excess, double[][] factors, List<String> names) {
        List<String> assets = java.util.stream.IntStream.range(0, excess[0].length).mapToObj(i -> "A" + i).toList();
        MomentModel model = ScaledMoments.unscaled(new LinearFactorErrors(excess, factors, assets, names));
        GmmFit fit = GmmEstimator.estimate(model, new double[names.size()], TWO_STEP_HC);
        return new ModelComparison.Entry(title, model, new double[names.size()], fit);
    }

    private static double[][] firstColumn(double[][] factors) {
        double[][] out = new double[factors.length][1];
        for (int t = 0; t < factors.length; t++) {
            out[t][0] = factors[t][0];
        }
        return out;
    }

    @Test
    void differenceTestEqualsADirectComputationWithTheUnrestrictedWeight() {
        double[][][] data = sample(new Random(3), 600, 6);
        ModelComparison.Entry big = entry("two", data[0], data[1], List.of("F1", "F2"));
        ModelComparison.Entry small = entry("one", data[0], firstColumn(data[1]), List.of("F1"));
        ModelComparison.Result result = ModelComparison.compare(List.of(big, small));
        assertThat(result.nestedTests()).hasSize(1);
        ModelComparison.NestedTest test = result.nestedTests().get(0);
        assertThat(test.restricted()).isEqualTo("one");
        assertThat(test.test().df()).isEqualTo(1);

        // Direct: W = S_u^{-1}; closed forms b = (C'WC)^{-1}C'Wd for both; T(g_r'Wg_r - g_u'Wg_u)
        // (Newey and West 1987, International Economic Review 28, the D statistic).
        DMatrixRMaj w = new DMatrixRMaj(6, 6);
        CommonOps_DDRM.invert(big.fit().longRun().covariance(), w);
        double direct = 600 * (minimumQuadratic(small.model(), w) - minimumQuadratic(big.model(), w));
        assertThat(test.test().statistic()).isCloseTo(direct, within(1e-10 * Math.abs(direct) + 1e-12));
        assertThat(test.test().statistic()).isGreaterThanOrEqualTo(0.0);
    }

    /** min_b g(b)'Wg(b) for g(b) = d - Cb, by the normal equations, with C recovered from g at unit vectors. */
    private static double minimumQuadratic(MomentModel model, DMatrixRMaj w) {
        int p = model.parameterCount();
        int k = model.momentCount();
        DMatrixRMaj d = model.meanMoments(new double[p]);
        DMatrixRMaj c = new DMatrixRMaj(k, p);
        for (int j = 0; j < p; j++) {
            double[] unit = new double[p];
            unit[j] = 1;
            DMatrixRMaj g = model.meanMoments(unit);
            for (int i = 0; i < k; i++) {
                c.set(i, j, d.get(i) - g.get(i));
            }
        }
        DMatrixRMaj wc = new DMatrixRMaj(k, p);
        CommonOps_DDRM.mult(w, c, wc);
        DMatrixRMaj ctwc = new DMatrixRMaj(p, p);
        CommonOps_DDRM.multTransA(c, wc, ctwc);
        DMatrixRMaj ctwd = new DMatrixRMaj(p, 1);
        CommonOps_DDRM.multTransA(wc, d, ctwd);
        DMatrixRMaj b = new DMatrixRMaj(p, 1);
        CommonOps_DDRM.solve(ctwc, ctwd, b);
        DMatrixRMaj g = model.meanMoments(b.data);
        DMatrixRMaj wg = new DMatrixRMaj(k, 1);
        CommonOps_DDRM.mult(w, g, wg);
        return CommonOps_DDRM.dot(g, wg);
    }

    @Test
    void differenceTestIsChiSquareUnderTheRestriction() {
        // Under the null the statistic is chi-square(1) (Newey and West 1987): a seeded Monte Carlo must reject
        // at 5% in 2.5% to 8.5% of samples and the statistic is never negative.
        Random random = new Random(20261202L);
        int replications = 300;
        int rejections = 0;
        for (int r = 0; r < replications; r++) {
            double[][][] data = sample(random, 600, 6);
            ModelComparison.Result result = ModelComparison.compare(List.of(
                    entry("two", data[0], data[1], List.of("F1", "F2")),
                    entry("one", data[0], firstColumn(data[1]), List.of("F1"))));
            double statistic = result.nestedTests().get(0).test().statistic();
            assertThat(statistic).isGreaterThanOrEqualTo(-1e-12);
            if (result.nestedTests().get(0).test().pValue() < 0.05) {
                rejections++;
            }
        }
        double rate = rejections / (double) replications;
        TestLog.printf(ModelComparisonTest.class,
                "nested J-difference test: rejection rate at 5%% = %.3f over %d samples%n", rate, replications);
        assertThat(rate).isBetween(0.025, 0.085);
    }

    @Test
    void crossSectionalFitMatchesAHandComputation() {
        double[][][] data = sample(new Random(8), 240, 4);
        ModelComparison.Entry one = entry("one", data[0], firstColumn(data[1]), List.of("F1"));
        CrossSectionFit fit = CrossSectionFit.of(one.model(), one.fit().estimates());
        double b = one.fit().estimates()[0];
        double[] alpha = new double[4];
        double[] mean = new double[4];
        double meanSdf = 0;
        for (double[] row : data[1]) {
            meanSdf += (1 - b * row[0]) / 240;
        }
        for (int i = 0; i < 4; i++) {
            double g = 0;
            for (int t = 0; t < 240; t++) {
                g += data[0][t][i] * (1 - b * data[1][t][0]) / 240;
                mean[i] += data[0][t][i] / 240;
            }
            alpha[i] = g / meanSdf;
        }
        // R2 = 1 - Var_c(alpha)/Var_c(mean) (Jagannathan and Wang 1996, section III).
        double r2 = 1 - variance(alpha) / variance(mean);
        assertThat(fit.r2()).isCloseTo(r2, within(1e-12));
        assertThat(fit.errors()[2]).isCloseTo(alpha[2], within(1e-15));
        assertThat(fit.implied()[1]).isCloseTo(mean[1] - alpha[1], within(1e-15));
        double rms = 0;
        for (double a : alpha) {
            rms += a * a / 4;
        }
        assertThat(fit.rootMeanSquare()).isCloseTo(Math.sqrt(rms), within(1e-15));
    }

    private static double variance(double[] values) {
        double mean = java.util.Arrays.stream(values).average().orElseThrow();
        return java.util.Arrays.stream(values).map(v -> (v - mean) * (v - mean)).sum() / values.length;
    }
}
