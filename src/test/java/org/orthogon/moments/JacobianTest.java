package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Analytic Jacobians against central finite differences (common practice, no source). */
class JacobianTest {

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1L, 2L, 3L})
    void powerUtilityWithInstrumentsMatchesCentralDifferences(long seed) {
        Random random = new Random(seed);
        int t = 80;
        double[][] gross = new double[t][3];
        double[] growth = new double[t];
        double[][] instruments = new double[t][2];
        for (int s = 0; s < t; s++) {
            growth[s] = Math.exp(0.005 + 0.02 * random.nextGaussian());
            for (int i = 0; i < 3; i++) {
                gross[s][i] = 1.01 + 0.08 * random.nextGaussian();
            }
            instruments[s][0] = 1.0;
            instruments[s][1] = random.nextGaussian();
        }
        MomentModel model = ScaledMoments.scaled(new PowerUtilityErrors(gross, growth, List.of("A", "B", "C")),
                instruments, List.of("const", "z"));
        assertMatchesCentralDifferences(model, new double[] {0.97 + 0.02 * random.nextDouble(), 1 + 5 * random.nextDouble()});
        assertThat(model.momentNames()).containsExactly("A*const", "A*z", "B*const", "B*z", "C*const", "C*z");
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {4L, 5L})
    void linearFactorMatchesCentralDifferencesAndIsAffine(long seed) {
        Random random = new Random(seed);
        int t = 60;
        double[][] excess = new double[t][4];
        double[][] factors = new double[t][2];
        for (int s = 0; s < t; s++) {
            for (int k = 0; k < 2; k++) {
                factors[s][k] = 0.005 + 0.04 * random.nextGaussian();
            }
            for (int i = 0; i < 4; i++) {
                excess[s][i] = 0.004 + 0.05 * random.nextGaussian();
            }
        }
        MomentModel model = ScaledMoments.unscaled(new LinearFactorErrors(excess, factors, List.of("a", "b", "c", "d"),
                List.of("F1", "F2")));
        double[] b = {random.nextGaussian(), random.nextGaussian()};
        assertMatchesCentralDifferences(model, b);
        assertThat(model.isLinear()).isTrue();
        assertThat(model.parameterNames()).containsExactly("b_F1", "b_F2");
        // Affine: g(b) = g(0) + D b exactly.
        DMatrixRMaj g0 = model.meanMoments(new double[2]);
        DMatrixRMaj d = model.meanJacobian(new double[2]);
        DMatrixRMaj g = model.meanMoments(b);
        for (int i = 0; i < 4; i++) {
            double predicted = g0.get(i) + d.get(i, 0) * b[0] + d.get(i, 1) * b[1];
            assertThat(g.get(i)).isCloseTo(predicted, within(1e-15));
        }
    }

    private static void assertMatchesCentralDifferences(MomentModel model, double[] theta) {
        DMatrixRMaj analytic = model.meanJacobian(theta);
        for (int p = 0; p < theta.length; p++) {
            double step = 1e-6 * Math.max(1.0, Math.abs(theta[p]));
            double[] up = theta.clone();
            double[] down = theta.clone();
            up[p] += step;
            down[p] -= step;
            DMatrixRMaj gUp = model.meanMoments(up);
            DMatrixRMaj gDown = model.meanMoments(down);
            for (int k = 0; k < model.momentCount(); k++) {
                double numeric = (gUp.get(k) - gDown.get(k)) / (2 * step);
                assertThat(analytic.get(k, p)).as("dg_%d/dtheta_%d", k, p)
                        .isCloseTo(numeric, within(1e-7 * Math.max(1.0, Math.abs(numeric))));
            }
        }
    }
}
