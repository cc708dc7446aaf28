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
 * `two-pass` on the shipped Lumen model file: the truth of the simulated economy (docs/demo-scenario.md:
 * no alphas, the simulator's loadings as betas, the factor means as premia of these traded factors and a
 * zero intercept) is recovered, and the output folder holds every table and chart.
 */
class TwoPassCommandTest {
    @TempDir
    Path root;

    @Test
    void recoversTheLumenTruth() throws Exception {
        CliHarness cli = new CliHarness(root);
        Path json = root.resolve("two-pass.json");
        CliHarness.Result result = cli.run("two-pass", cli.models.resolve("lumen-two-pass.toml").toString(), "--json",
                json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).isEmpty();
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        LumenEconomy economy = LumenEconomy.standard();
        // No alphas in the economy: the GRS test should not reject (it does at 5% in one sample in twenty).
        assertThat(node.at("/time_series/grs/p_value").asDouble()).isGreaterThan(0.05);
        assertThat(node.at("/time_series/grs/df1").asInt()).isEqualTo(12);
        assertThat(node.at("/time_series/grs/df2").asInt()).isEqualTo(756 - 12 - 3);
        double[][] loadings = economy.loadings();
        JsonNode betas = node.at("/time_series/betas");
        for (int i = 0; i < 12; i++) {
            for (int k = 0; k < 3; k++) {
                JsonNode beta = betas.get(i).get("loadings").get(k);
                assertThat(Math.abs(beta.get("estimate").asDouble() - loadings[i][k]) / beta.get("std_error").asDouble())
                        .as("beta %d %d", i, k).isLessThan(4.0);
            }
        }
        for (String section : new String[] {"cross_section", "cross_section_gls"}) {
            JsonNode cs = node.get(section);
            within(cs.get("intercept"), 0.0);
            for (int k = 0; k < 3; k++) {
                JsonNode premium = cs.get("risk_premia").get(k);
                assertThat(premium.get("factor").asString()).isEqualTo(economy.factorNames().get(k));
                within(premium, economy.factorMeans()[k]);
            }
        }
        // The true model explains the spread of mean returns: a high OLS R².
        assertThat(node.at("/cross_section/r2/estimate").asDouble()).isGreaterThan(0.8);
    }

    @Test
    void writesEveryTableAndChart() throws Exception {
        CliHarness cli = new CliHarness(root);
        Path out = root.resolve("report");
        CliHarness.Result result = cli.run("two-pass", cli.models.resolve("lumen-two-pass.toml").toString(), "--out",
                out.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("GRS test of all alphas zero").contains("Report folder:");
        for (String table : new String[] {"time-series", "cross-section-ols", "cross-section-gls",
            "two-pass-pricing-errors"}) {
            for (String ext : new String[] {".csv", ".md", ".tex"}) {
                assertThat(out.resolve("tables/" + table + ext)).exists();
            }
        }
        for (String chart : new String[] {"realised-vs-predicted", "realised-vs-predicted-gls"}) {
            assertThat(out.resolve("charts/" + chart + ".png")).exists();
            assertThat(out.resolve("charts/" + chart + ".svg")).exists();
        }
        assertThat(Files.readString(out.resolve("report.html"))).contains("GRS test").contains("not investment advice");
        JsonNode manifest = JsonMapper.builder().build().readTree(out.resolve("manifest.json").toFile());
        assertThat(manifest.get("command").asString()).isEqualTo("two-pass");
    }

    @Test
    void refusesAModelThatIsNotLinearInFactors() throws Exception {
        CliHarness cli = new CliHarness(root);
        CliHarness.Result result = cli.run("two-pass", cli.models.resolve("lumen-power-utility.toml").toString());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("lumen-power-utility.toml").contains("family = \"power-utility\"")
                .contains("fix:");
    }

    /** Within 2.5 of the larger (Shanken or robust) standard errors of the truth. */
    private static void within(JsonNode coefficient, double truth) {
        double se = Math.max(coefficient.get("std_error_shanken").asDouble(),
                coefficient.get("std_error_misspecification_robust").asDouble());
        assertThat(Math.abs(coefficient.get("estimate").asDouble() - truth) / se).isLessThan(2.5);
    }
}
