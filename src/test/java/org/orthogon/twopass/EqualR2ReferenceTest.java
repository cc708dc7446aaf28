package org.orthogon.twopass;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * Tests of equal cross-sectional R² (Kan, Robotti and Shanken 2013) against the base-R script
 * src/test/resources/reference/twopass/smallcap_two_pass.R on fPortfolio's SMALLCAP.RET (Debian
 * r-cran-fportfolio 3042.83.1-1+b1): the market model nested in the two-factor model, and the market
 * model against the small-minus-market model (non-nested), OLS with the intercept. Relative 1e-8.
 */
class EqualR2ReferenceTest {
    private static final double RELATIVE = 1e-8;

    @Test
    void nestedTestMatchesTheScript() throws Exception {
        Map<String, Double> r = reference();
        FactorSample two = sample();
        FactorSample market = two.withFactors(List.of("MKT"));
        EqualR2Test.Result result = EqualR2Test.compare("two", two, "market", market, Weighting.OLS, true, 1L, 100_000);
        assertThat(result.nested()).isTrue();
        assertThat(result.first()).isEqualTo("market");
        close(result.r2First(), r.get("r2test.nested.r2_restricted"));
        close(result.r2Second(), r.get("r2test.nested.r2_unrestricted"));
        close(result.statistic(), r.get("r2test.nested.statistic"));
        double[] weights = EqualR2Test.nestedLimitWeights(market, two, Weighting.OLS, true);
        assertThat(weights).hasSize(1);
        close(weights[0], r.get("r2test.nested.limit_weight"));
        // One weight: the p-value is P(ξ χ²_1 ≥ statistic), known in closed form, against the simulation.
        double exact = org.orthogon.gmm.ChiSquareTest.upperTail(result.statistic() / weights[0], 1);
        assertThat(result.pValue()).isCloseTo(exact, within(0.005));
    }

    @Test
    void nestedStatisticIsTheWaldFormOfTheExtraPricesInSample() throws Exception {
        FactorSample two = sample();
        FactorSample market = two.withFactors(List.of("MKT"));
        for (Weighting w : Weighting.values()) {
            for (boolean intercept : new boolean[] {true, false}) {
                double t = two.periods();
                double difference = t * (TwoPassResult.of(two, intercept).ols().r2()
                        - TwoPassResult.of(market, intercept).ols().r2());
                if (w == Weighting.GLS) {
                    difference = t * (TwoPassResult.of(two, intercept).gls().r2()
                            - TwoPassResult.of(market, intercept).gls().r2());
                }
                assertThat(EqualR2Test.nestedQuadraticForm(market, two, w, intercept))
                        .as("%s, intercept %s", w, intercept).isCloseTo(difference, within(1e-9 * Math.abs(difference)));
            }
        }
    }

    @Test
    void nonNestedTestMatchesTheScript() throws Exception {
        Map<String, Double> r = reference();
        FactorSample two = sample();
        EqualR2Test.Result result = EqualR2Test.compare("market", two.withFactors(List.of("MKT")), "smm",
                two.withFactors(List.of("SMM")), Weighting.OLS, true, 1L, 1000);
        assertThat(result.nested()).isFalse();
        close(result.r2First(), r.get("r2test.nonnested.r2_first"));
        close(result.r2Second(), r.get("r2test.nonnested.r2_second"));
        close(result.statistic(), r.get("r2test.nonnested.statistic"));
        close(result.sameCrossSection().statistic(), r.get("r2test.nonnested.wald"));
        close(result.sameCrossSection().pValue(), r.get("r2test.nonnested.wald_p_value"));
        assertThat(result.sameCrossSection().df()).isEqualTo(2);
    }

    private static void close(double actual, double expected) {
        assertThat(Math.abs(actual - expected)).as("Orthogon %s, script %s", actual, expected)
                .isLessThanOrEqualTo(RELATIVE * Math.abs(expected));
    }

    /** Excess returns (stocks minus T90) and the two factors, read from the script's files. */
    static FactorSample sample() throws Exception {
        double[][] returns = read("smallcap-returns.csv");
        double[][] rate = read("smallcap-riskfree.csv");
        double[][] factors = read("smallcap-factors.csv");
        for (int t = 0; t < returns.length; t++) {
            for (int i = 0; i < returns[t].length; i++) {
                returns[t][i] -= rate[t][0];
            }
        }
        List<String> header = Arrays.asList(Files.readAllLines(path("smallcap-returns.csv")).get(0).split(","));
        return new FactorSample(header.subList(1, header.size()), List.of("MKT", "SMM"), returns, factors);
    }

    private static double[][] read(String name) throws Exception {
        List<String> lines = Files.readAllLines(path(name));
        return lines.subList(1, lines.size()).stream().map(line -> Arrays.stream(line.split(",")).skip(1)
                .mapToDouble(Double::parseDouble).toArray()).toArray(double[][]::new);
    }

    static Map<String, Double> reference() throws Exception {
        Map<String, Double> values = new HashMap<>();
        List<String> lines = Files.readAllLines(path("smallcap_two_pass_values.csv"));
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            values.put(cells[0], Double.parseDouble(cells[1]));
        }
        return values;
    }

    private static Path path(String name) throws Exception {
        return Path.of(EqualR2ReferenceTest.class.getResource("/reference/twopass/" + name).toURI());
    }
}
