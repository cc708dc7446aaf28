package org.orthogon.twopass;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;

/**
 * Identities of the two-pass method that hold exactly in a sample built for them (the constructions
 * are in {@link SyntheticPanels}); each follows from the formulas of the papers cited in the classes.
 */
class TwoPassIdentitiesTest {

    @Test
    void grsIsZeroWhenEveryAlphaIsZeroByConstruction() {
        FactorSample sample = SyntheticPanels.panel(11, 240, 10, 3, new double[10], false);
        TimeSeriesFit fit = TimeSeriesRegressions.estimate(sample);
        for (Alpha alpha : fit.alphas()) {
            assertThat(alpha.estimate()).isCloseTo(0.0, within(1e-15));
        }
        assertThat(fit.grs().statistic()).isCloseTo(0.0, within(1e-20));
        assertThat(fit.grs().pValue()).isEqualTo(1.0);
        assertThat(fit.grs().df1()).isEqualTo(10);
        assertThat(fit.grs().df2()).isEqualTo(240 - 10 - 3);
    }

    @Test
    void grsGrowsWithTheAlphasPutIn() {
        double[] alpha = new double[10];
        alpha[0] = 0.004;
        alpha[5] = -0.003;
        FactorSample sample = SyntheticPanels.panel(11, 240, 10, 3, alpha, false);
        TimeSeriesFit fit = TimeSeriesRegressions.estimate(sample);
        // Least squares returns the alphas put in exactly, since the residuals are orthogonal to [1, f].
        assertThat(fit.alphas().get(0).estimate()).isCloseTo(0.004, within(1e-14));
        assertThat(fit.alphas().get(5).estimate()).isCloseTo(-0.003, within(1e-14));
        assertThat(fit.grs().statistic()).isGreaterThan(1.0);
    }

    @Test
    void shankenEqualsFamaMacBethTimesOnePlusSharpeRatioPlusFactorCovariance() {
        FactorSample sample = SyntheticPanels.panel(5, 300, 12, 2, new double[12], false);
        TwoPassResult result = TwoPassResult.of(sample, true);
        CrossSectionEstimate ols = result.ols();
        DMatrixRMaj omega = result.timeSeries().factorCovariance();
        DMatrixRMaj lambda = new DMatrixRMaj(new double[][] {{ols.estimates()[1]}, {ols.estimates()[2]}});
        DMatrixRMaj omegaInverse = omega.copy();
        CommonOps_DDRM.invert(omegaInverse);
        DMatrixRMaj temp = new DMatrixRMaj(2, 1);
        CommonOps_DDRM.mult(omegaInverse, lambda, temp);
        double c = CommonOps_DDRM.dot(lambda, temp);
        for (int a = 0; a < 3; a++) {
            for (int b = 0; b < 3; b++) {
                double expected = (1 + c) * ols.famaMacBeth().get(a, b)
                        + (a > 0 && b > 0 ? omega.get(a - 1, b - 1) / 300 : 0.0);
                assertThat(ols.shanken().get(a, b)).isCloseTo(expected, within(1e-15));
            }
        }
    }

    @Test
    void shankenTendsToFamaMacBethAsTheFactorCovarianceVanishes() {
        // Flat mean returns make the estimated premia exactly zero, so the correction is Ω/T alone;
        // shrinking the factors (betas held fixed) sends Ω to zero while the Fama-MacBeth variance stays.
        double previousGap = Double.POSITIVE_INFINITY;
        for (double scale : new double[] {1.0, 1e-2, 1e-4, 1e-6}) {
            FactorSample sample = flatMeans(scale);
            CrossSectionEstimate ols = TwoPassResult.of(sample, true).ols();
            assertThat(ols.estimates()[1]).isCloseTo(0.0, within(1e-12));
            double[] fm = Dense.standardErrors(ols.famaMacBeth());
            double[] sh = Dense.standardErrors(ols.shanken());
            double gap = Math.abs(sh[1] / fm[1] - 1.0);
            assertThat(gap).isLessThan(previousGap);
            previousGap = gap;
        }
        assertThat(previousGap).isLessThan(1e-10);
    }

    @Test
    void olsAndGlsAgreeWhenTheResidualCovarianceIsProportionalToTheIdentity() {
        double[] alpha = {0.001, -0.002, 0.0005, 0.003, -0.001, 0.0, 0.002, -0.0015};
        FactorSample sample = SyntheticPanels.panel(23, 200, 8, 2, alpha, true);
        TwoPassResult result = TwoPassResult.of(sample, true);
        DMatrixRMaj sigma = result.timeSeries().residualCovariance();
        assertThat(sigma.get(0, 0)).isCloseTo(0.03 * 0.03, within(1e-15));
        assertThat(sigma.get(0, 1)).isCloseTo(0.0, within(1e-15));
        for (int j = 0; j < 3; j++) {
            assertThat(result.gls().estimates()[j]).isCloseTo(result.ols().estimates()[j], within(1e-13));
            assertThat(result.gls().famaMacBeth().get(j, j)).isCloseTo(result.ols().famaMacBeth().get(j, j),
                    within(1e-15));
            assertThat(result.gls().shanken().get(j, j)).isCloseTo(result.ols().shanken().get(j, j), within(1e-15));
        }
    }

    @Test
    void glsOnTheReturnCovarianceEqualsGlsOnTheResidualCovariance() {
        FactorSample sample = SyntheticPanels.panel(31, 400, 10, 3, new double[] {0.001, 0.002, -0.001, 0.0, 0.003,
            -0.002, 0.001, 0.0005, -0.0005, 0.0}, false);
        TwoPassResult result = TwoPassResult.of(sample, true);
        // Σ^{-1}-weighted least squares of R̄ on [1, β], written out independently.
        double[][] beta = result.timeSeries().betas();
        DMatrixRMaj x = new DMatrixRMaj(10, 4);
        for (int i = 0; i < 10; i++) {
            x.set(i, 0, 1.0);
            for (int k = 0; k < 3; k++) {
                x.set(i, k + 1, beta[i][k]);
            }
        }
        DMatrixRMaj sigmaInverse = result.timeSeries().residualCovariance();
        CommonOps_DDRM.invert(sigmaInverse);
        DMatrixRMaj xtw = new DMatrixRMaj(4, 10);
        CommonOps_DDRM.multTransA(x, sigmaInverse, xtw);
        DMatrixRMaj xtwx = new DMatrixRMaj(4, 4);
        CommonOps_DDRM.mult(xtw, x, xtwx);
        DMatrixRMaj mean = new DMatrixRMaj(10, 1, true, result.gls().realised());
        DMatrixRMaj xtwr = new DMatrixRMaj(4, 1);
        CommonOps_DDRM.mult(xtw, mean, xtwr);
        DMatrixRMaj gamma = new DMatrixRMaj(4, 1);
        CommonOps_DDRM.solve(xtwx, xtwr, gamma);
        for (int j = 0; j < 4; j++) {
            assertThat(result.gls().estimates()[j]).isCloseTo(gamma.get(j), within(1e-12));
        }
    }

    @Test
    void exactPricingLeavesTheRobustCovarianceWithoutItsMisspecificationTerm() {
        // Mean returns exactly on the betas (R̄ = 1 γ0 + β λ) make ê = 0, so û_t = 0 and ρ̂² = 1.
        FactorSample sample = SyntheticPanels.panel(41, 300, 9, 2, new double[9], false);
        CrossSectionEstimate ols = TwoPassResult.of(sample, true).ols();
        assertThat(ols.r2()).isCloseTo(1.0, within(1e-12));
        for (double error : ols.pricingErrors()) {
            assertThat(error).isCloseTo(0.0, within(1e-15));
        }
    }

    /** Returns with equal means across assets, loadings fixed, factors multiplied by {@code scale}. */
    private static FactorSample flatMeans(double scale) {
        FactorSample base = SyntheticPanels.panel(7, 360, 10, 1, new double[10], false);
        double[][] f = base.factorValues();
        double[][] r = base.excessReturns();
        double[][] beta = TimeSeriesRegressions.estimate(base).betas();
        double[] mean = new double[10];
        for (int s = 0; s < r.length; s++) {
            for (int i = 0; i < 10; i++) {
                // Take the factor part out and put it back at the new scale, then centre every asset at 0.5%.
                r[s][i] += (scale - 1.0) * beta[i][0] * f[s][0];
                mean[i] += r[s][i] / r.length;
            }
        }
        for (double[] row : r) {
            for (int i = 0; i < 10; i++) {
                row[i] += 0.005 - mean[i];
            }
        }
        for (double[] row : f) {
            row[0] *= scale;
        }
        return new FactorSample(base.assets(), base.factors(), r, f);
    }
}
