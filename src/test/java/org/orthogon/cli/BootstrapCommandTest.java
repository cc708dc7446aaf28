package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * `fit --bootstrap`, `stability --bootstrap` and `montecarlo` end to end on the small Lumen fixture: the
 * JSON fields of docs/output.md, the report folders' tables, charts and manifest seeds, and the same bytes
 * for one and two threads (every replication's stream is a function of the seed and its index).
 */
class BootstrapCommandTest {
    private static final JsonMapper JSON = JsonMapper.builder().build();

    @TempDir
    Path root;

    private static void run(String... args) {
        CliHarness.Result result = CliHarness.runIn(args);
        assertThat(result.code()).as(result.err()).isZero();
    }

    @Test
    void fitBootstrapWritesItsFieldsAndTheSameBytesForAnyThreadCount() throws IOException {
        LumenFixture.writeTo(root);
        String model = root.resolve(LumenFixture.LINEAR).toString();
        Path one = root.resolve("one.json");
        Path two = root.resolve("two.json");
        run("fit", model, "--quiet", "--bootstrap", "29", "--seed", "11", "--threads", "1", "--json", one.toString());
        run("fit", model, "--quiet", "--bootstrap", "29", "--seed", "11", "--threads", "2", "--json", two.toString(),
                "--out", root.resolve("report").toString());
        assertThat(Files.readString(two)).isEqualTo(Files.readString(one));
        JsonNode boot = JSON.readTree(one.toFile()).get("bootstrap");
        assertThat(boot.get("replications").asInt()).isEqualTo(29);
        assertThat(boot.get("seed").asLong()).isEqualTo(11L);
        assertThat(boot.get("block_scheme").asString()).isEqualTo("moving");
        assertThat(boot.get("block_length").asInt()).isPositive();
        assertThat(boot.get("failed_replications").asInt()).isZero();
        double p = boot.get("overidentification").get("p_value").asDouble();
        // (1 + count) / (B + 1) with B = 29: a multiple of 1/30
        assertThat(Math.abs(p * 30 - Math.rint(p * 30))).isLessThan(1e-9);
        assertThat(boot.get("pricing_errors_joint").has("p_value")).isTrue();
        JsonNode parameter = boot.get("parameters").get(0);
        assertThat(parameter.get("conf_low").asDouble()).isLessThan(parameter.get("conf_high").asDouble());
        Path report = root.resolve("report");
        assertThat(report.resolve("tables/bootstrap.csv")).exists();
        assertThat(report.resolve("charts/bootstrap-j.svg")).exists();
        assertThat(JSON.readTree(report.resolve("manifest.json").toFile()).get("seeds").get("bootstrap").asLong())
                .isEqualTo(11L);
    }

    @Test
    void montecarloReportsRatesWithTheirStandardErrorsAndTheSameBytesForAnyThreadCount() throws IOException {
        LumenFixture.writeTo(root);
        String model = root.resolve(LumenFixture.LINEAR).toString();
        Path one = root.resolve("one.json");
        Path two = root.resolve("two.json");
        run("montecarlo", model, "--quiet", "--replications", "40", "--threads", "1", "--json", one.toString(),
                "--alternative", "TIDE_LO = 0.01");
        run("montecarlo", model, "--quiet", "--replications", "40", "--threads", "2", "--json", two.toString(),
                "--alternative", "TIDE_LO = 0.01", "--out", root.resolve("mc").toString());
        assertThat(Files.readString(two)).isEqualTo(Files.readString(one));
        JsonNode results = JSON.readTree(one.toFile());
        assertThat(results.get("analysis").asString()).isEqualTo("montecarlo");
        assertThat(results.get("simulation").get("alternative").get("pricing_errors").get(0).get("moment").asString())
                .isEqualTo("TIDE_LO");
        JsonNode first = results.get("rejection_rates").get(0);
        assertThat(first.get("kind").asString()).isEqualTo("power");
        JsonNode fivePercent = first.get("levels").get(1);
        double rate = fivePercent.get("rate").asDouble();
        int successful = results.get("simulation").get("successful_replications").asInt();
        // binomial Monte Carlo standard error √(r(1 - r)/R) (common practice, no source)
        assertThat(fivePercent.get("mc_std_error").asDouble())
                .isCloseTo(Math.sqrt(rate * (1 - rate) / successful), org.assertj.core.api.Assertions.within(1e-15));
        Path mc = root.resolve("mc");
        assertThat(mc.resolve("tables/rejection-rates.csv")).exists();
        assertThat(mc.resolve("charts/rejection-rates.svg")).exists();
        assertThat(JSON.readTree(mc.resolve("manifest.json").toFile()).get("seeds").has("montecarlo")).isTrue();
    }

    @Test
    void stabilityBootstrapAddsCriticalValuesBesideAndrewsForBothVariants() throws IOException {
        LumenFixture.writeTo(root);
        String model = root.resolve(LumenFixture.LINEAR).toString();
        Path json = root.resolve("stability.json");
        run("stability", model, "--quiet", "--bootstrap", "19", "--threads", "2", "--json", json.toString());
        JsonNode results = JSON.readTree(json.toFile());
        for (JsonNode variant : java.util.List.of(results, results.get("fixed_weight"))) {
            JsonNode boot = variant.get("sup_wald").get("bootstrap");
            assertThat(boot.get("replications").asInt()).isEqualTo(19);
            assertThat(boot.get("critical_values").get("0.05").asDouble())
                    .isLessThanOrEqualTo(boot.get("critical_values").get("0.01").asDouble());
        }
    }
}
