package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;

class PowerUtilityErrorsTest {

    @Test
    void errorIsDiscountedMarginalUtilityTimesReturnMinusOne() {
        // beta * g^(-gamma) * R - 1, computed by hand: 0.98 * 1.02^(-2) * 1.05 - 1 (Hansen-Singleton 1982, eq. 2.2).
        PowerUtilityErrors errors = new PowerUtilityErrors(new double[][] {{1.05, 0.97}}, new double[] {1.02},
                List.of("A", "B"));
        double[] out = new double[2];
        errors.errors(new double[] {0.98, 2.0}, out);
        assertThat(out[0]).isCloseTo(0.98 / (1.02 * 1.02) * 1.05 - 1, within(1e-15));
        assertThat(out[1]).isCloseTo(0.98 / (1.02 * 1.02) * 0.97 - 1, within(1e-15));
    }

    @Test
    void refusesNonPositiveConsumptionGrowth() {
        assertThatThrownBy(() -> new PowerUtilityErrors(new double[][] {{1.0}}, new double[] {-0.01}, List.of("A")))
                .hasMessageContaining("positive gross rate");
    }
}
