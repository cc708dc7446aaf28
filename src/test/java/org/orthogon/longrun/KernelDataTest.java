package org.orthogon.longrun;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * Every kernel's data agrees with its weight function, so that a kernel added to {@link Kernel} is
 * checked here without a line of new test code: its support really bounds its weights (the lag sum
 * never stops early), its lag offset makes "L lags" mean lags 1..L, its PSD flag matches its Toeplitz
 * weight matrices, its default bandwidth rule is one it accepts, and every rule it accepts gives an
 * estimate.
 */
class KernelDataTest {
    private static final double[] BANDWIDTHS = {0.4, 1.0, 1.5, 2.0, 3.7, 5.0, 8.25, 13.0, 40.0};

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void weightsAreEvenOneAtZeroAndZeroBeyondTheSupport(Kernel kernel) {
        // Andrews (1991), section 2: every kernel is even with k(0) = 1.
        assertThat(kernel.weight(0.0)).isEqualTo(1.0);
        for (double x = 0.01; x < 30; x += 0.173) {
            assertThat(kernel.weight(-x)).isEqualTo(kernel.weight(x));
            if (x > kernel.support()) {
                assertThat(kernel.weight(x)).as("%s: k(%s) beyond the support %s", kernel, x, kernel.support())
                        .isZero();
            }
        }
    }

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void theLagSumReachesEveryWeightedLag(Kernel kernel) {
        int maxLag = 400;
        for (double b : BANDWIDTHS) {
            int last = kernel.lastWeightedLag(b, maxLag);
            assertThat(last).isBetween(0, maxLag);
            for (int j = last + 1; j <= maxLag; j++) {
                assertThat(kernel.weight(j / b)).as("%s with b = %s: lag %d carries weight but the sum stops at %d",
                        kernel, b, j, last).isZero();
            }
        }
    }

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void aLagCountWeightsLagsOneToLAndNoneBeyond(Kernel kernel) {
        if (!kernel.acceptsLagCount() || !kernel.usesBandwidth()) {
            return;
        }
        for (int lags = 0; lags <= 20; lags++) {
            double b = kernel.bandwidthForLags(lags);
            for (int j = 1; j <= lags; j++) {
                assertThat(kernel.weight(j / b)).as("%s, %d lags: lag %d", kernel, lags, j).isPositive();
            }
            assertThat(b == 0 ? 0.0 : kernel.weight((lags + 1) / b)).as("%s, %d lags: lag %d", kernel, lags, lags + 1)
                    .isZero();
            assertThat(kernel.lastWeightedLag(b, 1000)).isGreaterThanOrEqualTo(lags);
        }
    }

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void thePositiveSemidefiniteFlagMatchesTheWeightMatrices(Kernel kernel) {
        // S = U'WU/T with W_ts = k((t - s)/b) (Andrews 1991, section 2): S is PSD for every U exactly when W is.
        double smallest = Double.POSITIVE_INFINITY;
        for (double b : BANDWIDTHS) {
            smallest = Math.min(smallest, smallestEigenvalue(weightMatrix(kernel, b, 60)));
        }
        if (kernel.guaranteesPositiveSemidefinite()) {
            assertThat(smallest).as(kernel.id()).isGreaterThan(-1e-10);
        } else {
            assertThat(smallest).as("%s is flagged as not PSD, so some W must show it", kernel.id()).isLessThan(-1e-6);
        }
    }

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void theDefaultRuleIsAcceptedAndEveryAcceptedRuleGivesAnEstimate(Kernel kernel) {
        assertThat(LongRunOptions.conflict(kernel, kernel.defaultBandwidth())).isEmpty();
        DMatrixRMaj f = series(7, 80, 3);
        List<BandwidthRule> rules = List.of(new BandwidthRule.Lags(3), new BandwidthRule.Fixed(2.5),
                new BandwidthRule.Andrews(), new BandwidthRule.NeweyWest(), kernel.defaultBandwidth());
        for (BandwidthRule rule : rules) {
            for (boolean prewhiten : new boolean[] {false, true}) {
                if (LongRunOptions.conflict(kernel, rule).isPresent()) {
                    assertThatThrownBy(() -> new LongRunOptions(kernel, rule, true, prewhiten))
                            .isInstanceOf(IllegalArgumentException.class);
                    continue;
                }
                LongRunEstimate estimate = LongRunCovariance.estimate(f, new LongRunOptions(kernel, rule, true, prewhiten));
                assertThat(estimate.covariance().get(0, 0)).as("%s %s", kernel, rule).isPositive();
            }
        }
    }

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void acceptedChoicesAndConflictsAgree(Kernel kernel) {
        List<String> accepted = LongRunOptions.acceptedChoices(kernel);
        assertThat(accepted.contains("lags = L")).isEqualTo(kernel.usesBandwidth()
                && LongRunOptions.conflict(kernel, new BandwidthRule.Lags(2)).isEmpty());
        assertThat(accepted.contains("bandwidth = \"newey-west\"")).isEqualTo(kernel.usesBandwidth()
                && LongRunOptions.conflict(kernel, new BandwidthRule.NeweyWest()).isEmpty());
        assertThat(accepted.contains("bandwidth = \"andrews\"")).isEqualTo(kernel.usesBandwidth()
                && LongRunOptions.conflict(kernel, new BandwidthRule.Andrews()).isEmpty());
        assertThat(Kernel.ids()).contains(kernel.id());
    }

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void automaticBandwidthConstantsAreThePublishedOnes(Kernel kernel) {
        // Andrews (1991), eq. (6.2)-(6.4): c and q per kernel; Newey and West (1994), Table I and
        // section 3: c, q and the exponent of the truncation-lag rule. Values as printed there (from memory).
        List<Object> andrews = kernel.andrews().map(c -> List.<Object>of(c.q(), c.constant())).orElse(List.of());
        List<Object> neweyWest = kernel.neweyWest().map(c -> List.<Object>of(c.q(), c.constant(), c.rate()))
                .orElse(List.of());
        // A switch expression, so a new kernel does not compile until its published constants are added here.
        List<List<Object>> expected = switch (kernel) {
            case NONE -> List.of(List.of(), List.of());
            case TRUNCATED -> List.of(List.of(2, 0.6611), List.of());
            case BARTLETT -> List.of(List.of(1, 1.1447), List.of(1, 1.1447, 2.0 / 9.0));
            case PARZEN -> List.of(List.of(2, 2.6614), List.of(2, 2.6614, 4.0 / 25.0));
            case TUKEY_HANNING -> List.of(List.of(2, 1.7462), List.of());
            case QUADRATIC_SPECTRAL -> List.of(List.of(2, 1.3221), List.of(2, 1.3221, 2.0 / 25.0));
        };
        assertThat(andrews).isEqualTo(expected.get(0));
        assertThat(neweyWest).isEqualTo(expected.get(1));
    }

    @ParameterizedTest
    @EnumSource(Kernel.class)
    void theModelFileReferenceDescribesEveryKernelAsItIs(Kernel kernel) throws java.io.IOException {
        String docs = java.nio.file.Files.readString(java.nio.file.Path.of("docs/model-file.md"));
        String row = docs.lines().filter(line -> line.startsWith("| `" + kernel.id() + "` |")).findFirst()
                .orElseThrow(() -> new AssertionError("docs/model-file.md has no row for kernel " + kernel.id()));
        String[] cells = row.split("\\|");
        assertThat(cells[3].strip()).as("PSD column").isEqualTo(kernel.guaranteesPositiveSemidefinite() ? "yes" : "no");
        String lags = cells[4].strip();
        if (!kernel.usesBandwidth()) {
            assertThat(lags).startsWith("(no lags");
        } else if (!kernel.acceptsLagCount()) {
            assertThat(lags).startsWith("refused");
        } else {
            assertThat(lags).isEqualTo(kernel.bandwidthForLags(7) == 8.0 ? "b = L + 1" : "b = L");
        }
        BandwidthRule rule = kernel.defaultBandwidth();
        String expected = !kernel.usesBandwidth() ? "no bandwidth"
                : rule instanceof BandwidthRule.Lags l ? "`lags = " + l.lags() + "`"
                : rule instanceof BandwidthRule.Fixed b ? "`bandwidth = " + b.bandwidth() + "`"
                : rule instanceof BandwidthRule.Andrews ? "`bandwidth = \"andrews\"`" : "`bandwidth = \"newey-west\"`";
        assertThat(cells[5].strip()).as("default").isEqualTo(expected);
        List<String> rules = new ArrayList<>();
        kernel.andrews().filter(c -> kernel.usesBandwidth()).ifPresent(c -> rules.add("`andrews`"));
        kernel.neweyWest().ifPresent(c -> rules.add("`newey-west`"));
        assertThat(cells[6].strip()).as("automatic rules").isEqualTo(rules.isEmpty() ? "none" : String.join(", ", rules));
    }

    private static DMatrixRMaj weightMatrix(Kernel kernel, double b, int t) {
        DMatrixRMaj w = new DMatrixRMaj(t, t);
        for (int i = 0; i < t; i++) {
            for (int j = 0; j < t; j++) {
                w.set(i, j, kernel.weight((i - j) / b));
            }
        }
        return w;
    }

    private static double smallestEigenvalue(DMatrixRMaj symmetric) {
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(symmetric.numRows, false, true);
        assertThat(eig.decompose(symmetric.copy())).isTrue();
        List<Double> values = new ArrayList<>();
        for (int i = 0; i < symmetric.numRows; i++) {
            values.add(eig.getEigenvalue(i).getReal());
        }
        return values.stream().mapToDouble(Double::doubleValue).min().orElseThrow();
    }

    private static DMatrixRMaj series(long seed, int t, int k) {
        Random rng = new Random(seed);
        DMatrixRMaj f = new DMatrixRMaj(t, k);
        double[] previous = new double[k];
        for (int r = 0; r < t; r++) {
            for (int c = 0; c < k; c++) {
                previous[c] = 0.5 * previous[c] + rng.nextGaussian();
                f.set(r, c, previous[c]);
            }
        }
        return f;
    }
}
