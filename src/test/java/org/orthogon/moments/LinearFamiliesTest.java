package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;

/** The demeaned and gross linear-factor families, and the scaled-factor helper. */
class LinearFamiliesTest {
    private static final List<String> ASSETS = List.of("S1T1", "S1T2", "S2T3");
    private static final List<String> FACTORS = List.of("MKT", "SIZE");

    @Test
    void demeanedFamilyAtTheSampleMeansIsTheExcessFamilyOnDemeanedFactors() {
        FamilyFixtures data = new FamilyFixtures(3L, 40, 3, 2);
        DemeanedFactorErrors demeaned = new DemeanedFactorErrors(data.excess, data.factors, ASSETS, FACTORS);
        double[] mu = demeaned.sampleFactorMeans();
        double[][] centred = new double[40][2];
        for (int t = 0; t < 40; t++) {
            for (int k = 0; k < 2; k++) {
                centred[t][k] = data.factors[t][k] - mu[k];
            }
        }
        double[] b = {2.0, -1.5};
        double[] e = FamilyFixtures.errors(demeaned, new double[] {b[0], b[1], mu[0], mu[1]});
        double[] plain = FamilyFixtures.errors(new LinearFactorErrors(data.excess, centred, ASSETS, FACTORS), b);
        double[] meanMoments = new double[2];
        for (int t = 0; t < 40; t++) {
            for (int i = 0; i < 3; i++) {
                assertThat(e[t * 5 + i]).isCloseTo(plain[t * 3 + i], within(1e-15));
            }
            meanMoments[0] += e[t * 5 + 3] / 40;
            meanMoments[1] += e[t * 5 + 4] / 40;
        }
        // The factor-mean moments average to zero at the sample means (definition of the mean).
        assertThat(meanMoments[0]).isCloseTo(0.0, within(1e-17));
        assertThat(meanMoments[1]).isCloseTo(0.0, within(1e-17));
        assertThat(demeaned.parameterNames()).containsExactly("b_MKT", "b_SIZE", "mu_MKT", "mu_SIZE");
        assertThat(demeaned.assetNames()).containsExactly("S1T1", "S1T2", "S2T3", "mean_MKT", "mean_SIZE");
        assertThat(demeaned.pricingMoments()).isEqualTo(3);
    }

    @Test
    void demeanedFamilyExactlyIdentifiedSolvesWithTheSampleCovariance() {
        // With N = K assets, g_T = 0 at μ = mean F and b = Cov_T(R^e, F')^{-1} mean R^e, Cov_T dividing
        // by T: the moment E[R^e (1 - b'(F - μ))] = 0 rearranged (Cochrane 2005, section 13.4, from memory).
        FamilyFixtures data = new FamilyFixtures(4L, 120, 2, 2);
        List<String> two = List.of("S1T1", "S3T4");
        DemeanedFactorErrors family = new DemeanedFactorErrors(data.excess, data.factors, two, FACTORS);
        double[] mu = family.sampleFactorMeans();
        DMatrixRMaj cov = new DMatrixRMaj(2, 2);
        DMatrixRMaj meanExcess = new DMatrixRMaj(2, 1);
        for (int t = 0; t < 120; t++) {
            for (int i = 0; i < 2; i++) {
                meanExcess.data[i] += data.excess[t][i] / 120;
                for (int k = 0; k < 2; k++) {
                    cov.add(i, k, data.excess[t][i] * (data.factors[t][k] - mu[k]) / 120);
                }
            }
        }
        DMatrixRMaj b = new DMatrixRMaj(2, 1);
        CommonOps_DDRM.solve(cov, meanExcess, b);
        DMatrixRMaj g = ScaledMoments.unscaled(family).meanMoments(new double[] {b.get(0), b.get(1), mu[0], mu[1]});
        for (int k = 0; k < 4; k++) {
            assertThat(g.get(k)).as("g_%d", k).isCloseTo(0.0, within(1e-15));
        }
    }

    @Test
    void demeanedFamilyIsHonestlyNonLinear() {
        FamilyFixtures data = new FamilyFixtures(5L, 30, 3, 2);
        MomentModel model = ScaledMoments.unscaled(new DemeanedFactorErrors(data.excess, data.factors, ASSETS, FACTORS));
        assertThat(model.isLinear()).isFalse();
        // The b'μ product: g at (b, μ) differs from the affine extrapolation from θ = 0.
        double[] theta = {2.0, 1.0, 0.3, -0.2};
        DMatrixRMaj g0 = model.meanMoments(new double[4]);
        DMatrixRMaj d0 = model.meanJacobian(new double[4]);
        DMatrixRMaj predicted = new DMatrixRMaj(model.momentCount(), 1);
        CommonOps_DDRM.mult(d0, DMatrixRMaj.wrap(4, 1, theta.clone()), predicted);
        CommonOps_DDRM.addEquals(predicted, g0);
        DMatrixRMaj actual = model.meanMoments(theta);
        assertThat(Math.abs(actual.get(0) - predicted.get(0))).isGreaterThan(1e-6);
    }

    @Test
    void grossFamilyLessItsRiskfreeErrorIsTheExcessFamily() {
        // (a - b'F) R_i - 1 - [(a - b'F) R_f - 1] = a (1 - (b/a)'F) R^e_i: the gross SDF normalised by its
        // constant prices excess returns as m = 1 - b'F does (algebra; Cochrane 2005, section 6.3, from memory).
        FamilyFixtures data = new FamilyFixtures(6L, 30, 3, 2);
        GrossFactorErrors gross = new GrossFactorErrors(data.gross, data.riskfree, data.factors, ASSETS, "RF", FACTORS);
        double a = 0.98;
        double[] b = {2.5, -1.0};
        double[] e = FamilyFixtures.errors(gross, new double[] {a, b[0], b[1]});
        double[] excess = FamilyFixtures.errors(new LinearFactorErrors(data.excess, data.factors, ASSETS, FACTORS),
                new double[] {b[0] / a, b[1] / a});
        for (int t = 0; t < 30; t++) {
            for (int i = 0; i < 3; i++) {
                assertThat(e[t * 4 + i] - e[t * 4 + 3]).isCloseTo(a * excess[t * 3 + i], within(1e-14));
            }
        }
        assertThat(gross.assetNames()).containsExactly("S1T1", "S1T2", "S2T3", "RF");
        assertThat(gross.parameterNames()).containsExactly("a", "b_MKT", "b_SIZE");
        assertThatThrownBy(() -> new GrossFactorErrors(data.gross, data.riskfree, data.factors, ASSETS, "S1T1",
                FACTORS)).hasMessageContaining("added once");
    }

    @Test
    void grossFamilyIsAffineSoTheClosedFormApplies() {
        FamilyFixtures data = new FamilyFixtures(7L, 30, 3, 2);
        MomentModel model = ScaledMoments.unscaled(new GrossFactorErrors(data.gross, data.riskfree, data.factors, ASSETS,
                "RF", FACTORS));
        assertThat(model.isLinear()).isTrue();
        double[] theta = {1.01, 3.0, -2.0};
        DMatrixRMaj g0 = model.meanMoments(new double[3]);
        DMatrixRMaj d = model.meanJacobian(new double[3]);
        DMatrixRMaj g = model.meanMoments(theta);
        for (int k = 0; k < model.momentCount(); k++) {
            double predicted = g0.get(k) + d.get(k, 0) * theta[0] + d.get(k, 1) * theta[1] + d.get(k, 2) * theta[2];
            assertThat(g.get(k)).isCloseTo(predicted, within(1e-14));
        }
        // Payoffs are the gross returns, the risk-free last (e = m x - 1).
        DMatrixRMaj x = model.payoffs();
        assertThat(x.get(2, 1)).isEqualTo(data.gross[2][1]);
        assertThat(x.get(2, 3)).isEqualTo(data.riskfree[2]);
    }

    @Test
    void scaledFactorsAreTheKroneckerProductWithLaggedInstruments() {
        double[][] f = {{0.01, 0.02}, {-0.03, 0.04}};
        double[][] z = {{1.0, 0.5}, {1.0, -2.0}};
        ScaledFactors scaled = ScaledFactors.expand(f, List.of("MKT", "TIDE"), z, List.of("const", "z_growth"));
        assertThat(scaled.names()).containsExactly("MKT*const", "MKT*z_growth", "TIDE*const", "TIDE*z_growth");
        // By hand: row 1 = (-0.03·1, -0.03·-2, 0.04·1, 0.04·-2).
        assertThat(scaled.values()[1]).containsExactly(-0.03, 0.06, 0.04, -0.08);
        assertThat(scaled.values()[0]).containsExactly(0.01, 0.005, 0.02, 0.01);
        LinearFactorErrors conditional = new LinearFactorErrors(new double[][] {{0.01}, {0.02}}, scaled.values(),
                List.of("A"), scaled.names());
        assertThat(conditional.parameterNames()).containsExactly("b_MKT*const", "b_MKT*z_growth", "b_TIDE*const",
                "b_TIDE*z_growth");
        assertThatThrownBy(() -> ScaledFactors.expand(f, List.of("MKT", "TIDE"), new double[][] {{1.0}},
                List.of("const"))).hasMessageContaining("rows");
    }
}
