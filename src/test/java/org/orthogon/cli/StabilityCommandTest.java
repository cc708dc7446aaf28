package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

class StabilityCommandTest {
    private static final JsonMapper JSON = JsonMapper.builder().build();

    @TempDir
    Path root;

    @Test
    void knownSplitPeriodsAgreeWithFitOnTheSamePeriod() throws IOException {
        CliHarness cli = new CliHarness(root);
        Path model = cli.models.resolve("lumen-power-utility.toml");
        Path json = root.resolve("stability.json");
        CliHarness.Result result = cli.run("stability", model.toString(), "--split", "1995-01", "--json", json.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("1962Q1 to 1994Q4").contains("1995Q1 to 2024Q4")
                .contains("Andrews-Fair Wald").contains("sup-Wald").contains("fixed weight");
        JsonNode node = JSON.readTree(json.toFile());
        assertThat(node.get("periods")).hasSize(2);
        assertThat(node.at("/periods/0/sample/end").asString()).isEqualTo("1994Q4");
        assertThat(node.at("/periods/1/sample/observations").asInt()).isEqualTo(120);
        assertThat(node.at("/equality_test/df").asInt()).isEqualTo(2);
        assertThat(node.at("/sup_wald/critical_values").has("0.05")).isTrue();
        assertThat(node.at("/sup_wald/trimming").asDouble()).isEqualTo(0.15);
        assertThat(node.at("/fixed_weight/periods")).hasSize(2);

        // The first period is exactly `fit` with end = 1994-12.
        cli.edit(model, "[model]", "end = \"1994-12\"\n\n[model]");
        Path single = root.resolve("fit.json");
        assertThat(cli.run("fit", model.toString(), "--quiet", "--json", single.toString()).code()).isZero();
        JsonNode fit = JSON.readTree(single.toFile());
        for (int i = 0; i < 2; i++) {
            assertThat(node.at("/periods/0/parameters/" + i + "/estimate").asDouble())
                    .isCloseTo(fit.at("/parameters/" + i + "/estimate").asDouble(), within(1e-12));
            assertThat(node.at("/periods/0/parameters/" + i + "/std_error").asDouble())
                    .isCloseTo(fit.at("/parameters/" + i + "/std_error").asDouble(), within(1e-12));
        }
    }

    @Test
    void rollingWindowsFromTheCommandLine() throws IOException {
        CliHarness cli = new CliHarness(root);
        Path json = root.resolve("rolling.json");
        CliHarness.Result result = cli.run("stability", cli.models.resolve("lumen-three-factor.toml").toString(),
                "--no-sup-wald", "--window", "240", "--step", "120", "--json", json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        JsonNode rolling = JSON.readTree(json.toFile()).get("rolling");
        // 756 months: windows end at 240, 360, ..., 720.
        assertThat(rolling).hasSize(5);
        assertThat(rolling.get(0).get("start").asString()).isEqualTo("1962-01");
        assertThat(rolling.get(0).get("end").asString()).isEqualTo("1981-12");
        assertThat(rolling.get(4).at("/parameters/2/name").asString()).isEqualTo("b_TIDE");
    }

    @Test
    void writesAnOutputFolderWithTheSupWaldSequenceAndRollingPaths() throws IOException {
        CliHarness cli = new CliHarness(root);
        Path out = root.resolve("stab");
        CliHarness.Result result = cli.run("stability", cli.models.resolve("lumen-three-factor.toml").toString(),
                "--split", "1990-01", "--window", "240", "--step", "120", "--out", out.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        for (String file : new String[] {"tables/periods.tex", "tables/periods-fixed-weight.csv", "charts/sup-wald.svg",
            "charts/rolling-b-mkt.png", "report.html"}) {
            assertThat(out.resolve(file)).as(file).exists();
        }
        JsonNode manifest = JSON.readTree(out.resolve("manifest.json").toFile());
        assertThat(manifest.at("/seeds/sup_wald").asLong()).isEqualTo(org.orthogon.analysis.SupWaldDistribution.DEFAULT_SEED);
        assertThat(JSON.readTree(out.resolve("results.json").toFile()).has("sup_wald")).isTrue();
    }

    @Test
    void aSplitOutsideTheSampleIsRefused() throws IOException {
        CliHarness cli = new CliHarness(root);
        CliHarness.Result result = cli.run("stability", cli.models.resolve("lumen-power-utility.toml").toString(),
                "--split", "2030-01");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("2030-01").contains("not inside the sample").contains("fix:");
    }
}
