package org.orthogon.longrun;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Identities every long-run covariance estimate must satisfy, on seeded inputs (PSD: LongRunPropertiesTest). */
class LongRunIdentitiesTest {

    private static DMatrixRMaj randomSeries(long seed, int t, int k) {
        Random rng = new Random(seed);
        DMatrixRMaj f = new DMatrixRMaj(t, k);
        double[] prev = new double[k];
        for (int r = 0; r < t; r++) {
            for (int c = 0; c < k; c++) {
                // serial correlation and a non-zero mean, so lags and centering both matter
                prev[c] = 0.6 * prev[c] + rng.nextGaussian() + 0.3 * c;
                f.set(r, c, prev[c]);
            }
        }
        return f;
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 2, 3, 17, 42, 2024})
    void heteroskedasticityConsistentIsTheAverageOuterProduct(long seed) {
        DMatrixRMaj f = randomSeries(seed, 50, 4);
        DMatrixRMaj s = LongRunCovariance.estimate(f, LongRunOptions.heteroskedasticityConsistent()).covariance();
        // common practice, no source: HC estimate = (1/T) Σ u_t u_t' with u_t = f_t - mean f
        double[] mean = new double[4];
        for (int r = 0; r < 50; r++) {
            for (int c = 0; c < 4; c++) {
                mean[c] += f.get(r, c) / 50;
            }
        }
        for (int p = 0; p < 4; p++) {
            for (int q = 0; q < 4; q++) {
                double sum = 0;
                for (int r = 0; r < 50; r++) {
                    sum += (f.get(r, p) - mean[p]) * (f.get(r, q) - mean[q]);
                }
                assertThat(s.get(p, q)).isCloseTo(sum / 50, within(1e-12 * Math.max(1, Math.abs(sum / 50))));
            }
        }
        // uncentered: (1/T) F'F
        DMatrixRMaj raw = LongRunCovariance.estimate(f,
                LongRunOptions.heteroskedasticityConsistent().withCentered(false)).covariance();
        DMatrixRMaj ftf = new DMatrixRMaj(4, 4);
        CommonOps_DDRM.multTransA(f, f, ftf);
        CommonOps_DDRM.divide(ftf, 50);
        assertThat(ReferenceData.relativeError(raw, ftf)).isLessThan(1e-13);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {4, 9, 16})
    void uncenteredEqualsCenteredWhenTheMeanIsExactlyZero(long seed) {
        Random rng = new Random(seed);
        int t = 40;
        int k = 3;
        DMatrixRMaj f = new DMatrixRMaj(t, k);
        for (int c = 0; c < k; c++) {
            long sum = 0;
            for (int r = 0; r < t - 1; r++) {
                int v = rng.nextInt(201) - 100; // integers: sums and the mean 0/T are exact in doubles
                f.set(r, c, v);
                sum += v;
            }
            f.set(t - 1, c, -sum);
        }
        for (Kernel kernel : new Kernel[] {Kernel.NONE, Kernel.BARTLETT, Kernel.QUADRATIC_SPECTRAL}) {
            BandwidthRule rule = new BandwidthRule.Fixed(4.5);
            DMatrixRMaj centered = LongRunCovariance.estimate(f, new LongRunOptions(kernel, rule, true, false))
                    .covariance();
            DMatrixRMaj uncentered = LongRunCovariance.estimate(f, new LongRunOptions(kernel, rule, false, false))
                    .covariance();
            // common practice, no source: centering subtracts a mean that is zero, so nothing changes
            assertThat(uncentered.data).containsExactly(centered.data);
        }
    }

    @Test
    void bartlettWeightsAreNeweyWest() {
        // Newey and West (1987): weight 1 - j/(L+1) on lag j, so with L = 1 S = Γ_0 + (Γ_1 + Γ_1')/2
        DMatrixRMaj f = new DMatrixRMaj(new double[][] {{1}, {3}, {-2}, {0}, {2}});
        double mean = 0.8;
        double[] u = {1 - mean, 3 - mean, -2 - mean, 0 - mean, 2 - mean};
        double g0 = 0;
        double g1 = 0;
        for (int i = 0; i < 5; i++) {
            g0 += u[i] * u[i] / 5;
            if (i > 0) {
                g1 += u[i] * u[i - 1] / 5;
            }
        }
        double s = LongRunCovariance.estimate(f, LongRunOptions.bartlettLags(1)).covariance().get(0, 0);
        assertThat(s).isCloseTo(g0 + g1, within(1e-14));
    }

    @Test
    void rejectsTooFewObservations() {
        assertThatThrownBy(() -> LongRunCovariance.estimate(new DMatrixRMaj(1, 3), LongRunOptions.bartlettLags(2)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("T=1");
    }

    @Test
    void rejectsNegativeLags() {
        assertThatThrownBy(() -> LongRunOptions.bartlettLags(-3))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("-3");
        assertThatThrownBy(() -> Kernel.PARZEN.bandwidthForLags(-1))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("-1");
    }

    @Test
    void rejectsNonFiniteValuesNamingTheCell() {
        DMatrixRMaj f = randomSeries(7, 10, 2);
        f.set(6, 1, Double.NaN);
        assertThatThrownBy(() -> LongRunCovariance.estimate(f, LongRunOptions.bartlettLags(2)))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("NaN")
                .hasMessageContaining("row 6").hasMessageContaining("column 1");
        f.set(6, 1, Double.POSITIVE_INFINITY);
        assertThatThrownBy(() -> LongRunCovariance.estimate(f, LongRunOptions.heteroskedasticityConsistent()))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("Infinity");
    }

    @Test
    void rejectsBadBandwidths() {
        assertThatThrownBy(() -> new BandwidthRule.Fixed(0)).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("0.0");
        assertThatThrownBy(() -> new BandwidthRule.Fixed(Double.NaN)).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("NaN");
        assertThatThrownBy(() -> Kernel.QUADRATIC_SPECTRAL.bandwidthForLags(3))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("quadratic-spectral");
    }

    @Test
    void kernelIdsRoundTripAndUnknownIdsListTheValidOnes() {
        for (Kernel k : Kernel.values()) {
            assertThat(Kernel.fromId(k.id())).isSameAs(k);
        }
        assertThatThrownBy(() -> Kernel.fromId("bartlet")).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("bartlet").hasMessageContaining("quadratic-spectral")
                .hasMessageContaining("tukey-hanning").hasMessageContaining("none");
    }

    @Test
    void kernelWeightsAtKnownPoints() {
        // Andrews (1991), section 2: definitions evaluated by hand
        assertThat(Kernel.BARTLETT.weight(0.25)).isEqualTo(0.75);
        assertThat(Kernel.PARZEN.weight(0.5)).isCloseTo(0.25, within(1e-15));
        assertThat(Kernel.PARZEN.weight(0.75)).isCloseTo(2 * 0.25 * 0.25 * 0.25, within(1e-15));
        assertThat(Kernel.TUKEY_HANNING.weight(0.5)).isCloseTo(0.5, within(1e-15));
        assertThat(Kernel.TRUNCATED.weight(1.0)).isEqualTo(1.0);
        assertThat(Kernel.TRUNCATED.weight(1.0001)).isEqualTo(0.0);
        assertThat(Kernel.QUADRATIC_SPECTRAL.weight(0)).isEqualTo(1.0);
        // continuity of the QS series branch with the closed form near 0
        assertThat(Kernel.QUADRATIC_SPECTRAL.weight(2.6e-4)).isCloseTo(Kernel.QUADRATIC_SPECTRAL.weight(2.7e-4),
                within(1e-8));
        assertThat(Kernel.QUADRATIC_SPECTRAL.weight(-1.3)).isEqualTo(Kernel.QUADRATIC_SPECTRAL.weight(1.3));
    }

    @Test
    void smallSampleFactorScalesByTOverTMinusP() {
        DMatrixRMaj s = new DMatrixRMaj(new double[][] {{2, 1}, {1, 3}});
        DMatrixRMaj adj = LongRunCovariance.smallSampleAdjusted(s, 10, 2);
        // common practice, no source: T/(T-P) = 10/8
        assertThat(adj.get(1, 1)).isEqualTo(3.75);
        assertThatThrownBy(() -> LongRunCovariance.smallSampleFactor(5, 5))
                .isInstanceOf(IllegalArgumentException.class).hasMessageContaining("T=5").hasMessageContaining("P=5");
    }

    @Test
    void prewhiteningRefusesCollinearColumnsButAcceptsManyIndependentOnes() {
        DMatrixRMaj f = randomSeries(11, 60, 3);
        for (int r = 0; r < 60; r++) {
            f.set(r, 2, 2.0 * f.get(r, 0) - f.get(r, 1));
        }
        LongRunOptions pw = new LongRunOptions(Kernel.BARTLETT, new BandwidthRule.Andrews(), true, true);
        // common practice, no source: a column that is a combination of others leaves A undetermined
        assertThatThrownBy(() -> LongRunCovariance.estimate(f, pw)).isInstanceOf(IllegalArgumentException.class)
                .hasMessageContaining("rank deficient");
        // 60 independent AR(1) columns on 400 rows are far from collinear; the refusal must not grow with K
        // (a product of diagonal ratios did: it refused K = 43 on T = 134)
        LongRunEstimate wide = LongRunCovariance.estimate(randomSeries(12, 400, 60), pw);
        assertThat(wide.prewhitened()).isTrue();
        assertThat(CommonOps_DDRM.trace(wide.covariance())).isPositive();
    }
}
