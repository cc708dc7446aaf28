package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * {@code fit --s-sets} and the Windmeijer column end to end on the Lumen power-utility model: the JSON shape
 * of the robust sets, the console lines, the charts in the report folder. The numbers themselves are checked
 * against the independent scripts in RobustSetsTest and WindmeijerCorrectionTest.
 */
class RobustInferenceCommandTest {
    @TempDir
    Path root;
    CliHarness cli;

    @BeforeEach
    void copyProject() throws IOException {
        cli = new CliHarness(root);
    }

    @Test
    void robustSetsReachJsonConsoleAndReportFolder() throws IOException {
        Path json = root.resolve("fit.json");
        Path out = root.resolve("report");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-power-utility.toml").toString(),
                "--s-sets", "--s-points", "41", "--s-range", "gamma=-30:50", "--json", json.toString(), "--out",
                out.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("Weak-identification-robust sets at 95%")
                .contains("gamma      S       concentrated").contains("open above");
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        JsonNode sets = node.get("robust_sets");
        assertThat(sets).hasSize(2 * 3 + 2);
        JsonNode gamma = null;
        for (JsonNode set : sets) {
            assertThat(set.has("parameter") && set.has("level") && set.has("method") && set.has("intervals")).isTrue();
            if (set.get("parameter").asString().equals("gamma") && set.get("method").asString().equals("S")
                    && set.get("set").asString().equals("concentrated")) {
                gamma = set;
            }
        }
        assertThat(gamma).isNotNull();
        assertThat(gamma.get("level").asDouble()).isEqualTo(0.95);
        assertThat(gamma.get("df").asInt()).isEqualTo(11);
        assertThat(gamma.at("/search_range/0").asDouble()).isEqualTo(-30.0);
        assertThat(gamma.at("/intervals/0/0").asDouble()).isCloseTo(1.8587, within(1e-4));
        assertThat(gamma.at("/intervals/0/1").asDouble()).isCloseTo(19.4354, within(1e-4));
        // The K-set of gamma reaches the end of the search range: that end is null, with the reason.
        JsonNode gammaK = null;
        for (JsonNode set : sets) {
            if (set.get("parameter").asString().equals("gamma") && set.get("method").asString().equals("K")
                    && set.get("set").asString().equals("concentrated")) {
                gammaK = set;
            }
        }
        JsonNode intervals = gammaK.get("intervals");
        assertThat(intervals.get(intervals.size() - 1).get(1).isNull()).isTrue();
        assertThat(gammaK.get("notes").toString()).contains("open above");
        // The smallest S met on this 41-point grid: at or above min S = 8.6508 (s_sets_reference.py's profile).
        assertThat(node.at("/robust_sets_summary/minimum_s").asDouble()).isBetween(8.6508, 8.7);
        assertThat(out.resolve("charts/robust-profile-gamma.svg")).exists();
        assertThat(out.resolve("charts/robust-profile-beta.png")).exists();
        assertThat(out.resolve("charts/robust-joint-s.svg")).exists();
        assertThat(Files.readString(out.resolve("report.html"))).contains("Weak-identification-robust sets");
        assertThat(out.resolve("tables/robust-sets.csv")).exists();
    }

    @Test
    void windmeijerStandardErrorsSitBesideTheUsualOnes() throws IOException {
        Path json = root.resolve("fit.json");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-power-utility.toml").toString(),
                "--json", json.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("Windmeijer s.e.");
        // K² v / T = 144 x 3.4 / 252 = 1.94 > 1.5 (Bartlett 4 lags): the many-moments warning, once, from the fit.
        assertThat(result.out().split("K² v / T = 1.94", -1)).hasSize(2);
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        // windmeijer_values.csv of the reference script: 0.008748467412488465 and 2.06247839740364
        assertThat(node.at("/parameters/0/std_error_windmeijer").asDouble()).isCloseTo(0.0087484674, within(1e-8));
        assertThat(node.at("/parameters/1/std_error_windmeijer").asDouble()).isCloseTo(2.0624784, within(1e-5));
        assertThat(node.at("/windmeijer_correction/applied").asBoolean()).isTrue();
        assertThat(node.at("/windmeijer_correction/bandwidth_held_fixed").asDouble()).isEqualTo(5.0);

        Path oneStep = root.resolve("one.json");
        CliHarness.Result one = cli.run("fit", cli.models.resolve("lumen-power-utility.toml").toString(),
                "--method", "one-step", "--json", oneStep.toString(), "--quiet");
        assertThat(one.code()).as(one.err()).isZero();
        JsonNode fixed = JsonMapper.builder().build().readTree(oneStep.toFile());
        assertThat(fixed.at("/parameters/0/std_error_windmeijer").isNull()).isTrue();
        assertThat(fixed.at("/windmeijer_correction/reason").asString()).contains("two-step");
    }
}
