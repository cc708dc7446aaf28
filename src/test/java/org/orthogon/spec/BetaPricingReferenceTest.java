package org.orthogon.spec;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.PricingError;
import org.orthogon.twopass.CrossSectionEstimate;
import org.orthogon.twopass.CrossSectionalRegression;
import org.orthogon.twopass.FactorSample;
import org.orthogon.twopass.TimeSeriesRegressions;
import org.orthogon.twopass.Weighting;

/**
 * The beta-pricing family against outside values on real data, through the model file, the assembler and
 * the estimator.
 *
 * <p>Data: SMALLCAP.RET of the R package fPortfolio as shipped by the Debian package r-cran-fportfolio
 * 3042.83.1-1+b1 (12 small-cap stocks' excess returns, 1997-2001, on MKT and on MKT and SMM), written by
 * src/test/resources/reference/twopass/smallcap_two_pass.R.
 * <ul>
 *   <li>λ (and λ_0) and the pricing errors α equal the two-pass estimates of the {@code twopass} package
 *       (OLS and GLS Fama-MacBeth cross sections on full-sample betas, itself checked against base R's lm in
 *       TwoPassReferenceTest) to a relative 1e-10: the system's selection a_T = [X'W 0; 0 I] reproduces them
 *       exactly (Cochrane 2005, "Asset Pricing", revised edition, section 12.2).</li>
 *   <li>The GMM standard errors of λ, a and β, the standard errors of α and the test α'Var(α)^+α agree to a
 *       relative 1e-8 with src/test/resources/reference/twopass/smallcap_beta_pricing.R (Debian r-base-core
 *       4.2.2.20221110-2), which computes (aD)^{-1} a S a' (aD)^{-1}'/T and
 *       (I - D(aD)^{-1}a) S (I - D(aD)^{-1}a)'/T in base R matrix algebra from the formulas, with S the HC
 *       estimate and the Bartlett estimate with 2 lags.</li>
 * </ul>
 */
class BetaPricingReferenceTest {
    private static final String FOLDER = "/reference/twopass/";

    @TempDir
    Path root;

    static List<Arguments> cases() {
        List<Arguments> cases = new java.util.ArrayList<>();
        for (String tag : List.of("capm", "two_factor")) {
            for (String weighting : List.of("ols", "gls")) {
                for (boolean intercept : List.of(false, true)) {
                    for (int lags : List.of(0, 2)) {
                        cases.add(Arguments.of(tag, weighting, intercept, lags));
                    }
                }
            }
        }
        return cases;
    }

    @ParameterizedTest(name = "{0} {1} intercept={2} lags={3}")
    @MethodSource("cases")
    void matchesTheTwoPassEstimatesAndTheScriptsStandardErrors(String tag, String weighting, boolean intercept,
            int lags) throws Exception {
        List<String> factors = tag.equals("capm") ? List.of("MKT") : List.of("MKT", "SMM");
        FittedRun run = FittedRun.of(ModelFile.read(modelFile(factors, weighting, intercept, lags)));
        GmmFit fit = run.fit();
        FactorSample sample = run.prepared().factorSample().orElseThrow();
        int n = sample.assetCount();
        int q = factors.size() + (intercept ? 1 : 0);

        CrossSectionEstimate twoPass = CrossSectionalRegression.estimate(sample, TimeSeriesRegressions.estimate(sample),
                weighting.equals("ols") ? Weighting.OLS : Weighting.GLS, intercept);
        for (int j = 0; j < q; j++) {
            assertClose(fit.parameters().get(j).estimate(), twoPass.estimates()[j], 1e-10,
                    "λ " + fit.parameters().get(j).name());
        }
        double[] alphas = twoPass.pricingErrors();
        for (int i = 0; i < n; i++) {
            assertClose(fit.pricingErrors().get(i).error(), alphas[i], 1e-10, "α " + sample.assets().get(i));
        }

        Map<String, Double> expected = reference();
        String prefix = "gmm." + tag + "." + weighting + (intercept ? "" : ".nointercept")
                + (lags == 0 ? ".hc" : ".bartlett2") + ".";
        int compared = 0;
        for (int j = 0; j < q; j++) {
            String name = fit.parameters().get(j).name();
            assertClose(fit.parameters().get(j).estimate(), expected.get(prefix + name + ".estimate"), 1e-10, name);
            assertClose(fit.parameters().get(j).stdError(), expected.get(prefix + name + ".std_error"), 1e-8,
                    name + " std. error");
            compared++;
        }
        for (int i = 0; i < n; i++) {
            String asset = sample.assets().get(i);
            PricingError alpha = fit.pricingErrors().get(i);
            assertClose(alpha.error(), expected.get(prefix + "alpha." + asset + ".estimate"), 1e-10, "α " + asset);
            assertClose(alpha.stdError(), expected.get(prefix + "alpha." + asset + ".std_error"), 1e-8,
                    "std. error of α " + asset);
            assertClose(fit.parameter("a_" + asset).stdError(), expected.get(prefix + "a_" + asset + ".std_error"),
                    1e-8, "std. error of a_" + asset);
            compared += 2;
            for (String factor : factors) {
                String name = "beta_" + asset + "_" + factor;
                assertClose(fit.parameter(name).stdError(), expected.get(prefix + name + ".std_error"), 1e-8,
                        "std. error of " + name);
                compared++;
            }
        }
        assertThat(fit.pricingErrorsJoint().df()).isEqualTo(n - q)
                .isEqualTo(expected.get(prefix + "test.df").intValue());
        assertClose(fit.pricingErrorsJoint().statistic(), expected.get(prefix + "test.statistic"), 1e-8, "joint test");
        assertClose(fit.pricingErrorsJoint().pValue(), expected.get(prefix + "test.p_value"), 1e-8, "its p-value");
        assertThat(fit.overidentification()).isEqualTo(fit.pricingErrorsJoint());
        assertThat(compared).isEqualTo(q + n * (2 + factors.size()));
        // The time-series moments are solved exactly: zero, with no sampling error.
        for (PricingError e : fit.pricingErrors().subList(n, fit.pricingErrors().size())) {
            assertThat(e.error()).as(e.asset()).isZero();
            assertThat(e.stdError()).as(e.asset()).isZero();
        }
    }

    private Path modelFile(List<String> factors, String weighting, boolean intercept, int lags) throws Exception {
        Path file = root.resolve("beta.toml");
        Files.writeString(file, String.join("\n",
                "[data]",
                "returns = \"" + resource("smallcap-returns.csv") + "\"",
                "returns_kind = \"net\"",
                "riskfree = \"" + resource("smallcap-riskfree.csv") + "\"",
                "factors = \"" + resource("smallcap-factors.csv") + "\"",
                "[model]",
                "family = \"beta-pricing\"",
                "factor_columns = [" + String.join(", ", factors.stream().map(f -> "\"" + f + "\"").toList()) + "]",
                "cross_section = \"" + weighting + "\"",
                "cross_section_intercept = " + intercept,
                "[estimation]",
                lags == 0 ? "kernel = \"none\"" : "kernel = \"bartlett\"\nlags = " + lags,
                ""));
        return file;
    }

    private static void assertClose(double actual, Double expected, double relative, String what) {
        assertThat(expected).as("a reference value for " + what).isNotNull();
        assertThat(Math.abs(actual - expected)).as("%s: Orthogon %s, reference %s", what, actual, expected)
                .isLessThanOrEqualTo(relative * Math.abs(expected) + 1e-15);
    }

    private static Map<String, Double> reference() throws Exception {
        List<String> lines = Files.readAllLines(resource("smallcap_beta_pricing_values.csv"));
        assertThat(lines.get(0)).isEqualTo("name,value");
        Map<String, Double> values = new LinkedHashMap<>();
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            values.put(cells[0], Double.parseDouble(cells[1]));
        }
        return values;
    }

    private static Path resource(String name) throws Exception {
        return Path.of(BetaPricingReferenceTest.class.getResource(FOLDER + name).toURI());
    }
}
