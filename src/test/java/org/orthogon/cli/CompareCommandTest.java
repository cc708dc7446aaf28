package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

class CompareCommandTest {
    @TempDir
    Path root;

    @Test
    void comparesTheThreeFactorAndMarketOnlyModelsAndTestsTheNesting() throws IOException {
        CliHarness cli = new CliHarness(root);
        Path json = root.resolve("compare.json");
        CliHarness.Result result = cli.run("compare", cli.models.resolve("lumen-three-factor.toml").toString(),
                cli.models.resolve("lumen-market-only.toml").toString(), "--json", json.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("cross-sectional R2").contains("Nested models");
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        assertThat(node.get("models")).hasSize(2);
        assertThat(node.at("/models/0/cross_sectional_r2").isNumber()).isTrue();
        assertThat(node.at("/models/1/rms_pricing_error").asDouble()).isPositive();
        // The market-only SDF leaves priced risk unexplained, so its HJ distance exceeds the true model's.
        assertThat(node.at("/models/1/hj_distance/value").asDouble())
                .isGreaterThan(node.at("/models/0/hj_distance/value").asDouble());
        JsonNode nested = node.at("/nested_tests/0");
        assertThat(nested.get("restricted").asString()).isEqualTo("Market-only SDF on the Lumen portfolios");
        assertThat(nested.get("df").asInt()).isEqualTo(2);
        // The demo economy prices SIZE and TIDE (docs/demo-scenario.md), so dropping them should be rejected.
        assertThat(nested.get("p_value").asDouble()).isLessThan(0.05);
    }

    @Test
    void writesAnOutputFolderWithTheComparisonTablesAndCharts() throws IOException {
        CliHarness cli = new CliHarness(root);
        Path out = root.resolve("cmp");
        CliHarness.Result result = cli.run("compare", cli.models.resolve("lumen-three-factor.toml").toString(),
                cli.models.resolve("lumen-market-only.toml").toString(), "--out", out.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        for (String file : new String[] {"results.json", "manifest.json", "report.html", "tables/comparison-parameters.tex",
            "tables/comparison-tests.csv", "tables/nested-tests.md", "charts/realised-vs-implied-2.svg"}) {
            assertThat(out.resolve(file)).as(file).exists();
        }
        org.jsoup.nodes.Document html = org.jsoup.Jsoup.parse(out.resolve("report.html").toFile());
        // Own-weight parameters, tests and nested tests; common-weight models, HJ-distance and R2 tests.
        assertThat(html.select("table")).hasSize(6);
        assertThat(html.select("svg")).hasSize(3);
        JsonNode manifest = JsonMapper.builder().build().readTree(out.resolve("manifest.json").toFile());
        assertThat(manifest.get("models")).hasSize(2);
    }

    @Test
    void refusesModelsOnDifferentAssets() throws IOException {
        CliHarness cli = new CliHarness(root);
        CliHarness.Result result = cli.run("compare", cli.models.resolve("lumen-three-factor.toml").toString(),
                cli.models.resolve("lumen-power-utility.toml").toString());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("lumen-power-utility.toml").contains("sample").contains("fix:");
    }
}
