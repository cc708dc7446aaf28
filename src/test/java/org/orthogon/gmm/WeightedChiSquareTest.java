package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/** The exact (Imhof) upper tail of Σ λ_j z_j² against closed forms, an independent quadrature and simulation. */
class WeightedChiSquareTest {
    private static final double TOLERANCE = 2 * WeightedChiSquare.ERROR_BOUND;

    private static double tail(double x, double... weights) {
        return WeightedChiSquare.upperTail(x, weights).orElseThrow();
    }

    @ParameterizedTest(name = "{0} equal weights {1}")
    @MethodSource("equalWeights")
    void equalWeightsGiveTheScaledChiSquareTail(int m, double weight) {
        // Σ c z_j² = c χ²_m: Commons Math's chi-square distribution (regularized gamma function)
        ChiSquaredDistribution chiSquare = new ChiSquaredDistribution(null, m);
        double[] weights = new double[m];
        Arrays.fill(weights, weight);
        for (double q : new double[] {0.01, 0.2, 0.5, 0.8, 0.95, 0.999}) {
            double x = weight * chiSquare.inverseCumulativeProbability(q);
            assertThat(tail(x, weights)).as("x = %s", x).isCloseTo(1 - q, within(TOLERANCE));
        }
    }

    static Stream<Arguments> equalWeights() {
        return Stream.of(Arguments.of(1, 1.0), Arguments.of(2, 0.5), Arguments.of(3, 2.0), Arguments.of(5, 1.0),
                Arguments.of(10, 0.03), Arguments.of(97, 1.7));
    }

    @Test
    void nistTableUpperFivePercentPointOfChiSquareFive() {
        // NIST/SEMATECH e-Handbook of Statistical Methods, table 1.3.6.7.4: the upper 5% point of χ²_5 is
        // 11.070 (rounded to 3 decimals, hence the tolerance)
        assertThat(tail(11.070, 1, 1, 1, 1, 1)).isCloseTo(0.05, within(2e-5));
        assertThat(tail(22.140, 2, 2, 2, 2, 2)).isCloseTo(0.05, within(2e-5));
    }

    @Test
    void twoPairsOfWeightsGiveTheHypoexponentialTail() {
        // a χ²_2 + b χ²_2 is the sum of two exponentials with means 2a and 2b, whose tail is
        // (a e^{-x/2a} - b e^{-x/2b}) / (a - b) (common practice, no source)
        double a = 1.5;
        double b = 0.4;
        for (double x : new double[] {0.2, 1.0, 3.0, 8.0, 20.0}) {
            double expected = (a * Math.exp(-x / (2 * a)) - b * Math.exp(-x / (2 * b))) / (a - b);
            assertThat(tail(x, a, a, b, b)).as("x = %s", x).isCloseTo(expected, within(TOLERANCE));
        }
    }

    @ParameterizedTest(name = "{0} x={2}")
    @MethodSource("quadratureReference")
    void matchesAnIndependentQuadratureOfImhofsIntegral(String name, double[] weights, double x, double expected) {
        // SciPy QUADPACK (QAGS, QAWF) on Imhof's integral, from
        // src/test/resources/reference/weighted_chisquare_reference.py
        assertThat(tail(x, weights)).isCloseTo(expected, within(TOLERANCE));
    }

    static Stream<Arguments> quadratureReference() throws IOException {
        List<Arguments> cases = new ArrayList<>();
        try (InputStream in = WeightedChiSquareTest.class.getResourceAsStream(
                "/reference/weighted_chisquare_reference.csv")) {
            List<String> lines = new String(in.readAllBytes(), StandardCharsets.UTF_8).lines().skip(1).toList();
            for (String line : lines) {
                String[] cells = line.split(",");
                double[] weights = Arrays.stream(cells[1].split(" ")).mapToDouble(Double::parseDouble).toArray();
                cases.add(Arguments.of(cells[0], weights, Double.parseDouble(cells[2]), Double.parseDouble(cells[3])));
            }
        }
        return cases.stream();
    }

    @Test
    void agreesWithTheSimulatedTailItReplaces() {
        // the simulation kept as a check: 200,000 draws put it within 4 standard errors
        double[] weights = {3.1, 1.2, 0.9, 0.4, 0.4, 0.05, 0.01};
        int draws = 200_000;
        for (double x : new double[] {2.0, 6.0, 15.0}) {
            double exact = tail(x, weights);
            double simulated = HansenJagannathan.weightedChiSquareUpperTail(x, weights, 11L, draws);
            assertThat(simulated).isCloseTo(exact, within(4 * Math.sqrt(exact * (1 - exact) / draws) + 1e-6));
        }
    }

    @Test
    void edgeCasesAreExact() {
        assertThat(tail(0.0, 1, 2, 3)).isEqualTo(1.0);
        assertThat(tail(-1.0, 1, 2, 3)).isEqualTo(1.0);
        assertThat(tail(1.0)).isEqualTo(0.0);
        assertThat(tail(1.0, 0, 0)).isEqualTo(0.0);
        // zero weights drop out: 2 z² + 0 z² is 2 χ²_1
        assertThat(tail(3.0, 2.0, 0.0)).isCloseTo(tail(3.0, 2.0), within(1e-15));
        // far below every weight the lower tail is below 1e-17, so the upper tail is exactly 1
        assertThat(tail(1e-20, 1, 1, 1, 1, 1)).isEqualTo(1.0);
        // the order of the weights does not matter
        assertThat(tail(4.0, 0.5, 2.0, 1.0)).isEqualTo(tail(4.0, 2.0, 1.0, 0.5));
    }
}
