package org.orthogon.bootstrap;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

/** Bootstrap p-values and order statistics (Davison and Hinkley 1997, equation 4.11 and section 2.4). */
class QuantilesTest {
    private static final double[] DRAWS = {1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16, 17, 18, 19};

    @Test
    void pValueCountsTheSampleAsOneOfTheDraws() {
        assertThat(Quantiles.upperTailPValue(DRAWS, 19.5)).isCloseTo(1.0 / 20, within(1e-15));
        assertThat(Quantiles.upperTailPValue(DRAWS, 19.0)).isCloseTo(2.0 / 20, within(1e-15));
        assertThat(Quantiles.upperTailPValue(DRAWS, 0.0)).isCloseTo(1.0, within(1e-15));
        assertThat(Quantiles.upperTailPValue(new double[0], 1.0)).isNaN();
    }

    @Test
    void quantileIsTheOrderStatisticAtBPlusOneTimesAlpha() {
        // (19 + 1) 0.95 = 19: the largest of 19 draws; (19 + 1) 0.5 = 10: the tenth
        assertThat(Quantiles.orderStatistic(DRAWS, 0.95)).isEqualTo(19.0);
        assertThat(Quantiles.orderStatistic(DRAWS, 0.5)).isEqualTo(10.0);
        assertThat(Quantiles.orderStatistic(DRAWS, 0.525)).isCloseTo(10.5, within(1e-12));
        assertThat(Quantiles.orderStatistic(DRAWS, 0.01)).isEqualTo(1.0);
    }
}
