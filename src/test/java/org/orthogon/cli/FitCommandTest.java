package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.report.JsonResults;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

class FitCommandTest {
    @TempDir
    Path root;
    CliHarness cli;

    @BeforeEach
    void copyProject() throws IOException {
        cli = new CliHarness(root);
    }

    @Test
    void fitPrintsTheParameterTableTheJTestAndOnePricingErrorPerAsset() {
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-power-utility.toml").toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("Parameters").contains("beta").contains("gamma")
                .contains("Hansen J test").contains("10 degrees of freedom")
                .contains("Pricing errors").contains("not investment advice");
        for (String asset : new String[] {"S1T1", "S1T4", "S2T2", "S3T4"}) {
            assertThat(result.out()).contains("\n  " + asset + " ");
        }
        assertThat(result.err()).isEmpty();
    }

    @Test
    void jsonFollowsTheContract() throws IOException {
        Path json = root.resolve("fit.json");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(),
                "--json", json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).isEmpty();
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        for (String field : JsonResults.contractFields()) {
            assertThat(node.has(field)).as("field %s", field).isTrue();
        }
        assertThat(node.get("family").asString()).isEqualTo("linear-factor");
        assertThat(node.get("method").asString()).isEqualTo("two-step");
        assertThat(node.at("/sample/start").asString()).isEqualTo("1962-01");
        assertThat(node.at("/sample/end").asString()).isEqualTo("2024-12");
        assertThat(node.at("/sample/observations").asInt()).isEqualTo(756);
        assertThat(node.at("/long_run_covariance/kernel").asString()).isEqualTo("bartlett");
        assertThat(node.at("/long_run_covariance/bandwidth").asDouble()).isEqualTo(5.0);
        assertThat(node.at("/long_run_covariance/centered").asBoolean()).isTrue();
        assertThat(node.get("parameters")).hasSize(3);
        assertThat(node.at("/parameters/0/name").asString()).isEqualTo("b_MKT");
        for (String field : new String[] {"estimate", "std_error", "t_stat", "p_value"}) {
            assertThat(node.at("/parameters/0/" + field).isNumber()).as(field).isTrue();
        }
        JsonNode parameter = node.at("/parameters/1");
        assertThat(parameter.get("t_stat").asDouble())
                .isCloseTo(parameter.get("estimate").asDouble() / parameter.get("std_error").asDouble(), within(1e-12));
        assertThat(node.at("/overidentification/df").asInt()).isEqualTo(9);
        assertThat(node.get("pricing_errors")).hasSize(12);
        assertThat(node.at("/pricing_errors/0/asset").asString()).isEqualTo("S1T1");
        assertThat(node.at("/pricing_errors_joint/df").asInt()).isEqualTo(9);
    }

    @Test
    void commandLineOptionsOverrideTheModelFile() throws IOException {
        Path json = root.resolve("override.json");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(),
                "--method", "one-step", "--kernel", "none", "--json", json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        assertThat(node.get("method").asString()).isEqualTo("one-step");
        assertThat(node.at("/long_run_covariance/kernel").asString()).isEqualTo("none");
        assertThat(node.at("/long_run_covariance/bandwidth").asDouble()).isZero();
        assertThat(node.at("/overidentification/kind").asString()).isEqualTo("pricing-errors-joint");

        Path lags = root.resolve("lags.json");
        cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(), "--lags", "12", "--json",
                lags.toString(), "--quiet");
        assertThat(JsonMapper.builder().build().readTree(lags.toFile()).at("/long_run_covariance/bandwidth").asDouble())
                .as("Bartlett with L lags has bandwidth L + 1 (Newey-West 1987)").isEqualTo(13.0);
    }

    @Test
    void uncenteredAndPrewhitenedOptionsReachTheEstimate() throws IOException {
        Path json = root.resolve("uncentered.json");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(),
                "--no-centered", "--prewhiten", "--json", json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        assertThat(node.at("/long_run_covariance/centered").asBoolean()).isFalse();
        assertThat(node.at("/long_run_covariance/prewhitened").asBoolean()).isTrue();
    }

    @Test
    void simulateWritesTheDemoFiles() {
        Path out = root.resolve("sim");
        CliHarness.Result result = cli.run("simulate", "--out", out.toString(), "--years", "2", "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(out.resolve("lumen-portfolios-monthly.csv")).exists();
        assertThat(out.resolve("lumen-consumption-quarterly.csv")).content().startsWith("date,cons_growth\n1962Q1,");
    }

    @Test
    void unknownVerbIsAUsageError() {
        CliHarness.Result result = cli.run("estimate");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("estimate");
    }
}
