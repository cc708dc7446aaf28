package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.demo.LumenEconomy;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * models/lumen-beta-pricing.toml through `check` and `fit`, against the truth of the simulated economy
 * (docs/demo-scenario.md, from the simulator's documented parameters, not from any estimate): the risk
 * premia are the factor means, the betas the loadings, and there are no pricing errors. Premia must lie
 * within 2.5 GMM standard errors of the truth, betas within 4 (36 of them), and the joint test of the
 * pricing errors must not reject at 1%; for the OLS and the GLS cross section and with the intercept,
 * whose truth is zero.
 */
class BetaPricingCommandTest {
    private static final String MODEL = "lumen-beta-pricing.toml";

    @TempDir
    Path root;

    @Test
    void recoversTheLumenTruthWithTheOlsCrossSection() throws Exception {
        CliHarness cli = new CliHarness(root);
        JsonNode node = fit(cli, "ols");
        assertTruth(node, false);
        assertThat(node.get("family").asString()).isEqualTo("beta-pricing");
        assertThat(node.get("method").asString()).isEqualTo("one-step");
        assertThat(node.at("/beta_pricing/cross_section").asString()).isEqualTo("ols");
        assertThat(node.at("/beta_pricing/time_series_moments").asInt()).isEqualTo(48);
        assertThat(node.at("/overidentification/df").asInt()).isEqualTo(12 - 3);
        assertThat(node.get("hj_distance")).isNull();
    }

    @Test
    void recoversTheLumenTruthWithTheGlsCrossSectionAndAnIntercept() throws Exception {
        CliHarness cli = new CliHarness(root);
        cli.edit(cli.models.resolve(MODEL), "cross_section_intercept = false", "cross_section_intercept = true");
        JsonNode node = fit(cli, "gls");
        assertTruth(node, true);
        assertThat(node.at("/overidentification/df").asInt()).isEqualTo(12 - 4);
    }

    @Test
    void checkAgreesWithFitAndTheReportFolderHoldsTheTimeSeriesTable() throws Exception {
        CliHarness cli = new CliHarness(root);
        Path model = cli.models.resolve(MODEL);
        CliHarness.Result check = cli.run("check", model.toString());
        assertThat(check.code()).as(check.err()).isZero();
        assertThat(check.out()).contains("K = 60 moments, P = 51 parameters, K - P = 9")
                .contains("48 time-series parameters").doesNotContain("beta_S3T4_TIDE");
        // An efficient method is refused alike by check and fit, from the command line and from the file.
        for (String verb : java.util.List.of("check", "fit")) {
            CliHarness.Result refused = cli.run(verb, model.toString(), "--method", "two-step");
            assertThat(refused.code()).isEqualTo(Main.EXIT_INPUT);
            assertThat(refused.err()).contains("singular by construction").contains("--method one-step");
        }
        String fromCheck = cli.run("check", model.toString(), "--method", "continuously-updated").err();
        assertThat(cli.run("fit", model.toString(), "--method", "continuously-updated").err()).isEqualTo(fromCheck);
        Path out = root.resolve("report");
        CliHarness.Result fit = cli.run("fit", model.toString(), "--out", out.toString());
        assertThat(fit.code()).as(fit.err()).isZero();
        assertThat(fit.out()).contains("lambda_TIDE").contains("Time-series regressions inside the system")
                .doesNotContain("eps_S1T1").doesNotContain("WARNING");
        assertThat(out.resolve("tables/time-series.csv")).exists();
        assertThat(Files.readString(out.resolve("tables/parameters.csv"))).doesNotContain("beta_S1T1_MKT");
        assertThat(Files.readAllLines(out.resolve("tables/pricing-errors.csv"))).hasSize(1 + 12);
        // two-pass reads the same file: its OLS premia without intercept are the system's.
        Path json = root.resolve("two-pass.json");
        CliHarness.Result twoPass = cli.run("two-pass", model.toString(), "--no-intercept", "--json", json.toString(),
                "--quiet");
        assertThat(twoPass.code()).as(twoPass.err()).isZero();
        JsonNode premia = JsonMapper.builder().build().readTree(json.toFile()).at("/cross_section/risk_premia");
        JsonNode system = fit(cli, "ols").get("parameters");
        for (int k = 0; k < 3; k++) {
            assertThat(system.get(k).get("estimate").asDouble())
                    .isCloseTo(premia.get(k).get("estimate").asDouble(), org.assertj.core.api.Assertions.within(1e-12));
        }
    }

    @Test
    void stabilityComparesTheRiskPremiaOnly() throws Exception {
        // The draws are i.i.d., so the premia are the same in every period: the test should not reject.
        CliHarness cli = new CliHarness(root);
        Path json = root.resolve("stability.json");
        CliHarness.Result result = cli.run("stability", cli.models.resolve(MODEL).toString(), "--split", "1995-01",
                "--no-sup-wald", "--json", json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        assertThat(node.at("/equality_test/df").asInt()).isEqualTo(3);
        assertThat(node.at("/equality_test/p_value").asDouble()).isGreaterThan(0.01);
        assertThat(node.get("variant").asString()).contains("lambda_MKT, lambda_SIZE, lambda_TIDE only");
        assertThat(node.get("fixed_weight")).isNull();

        // The unknown-break test's limit is that of K = 1 premium on a small synthetic panel.
        java.util.Random random = new java.util.Random(7);
        int t = 120;
        double[][] returns = new double[t][4];
        double[][] factors = new double[t][1];
        java.util.List<String> dates = new java.util.ArrayList<>();
        for (int s = 0; s < t; s++) {
            factors[s][0] = 0.005 + 0.04 * random.nextGaussian();
            for (int i = 0; i < 4; i++) {
                returns[s][i] = (0.6 + 0.3 * i) * factors[s][0] + 0.02 * random.nextGaussian();
            }
            dates.add(Integer.toString(s));
        }
        org.orthogon.moments.MomentModel model = org.orthogon.moments.ScaledMoments.unscaled(
                new org.orthogon.moments.BetaPricingErrors(returns, factors, java.util.List.of("A", "B", "C", "D"),
                        java.util.List.of("F"), org.orthogon.moments.BetaPricingErrors.CrossSection.OLS, false));
        assertThat(org.orthogon.analysis.Stability.testedParameters(model)).isEqualTo(1);
        org.orthogon.analysis.Stability.SupWald sup = org.orthogon.analysis.Stability.supWald(model,
                new double[model.parameterCount()], dates, new org.orthogon.gmm.GmmOptions(
                        org.orthogon.gmm.EstimationMethod.ONE_STEP,
                        org.orthogon.longrun.LongRunOptions.heteroskedasticityConsistent()), 0.15, 11L, 2000, i -> { });
        assertThat(sup.distribution().parameters()).isEqualTo(1);
        assertThat(sup.statistic()).isPositive();
    }

    private JsonNode fit(CliHarness cli, String crossSection) throws Exception {
        Path model = cli.models.resolve(MODEL);
        if (!crossSection.equals("ols")) {
            cli.edit(model, "cross_section = \"ols\"", "cross_section = \"" + crossSection + "\"");
        }
        Path json = root.resolve(crossSection + ".json");
        CliHarness.Result result = cli.run("fit", model.toString(), "--json", json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        return JsonMapper.builder().build().readTree(json.toFile());
    }

    private static void assertTruth(JsonNode node, boolean intercept) {
        LumenEconomy economy = LumenEconomy.standard();
        JsonNode parameters = node.get("parameters");
        assertThat(parameters).hasSize(3 + (intercept ? 1 : 0));
        if (intercept) {
            assertThat(parameters.get(0).get("name").asString()).isEqualTo("lambda_0");
            within(parameters.get(0), 0.0, 2.5);
        }
        for (int k = 0; k < 3; k++) {
            JsonNode premium = parameters.get(k + (intercept ? 1 : 0));
            assertThat(premium.get("name").asString()).isEqualTo("lambda_" + economy.factorNames().get(k));
            within(premium, economy.factorMeans()[k], 2.5);
        }
        JsonNode timeSeries = node.get("time_series_parameters");
        assertThat(timeSeries).hasSize(12 * 4);
        double[][] loadings = economy.loadings();
        for (int i = 0; i < 12; i++) {
            within(timeSeries.get(i), 0.0, 4.0);
            for (int k = 0; k < 3; k++) {
                within(timeSeries.get(12 + 3 * i + k), loadings[i][k], 4.0);
            }
        }
        assertThat(node.get("pricing_errors")).hasSize(12);
        assertThat(node.at("/pricing_errors_joint/p_value").asDouble()).isGreaterThan(0.01);
    }

    private static void within(JsonNode estimate, double truth, double standardErrors) {
        double distance = Math.abs(estimate.get("estimate").asDouble() - truth) / estimate.get("std_error").asDouble();
        assertThat(distance).as("%s: estimate %s, truth %s", estimate.get("name").asString(),
                estimate.get("estimate").asDouble(), truth).isLessThan(standardErrors);
    }
}
