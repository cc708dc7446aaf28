package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import org.junit.jupiter.api.Test;

class RecursiveUtilityErrorsTest {
    private static final List<String> ASSETS = List.of("S1T1", "S2T2", "S3T3");

    @Test
    void nestsPowerUtilityAtPsiEqualToOneOverGamma() {
        // θ = (1-γ)/(1-1/ψ) = 1 when ψ = 1/γ, so m = β g^{-γ} (Epstein and Zin 1989, Econometrica 57).
        FamilyFixtures data = new FamilyFixtures(7L, 50, 3, 1);
        double gamma = 10.0;
        RecursiveUtilityErrors recursive = new RecursiveUtilityErrors(data.gross, data.growth, data.wealth, ASSETS, "R_w");
        double[] e = FamilyFixtures.errors(recursive, new double[] {0.98, gamma, 1.0 / gamma});
        double[] power = FamilyFixtures.errors(new PowerUtilityErrors(data.gross, data.growth, ASSETS),
                new double[] {0.98, gamma});
        for (int t = 0; t < 50; t++) {
            for (int i = 0; i < 3; i++) {
                assertThat(e[t * 4 + i]).isCloseTo(power[t * 3 + i], within(1e-12));
            }
            // The proxy's own Euler equation: β g^{-γ} R_w - 1.
            assertThat(e[t * 4 + 3]).isCloseTo(0.98 * Math.pow(data.growth[t], -gamma) * data.wealth[t] - 1,
                    within(1e-12));
        }
        assertThat(recursive.assetNames()).containsExactly("S1T1", "S2T2", "S3T3", "R_w");
        assertThat(recursive.parameterNames()).containsExactly("beta", "gamma", "psi");
    }

    @Test
    void logRiskAversionGivesTheGrowthOptimalSdf() {
        // γ = 1 gives θ = 0 and m = 1/R_w, so the proxy's error is exactly zero (Epstein and Zin 1989).
        FamilyFixtures data = new FamilyFixtures(8L, 20, 3, 1);
        double[] e = FamilyFixtures.errors(new RecursiveUtilityErrors(data.gross, data.growth, data.wealth, ASSETS,
                "R_w"), new double[] {0.97, 1.0, 0.5});
        for (int t = 0; t < 20; t++) {
            assertThat(e[t * 4 + 3]).isCloseTo(0.0, within(1e-15));
            assertThat(e[t * 4]).isCloseTo(data.gross[t][0] / data.wealth[t] - 1, within(1e-14));
        }
    }

    @Test
    void handWorkedPoint() {
        // γ = 5, ψ = 1.5: θ = -4 / (1/3) = -12 by hand; m = β^-12 g^8 R_w^-13.
        assertThat(RecursiveUtilityErrors.theta(5.0, 1.5)).isCloseTo(-12.0, within(1e-12));
        double[][] gross = {{1.03}};
        RecursiveUtilityErrors family = new RecursiveUtilityErrors(gross, new double[] {1.01}, new double[] {1.02},
                List.of("A"), "W");
        double[] e = FamilyFixtures.errors(family, new double[] {0.99, 5.0, 1.5});
        double m = Math.pow(0.99, -12) * Math.pow(1.01, 8) * Math.pow(1.02, -13);
        assertThat(e[0]).isCloseTo(m * 1.03 - 1, within(1e-13));
        assertThat(e[1]).isCloseTo(m * 1.02 - 1, within(1e-13));
        assertThat(family.isLinear()).isFalse();
    }

    @Test
    void unitElasticityIsRefusedNamingTheValues() {
        FamilyFixtures data = new FamilyFixtures(9L, 5, 3, 1);
        RecursiveUtilityErrors family = new RecursiveUtilityErrors(data.gross, data.growth, data.wealth, ASSETS, "R_w");
        double[] out = new double[5 * 4];
        assertThatThrownBy(() -> family.errors(new double[] {0.98, 10.0, 1.0}, out))
                .isInstanceOf(ParameterOutOfRangeException.class)
                .hasMessageContaining("psi = 1.0").hasMessageContaining("gamma = 10.0").hasMessageContaining("infinite");
        assertThatThrownBy(() -> RecursiveUtilityErrors.theta(1.0, 1.0)).hasMessageContaining("0/0");
        // ψ = 0 is finite in the (1 - γ)ψ/(ψ - 1) form: θ = 0.
        assertThat(RecursiveUtilityErrors.theta(2.0, 0.0)).isEqualTo(0.0);
        assertThatThrownBy(() -> family.errors(new double[] {-0.5, 10.0, 0.5}, out))
                .isInstanceOf(ParameterOutOfRangeException.class).hasMessageContaining("beta = -0.5");
        assertThatThrownBy(() -> family.errorDerivatives(new double[] {0.98, 2.0, 1.0 + 1e-9}, new double[3][20]))
                .isInstanceOf(ParameterOutOfRangeException.class);
    }

    @Test
    void refusesTheProxyAmongTheAssetsAndNonPositiveWealthReturns() {
        double[][] gross = {{1.01}};
        assertThatThrownBy(() -> new RecursiveUtilityErrors(gross, new double[] {1.0}, new double[] {1.0},
                List.of("W"), "W")).hasMessageContaining("added once");
        assertThatThrownBy(() -> new RecursiveUtilityErrors(gross, new double[] {1.0}, new double[] {0.0},
                List.of("A"), "W")).hasMessageContaining("positive gross return");
    }
}
