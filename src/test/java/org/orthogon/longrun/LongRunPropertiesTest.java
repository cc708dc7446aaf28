package org.orthogon.longrun;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Properties that hold for every input: positive semidefinite estimates from the kernels that
 * guarantee it, and kernel weights equal to their closed forms. Inputs come from seeded
 * generators, so a failure names a seed that reproduces it.
 */
class LongRunPropertiesTest {

    /** One generated input: T x K moments with AR(1) coefficient phi and a common factor. */
    record Input(long seed, int t, int k, double phi, String regime) {
        DMatrixRMaj moments() {
            Random rng = new Random(seed);
            DMatrixRMaj f = new DMatrixRMaj(t, k);
            double[] state = new double[k];
            double common = 0;
            for (int r = 0; r < t; r++) {
                // the common factor makes the columns strongly cross-correlated, so S is ill-conditioned
                common = phi * common + rng.nextGaussian();
                for (int c = 0; c < k; c++) {
                    state[c] = phi * state[c] + rng.nextGaussian();
                    f.set(r, c, 0.7 * common + state[c] + 0.1 * c);
                }
            }
            return f;
        }

        @Override
        public String toString() {
            return regime + " seed=" + seed + " T=" + t + " K=" + k + " phi=" + phi;
        }
    }

    static List<Input> inputs() {
        List<Input> out = new ArrayList<>();
        Random meta = new Random(20240611L);
        for (int i = 0; i < 6; i++) {
            out.add(new Input(100 + i, 20 + meta.nextInt(200), 1 + meta.nextInt(8), 0.0, "white noise"));
        }
        for (int i = 0; i < 6; i++) {
            out.add(new Input(200 + i, 30 + meta.nextInt(200), 1 + meta.nextInt(8), 0.5, "moderate AR"));
        }
        for (int i = 0; i < 6; i++) {
            double phi = i % 2 == 0 ? 0.95 : 0.99;
            out.add(new Input(300 + i, 60 + meta.nextInt(300), 1 + meta.nextInt(6), phi, "strong AR"));
        }
        for (int i = 0; i < 6; i++) {
            int t = 30 + meta.nextInt(150);
            int k = t / 3 - meta.nextInt(2);
            out.add(new Input(400 + i, t, k, i % 2 == 0 ? 0.3 : 0.9, "K near T/3"));
        }
        return out;
    }

    static Stream<Arguments> psdCases() {
        List<Arguments> cases = new ArrayList<>();
        for (Input in : inputs()) {
            Random rng = new Random(in.seed() * 31 + 7);
            for (Kernel kernel : new Kernel[] {Kernel.BARTLETT, Kernel.PARZEN, Kernel.QUADRATIC_SPECTRAL}) {
                double b = 0.5 + rng.nextDouble() * in.t();
                cases.add(Arguments.of(in, kernel, new BandwidthRule.Fixed(b), false));
                if (kernel.isTruncated()) {
                    cases.add(Arguments.of(in, kernel, new BandwidthRule.Lags(rng.nextInt(in.t())), false));
                }
                cases.add(Arguments.of(in, kernel, new BandwidthRule.Andrews(), false));
                cases.add(Arguments.of(in, kernel, new BandwidthRule.NeweyWest(), false));
                if (in.t() - 1 >= 2 * in.k() + 2 && in.phi() < 0.99) {
                    cases.add(Arguments.of(in, kernel, new BandwidthRule.Andrews(), true));
                }
            }
        }
        return cases.stream();
    }

    @ParameterizedTest(name = "{1} {2} prewhiten={3} on {0}")
    @MethodSource("psdCases")
    void psdKernelsGiveSymmetricPositiveSemidefiniteEstimates(Input in, Kernel kernel, BandwidthRule rule,
            boolean prewhiten) {
        for (boolean centered : new boolean[] {true, false}) {
            LongRunEstimate est = LongRunCovariance.estimate(in.moments(),
                    new LongRunOptions(kernel, rule, centered, prewhiten));
            DMatrixRMaj s = est.covariance();
            int k = in.k();
            for (int p = 0; p < k; p++) {
                for (int q = 0; q < k; q++) {
                    assertThat(s.get(p, q)).isEqualTo(s.get(q, p));
                }
            }
            double trace = CommonOps_DDRM.trace(s);
            assertThat(trace).isPositive();
            // Newey and West (1987) for Bartlett, Andrews (1991) section 2 for Parzen and QS: their spectral
            // windows are nowhere negative, so S = U'WU/T is PSD for every series (prewhitening recolours a PSD
            // S_e by a congruence, Andrews and Monahan 1992); 1e-12 trace(S) leaves room for rounding only
            assertThat(LongRunCovariance.smallestEigenvalue(s)).as("centered=%s", centered)
                    .isGreaterThanOrEqualTo(-1e-12 * trace);
            assertThat(est.warnings()).noneMatch(w -> w.contains("not positive semidefinite"));
        }
    }

    static Stream<Arguments> tabulatedWeights() {
        double pi = Math.PI;
        // Closed forms of Andrews (1991), Econometrica 59(3), eq. (2.7) (equation number from memory), evaluated
        // by hand at points where they reduce to simple numbers. For QS, with y = 6πx/5, k = 3/y² (sin y/y - cos y).
        return Stream.of(
                Arguments.of(Kernel.NONE, 0.0, 1.0),
                Arguments.of(Kernel.NONE, 0.3, 0.0),
                Arguments.of(Kernel.TRUNCATED, 0.999, 1.0),
                Arguments.of(Kernel.TRUNCATED, -1.0, 1.0),
                Arguments.of(Kernel.TRUNCATED, 1.5, 0.0),
                Arguments.of(Kernel.BARTLETT, 0.4, 0.6),
                Arguments.of(Kernel.BARTLETT, -0.4, 0.6),
                Arguments.of(Kernel.BARTLETT, 1.0, 0.0),
                Arguments.of(Kernel.BARTLETT, 2.0, 0.0),
                // Parzen 1 - 6x² + 6|x|³ below 1/2: x = 0.1 gives 1 - 0.06 + 0.006, x = 0.25 gives 1 - 3/8 + 3/32
                Arguments.of(Kernel.PARZEN, 0.1, 0.946),
                Arguments.of(Kernel.PARZEN, 0.25, 0.71875),
                // 2(1 - |x|)³ above 1/2: x = 0.9 gives 2/1000
                Arguments.of(Kernel.PARZEN, 0.9, 0.002),
                Arguments.of(Kernel.PARZEN, -0.9, 0.002),
                Arguments.of(Kernel.PARZEN, 1.2, 0.0),
                // Tukey-Hanning (1 + cos πx)/2: cos(π/3) = 1/2, cos(2π/3) = -1/2
                Arguments.of(Kernel.TUKEY_HANNING, 1.0 / 3, 0.75),
                Arguments.of(Kernel.TUKEY_HANNING, 2.0 / 3, 0.25),
                Arguments.of(Kernel.TUKEY_HANNING, 1.0, 0.0),
                Arguments.of(Kernel.TUKEY_HANNING, 1.01, 0.0),
                // QS: y = π/2 gives 12/π² (2/π); y = π gives 3/π²; y = 3π/2 gives (4/(3π²))(-2/(3π)); y = 2π gives -3/(4π²)
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, 5.0 / 12, 24 / (pi * pi * pi)),
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, 5.0 / 6, 3 / (pi * pi)),
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, -5.0 / 6, 3 / (pi * pi)),
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, 5.0 / 4, -8 / (9 * pi * pi * pi)),
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, 5.0 / 3, -3 / (4 * pi * pi)),
                // y = 10π: 3/(100π²)(0 - 1); QS keeps weight far beyond x = 1
                Arguments.of(Kernel.QUADRATIC_SPECTRAL, 25.0 / 3, -3 / (100 * pi * pi)));
    }

    @ParameterizedTest(name = "{0} k({1}) = {2}")
    @MethodSource("tabulatedWeights")
    void kernelWeightsEqualTheirClosedForms(Kernel kernel, double x, double expected) {
        // Andrews (1991), eq. (2.7), values worked out by hand beside each row of tabulatedWeights()
        assertThat(kernel.weight(x)).isCloseTo(expected, within(2e-15));
    }
}
