package org.orthogon.longrun;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.Random;
import java.util.stream.Stream;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The long-run covariance at a fixed bandwidth, its cross covariances and its derivative in θ, checked
 * against the estimator itself: the derivative against central differences of
 * {@link LongRunCovariance#estimate} with the bandwidth held fixed (common practice, no source: a
 * derivative is the limit of its difference quotients; step 1e-5, central differences err by O(h²)).
 */
class LongRunDerivativeTest {
    private static final int T = 80;
    private static final int K = 3;

    /** f_t(θ) = a_t + θ b_t + θ² c_t with autocorrelated a, b, c, so every lag and the curvature matter. */
    private static final class Series {
        final double[][] a = new double[T][K];
        final double[][] b = new double[T][K];
        final double[][] c = new double[T][K];

        Series(long seed) {
            Random rng = new Random(seed);
            double[] pa = new double[K];
            double[] pb = new double[K];
            for (int t = 0; t < T; t++) {
                for (int k = 0; k < K; k++) {
                    pa[k] = 0.5 * pa[k] + rng.nextGaussian() + 0.2 * k;
                    pb[k] = 0.3 * pb[k] + rng.nextGaussian();
                    a[t][k] = pa[k];
                    b[t][k] = pb[k] + 0.5 * a[t][k];
                    c[t][k] = 0.2 * rng.nextGaussian() + 0.1;
                }
            }
        }

        DMatrixRMaj moments(double theta) {
            DMatrixRMaj f = new DMatrixRMaj(T, K);
            for (int t = 0; t < T; t++) {
                for (int k = 0; k < K; k++) {
                    f.set(t, k, a[t][k] + theta * b[t][k] + theta * theta * c[t][k]);
                }
            }
            return f;
        }

        DMatrixRMaj derivative(double theta) {
            DMatrixRMaj f = new DMatrixRMaj(T, K);
            for (int t = 0; t < T; t++) {
                for (int k = 0; k < K; k++) {
                    f.set(t, k, b[t][k] + 2 * theta * c[t][k]);
                }
            }
            return f;
        }
    }

    static Stream<Arguments> estimators() {
        return Stream.of(
                Arguments.of(Kernel.NONE, 0.0, true, false),
                Arguments.of(Kernel.NONE, 0.0, false, false),
                Arguments.of(Kernel.BARTLETT, 5.0, true, false),
                Arguments.of(Kernel.BARTLETT, 5.0, false, false),
                Arguments.of(Kernel.PARZEN, 3.7, true, false),
                Arguments.of(Kernel.TUKEY_HANNING, 4.2, true, false),
                Arguments.of(Kernel.TRUNCATED, 3.0, true, false),
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, 2.6, true, false),
                Arguments.of(Kernel.BARTLETT, 3.0, true, true),
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, 1.8, false, true),
                Arguments.of(Kernel.NONE, 0.0, true, true));
    }

    private static LongRunOptions options(Kernel kernel, double b, boolean centered, boolean prewhiten) {
        BandwidthRule rule = b > 0 ? new BandwidthRule.Fixed(b) : new BandwidthRule.Lags(0);
        return new LongRunOptions(kernel, rule, centered, prewhiten);
    }

    @ParameterizedTest(name = "{0} b={1} centered={2} prewhiten={3}")
    @MethodSource("estimators")
    void covarianceIsTheEstimatorAtThatBandwidth(Kernel kernel, double b, boolean centered, boolean prewhiten) {
        Series series = new Series(11);
        DMatrixRMaj f = series.moments(0.7);
        LongRunOptions options = options(kernel, b, centered, prewhiten);
        DMatrixRMaj expected = LongRunCovariance.estimate(f, options).covariance();
        LongRunDerivative at = LongRunDerivative.at(f, options, b);
        assertClose(at.covariance(), expected, 1e-11);
        // V_uu = S: the cross covariance of the moments with themselves is the estimate.
        assertClose(at.crossCovariance(f), expected, 1e-11);
    }

    @ParameterizedTest(name = "{0} b={1} centered={2} prewhiten={3}")
    @MethodSource("estimators")
    void derivativeMatchesCentralDifferencesOfTheEstimator(Kernel kernel, double b, boolean centered,
            boolean prewhiten) {
        Series series = new Series(5);
        double theta = 0.4;
        double h = 1e-5;
        LongRunOptions options = options(kernel, b, centered, prewhiten);
        DMatrixRMaj up = LongRunCovariance.estimate(series.moments(theta + h), options).covariance();
        DMatrixRMaj down = LongRunCovariance.estimate(series.moments(theta - h), options).covariance();
        DMatrixRMaj numerical = new DMatrixRMaj(K, K);
        for (int i = 0; i < K * K; i++) {
            numerical.data[i] = (up.data[i] - down.data[i]) / (2 * h);
        }
        DMatrixRMaj analytic = LongRunDerivative.at(series.moments(theta), options, b)
                .derivative(series.derivative(theta));
        assertClose(analytic, numerical, 1e-7);
    }

    @ParameterizedTest(name = "{0} b={1} centered={2} prewhiten={3}")
    @MethodSource("estimators")
    void derivativeTimesAVectorIsTheDerivativeMatrixTimesIt(Kernel kernel, double b, boolean centered,
            boolean prewhiten) {
        // the matrix-vector route of Windmeijer's correction against the K x K derivative (algebra: both are
        // (u̇'V + V'u̇) x / T; only the order of the sums differs)
        Series series = new Series(8);
        double theta = -0.3;
        LongRunDerivative at = LongRunDerivative.at(series.moments(theta), options(kernel, b, centered, prewhiten), b);
        DMatrixRMaj matrix = at.derivative(series.derivative(theta));
        double[] x = {0.7, -1.3, 0.25};
        double[] product = at.derivativeTimes(series.derivative(theta), x);
        DMatrixRMaj expected = new DMatrixRMaj(K, 1);
        org.ejml.dense.row.CommonOps_DDRM.mult(matrix, DMatrixRMaj.wrap(K, 1, x), expected);
        assertClose(DMatrixRMaj.wrap(K, 1, product), expected, 1e-13);
    }

    @Test
    void heteroskedasticityConsistentCrossCovarianceIsTheAverageCrossProduct() {
        Series series = new Series(3);
        DMatrixRMaj f = series.moments(0.2);
        DMatrixRMaj q = series.derivative(0.2);
        DMatrixRMaj v = LongRunDerivative.at(f, options(Kernel.NONE, 0.0, true, false), 0.0).crossCovariance(q);
        // common practice, no source: with no lags V_qu = (1/T) Σ (q_t - q̄)(u_t - ū)'
        double[] qm = new double[K];
        double[] um = new double[K];
        for (int t = 0; t < T; t++) {
            for (int k = 0; k < K; k++) {
                qm[k] += q.get(t, k) / T;
                um[k] += f.get(t, k) / T;
            }
        }
        for (int p = 0; p < K; p++) {
            for (int r = 0; r < K; r++) {
                double sum = 0;
                for (int t = 0; t < T; t++) {
                    sum += (q.get(t, p) - qm[p]) * (f.get(t, r) - um[r]);
                }
                assertThat(v.get(p, r)).isCloseTo(sum / T, org.assertj.core.api.Assertions.within(1e-12));
            }
        }
    }

    private static void assertClose(DMatrixRMaj actual, DMatrixRMaj expected, double relative) {
        double scale = 0;
        for (double v : expected.data) {
            scale = Math.max(scale, Math.abs(v));
        }
        for (int i = 0; i < expected.getNumElements(); i++) {
            assertThat(Math.abs(actual.data[i] - expected.data[i]))
                    .as("element %d: %s against %s", i, actual.data[i], expected.data[i])
                    .isLessThanOrEqualTo(relative * Math.max(scale, 1e-300));
        }
    }
}
