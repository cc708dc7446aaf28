package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;

/** The Hansen-Jagannathan moment set of the demeaned linear SDF: N asset errors at μ = f̄. */
class DemeanedPricingErrorsTest {
    private static final List<String> ASSETS = List.of("S1T1", "S1T2", "S2T3");
    private static final List<String> FACTORS = List.of("MKT", "SIZE");

    @Test
    void meanErrorsAreThoseOfTheSdfAtTheSampleFactorMeans() {
        FamilyFixtures data = new FamilyFixtures(5L, 50, 3, 2);
        MomentModel distance = ScaledMoments.unscaled(new DemeanedFactorErrors(data.excess, data.factors, ASSETS,
                FACTORS)).distanceMoments().orElseThrow();
        assertThat(distance.parameterNames()).containsExactly("b_MKT", "b_SIZE");
        assertThat(distance.momentNames()).isEqualTo(ASSETS);
        assertThat(distance.isLinear()).isTrue();
        double[] b = {1.5, -0.7};
        double[] mu = new DemeanedFactorErrors(data.excess, data.factors, ASSETS, FACTORS).sampleFactorMeans();
        DMatrixRMaj g = distance.meanMoments(b);
        for (int i = 0; i < 3; i++) {
            double expected = 0.0;
            for (int t = 0; t < 50; t++) {
                double m = 1.0 - b[0] * (data.factors[t][0] - mu[0]) - b[1] * (data.factors[t][1] - mu[1]);
                expected += data.excess[t][i] * m / 50;
            }
            assertThat(g.get(i)).isCloseTo(expected, within(1e-16));
        }
        // The payoffs are the excess returns alone, so G is their second-moment matrix.
        assertThat(distance.payoffs().numCols).isEqualTo(3);
        assertThat(distance.meanDiscountFactor(b)).isCloseTo(1.0, within(1e-15));
    }

    @Test
    void contributionsAddTheFirstOrderEffectOfEstimatingTheMeans() {
        // u_t = [I, R̄ b'] [R_t m_t; F_t - f̄]: the stacked demeaned moments at μ = f̄ mapped by ∂g/∂μ' = R̄ b'.
        FamilyFixtures data = new FamilyFixtures(9L, 30, 3, 2);
        DemeanedFactorErrors family = new DemeanedFactorErrors(data.excess, data.factors, ASSETS, FACTORS);
        double[] mu = family.sampleFactorMeans();
        double[] b = {0.8, 2.1};
        DMatrixRMaj stacked = ScaledMoments.unscaled(family).contributions(new double[] {b[0], b[1], mu[0], mu[1]});
        DMatrixRMaj u = ScaledMoments.unscaled(family).distanceMoments().orElseThrow().contributions(b);
        double[] meanReturn = new double[3];
        for (double[] row : data.excess) {
            for (int i = 0; i < 3; i++) {
                meanReturn[i] += row[i] / 30;
            }
        }
        for (int t = 0; t < 30; t++) {
            for (int i = 0; i < 3; i++) {
                double expected = stacked.get(t, i) + meanReturn[i] * (b[0] * stacked.get(t, 3) + b[1] * stacked.get(t, 4));
                assertThat(u.get(t, i)).isCloseTo(expected, within(1e-16));
            }
        }
    }

    @Test
    void analyticJacobianMatchesCentralDifferences() {
        FamilyFixtures data = new FamilyFixtures(13L, 40, 3, 2);
        MomentModel distance = ScaledMoments.unscaled(new DemeanedFactorErrors(data.excess, data.factors, ASSETS,
                FACTORS)).distanceMoments().orElseThrow();
        double[] b = {1.0, 0.5};
        DMatrixRMaj analytic = distance.meanJacobian(b);
        for (int k = 0; k < 2; k++) {
            double[] up = b.clone();
            double[] down = b.clone();
            up[k] += 1e-4;
            down[k] -= 1e-4;
            DMatrixRMaj difference = distance.meanMoments(up);
            CommonOps_DDRM.subtractEquals(difference, distance.meanMoments(down));
            for (int i = 0; i < 3; i++) {
                // Affine in b: central differences are exact up to rounding.
                assertThat(analytic.get(i, k)).isCloseTo(difference.get(i) / 2e-4, within(1e-12));
            }
        }
    }
}
