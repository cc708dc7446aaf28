package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunOptions;

/** The many-moments rule K² v / T > 1.5 against the Monte Carlo table of docs/methods.md ("Many moments"). */
class ManyMomentsTest {

    @Test
    void varianceFactorOfTheKernels() {
        // v = 1 + 2 Σ k(j/b)²: Bartlett with 4 lags (b = 5) weights 0.8, 0.6, 0.4, 0.2, so v = 1 + 2(1.2) = 3.4
        // (Newey and West 1987 weights; the sum is arithmetic).
        assertThat(ManyMoments.varianceFactor(Kernel.BARTLETT, 5.0, 252)).isCloseTo(3.4, within(1e-12));
        assertThat(ManyMoments.varianceFactor(Kernel.NONE, 0.0, 252)).isEqualTo(1.0);
        // Truncated with b = 3: three lags of weight 1, v = 7.
        assertThat(ManyMoments.varianceFactor(Kernel.TRUNCATED, 3.0, 252)).isCloseTo(7.0, within(1e-12));
    }

    @Test
    void warningFiresWhereTheMonteCarloFoundTheSizeDoubled() {
        LongRunOptions bartlett = LongRunOptions.bartlettLags(4);
        LongRunOptions hc = LongRunOptions.heteroskedasticityConsistent();
        // 5% rejection rates above 10% in the Monte Carlo: flagged.
        assertThat(ManyMoments.warning(12, 132, bartlett)).isPresent(); // 20.9%
        assertThat(ManyMoments.warning(12, 252, bartlett)).isPresent(); // 10.9%
        assertThat(ManyMoments.warning(25, 600, bartlett)).isPresent(); // 16.1%
        assertThat(ManyMoments.warning(25, 252, hc)).isPresent(); // 12.5%
        // Within 7%: not flagged.
        assertThat(ManyMoments.warning(12, 252, hc)).isEmpty(); // 6.3%
        assertThat(ManyMoments.warning(6, 252, bartlett)).isEmpty(); // 6.7%
        assertThat(ManyMoments.warning(12, 1200, bartlett)).isEmpty(); // 6.9%
        assertThat(ManyMoments.warning(12, 252, bartlett).orElseThrow()).contains("K² v / T = 1.94")
                .contains("heteroskedasticity-consistent S");
        // An automatic bandwidth is unknown before estimation and counts as v = 1.
        LongRunOptions andrews = new LongRunOptions(Kernel.BARTLETT, new BandwidthRule.Andrews(), true, false);
        assertThat(ManyMoments.warning(12, 252, andrews)).isEmpty();
    }
}
