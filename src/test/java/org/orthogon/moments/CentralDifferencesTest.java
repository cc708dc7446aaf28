package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.Test;

class CentralDifferencesTest {

    @Test
    void derivativesOfKnownFunctionsAreAccurateToTheOrderOfEpsilonToTwoThirds() {
        // e_0 = exp(a) sin(b), e_1 = a^3 / b, e_2 = 1e6 a b: derivatives by calculus.
        CentralDifferences.ErrorFunction f = (theta, out) -> {
            out[0] = Math.exp(theta[0]) * Math.sin(theta[1]);
            out[1] = Math.pow(theta[0], 3) / theta[1];
            out[2] = 1e6 * theta[0] * theta[1];
        };
        double a = 0.7;
        double b = 25.0;
        double[][] d = new double[2][3];
        CentralDifferences.derivatives(f, new double[] {a, b}, 3, d);
        // Error of order ε^{2/3} ≈ 4e-11 times the size of the third derivative (Nocedal and Wright
        // 2006, section 8.1, from memory); 1e-8 relative leaves room for the constants.
        assertThat(d[0][0]).isCloseTo(Math.exp(a) * Math.sin(b), within(1e-8));
        assertThat(d[1][0]).isCloseTo(Math.exp(a) * Math.cos(b), within(1e-8));
        assertThat(d[0][1]).isCloseTo(3 * a * a / b, within(1e-9));
        assertThat(d[1][1]).isCloseTo(-a * a * a / (b * b), within(1e-10));
        assertThat(d[0][2]).isCloseTo(1e6 * b, within(1e-8 * 1e6 * b));
        assertThat(d[1][2]).isCloseTo(1e6 * a, within(1e-8 * 1e6 * a));
    }

    @Test
    void stepsScaleWithTheParameterAndNeverShrinkBelowTheUnitStep() {
        double cubeRootEpsilon = Math.cbrt(Math.pow(2, -52));
        assertThat(CentralDifferences.step(0.0)).isEqualTo(cubeRootEpsilon);
        assertThat(CentralDifferences.step(0.5)).isEqualTo(cubeRootEpsilon);
        assertThat(CentralDifferences.step(-200.0)).isCloseTo(200 * cubeRootEpsilon, within(1e-18));
        assertThat(cubeRootEpsilon).isCloseTo(6.055454e-6, within(1e-11));
    }

    @Test
    void theParameterPointIsLeftUnchanged() {
        double[] theta = {1.5, -2.0};
        double[][] out = new double[2][1];
        CentralDifferences.derivatives((t, o) -> o[0] = t[0] * t[1], theta, 1, out);
        assertThat(theta).containsExactly(1.5, -2.0);
        assertThat(out[0][0]).isCloseTo(-2.0, within(1e-9));
        assertThat(out[1][0]).isCloseTo(1.5, within(1e-9));
    }
}
