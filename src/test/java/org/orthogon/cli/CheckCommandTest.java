package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CheckCommandTest {
    @TempDir
    Path root;

    @Test
    void checkPrintsTheSampleAndSizesWithoutEstimating() throws IOException {
        CliHarness cli = new CliHarness(root);
        CliHarness.Result result = cli.run("check", cli.models.resolve("lumen-power-utility.toml").toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("1962Q1 to 2024Q4, T = 252 quarterly")
                .contains("N = 12 test assets, K = 12 moments, P = 2 parameters, K - P = 10")
                .contains("lumen-consumption-quarterly.csv").contains("compounded to quarterly")
                .doesNotContain("Hansen J");
    }

    @Test
    void checkPassesOnEveryShippedModelFile() throws IOException {
        CliHarness cli = new CliHarness(root);
        try (var files = java.nio.file.Files.list(cli.models)) {
            List<Path> models = files.filter(p -> p.toString().endsWith(".toml")).sorted().toList();
            assertThat(models).hasSizeGreaterThanOrEqualTo(9);
            for (Path model : models) {
                CliHarness.Result result = cli.run("check", model.toString());
                assertThat(result.code()).as("%s: %s", model.getFileName(), result.err()).isZero();
            }
        }
    }

    @Test
    void checkWarnsWhenMomentsAreManyForTheSample() throws IOException {
        CliHarness cli = new CliHarness(root);
        cli.edit(cli.models.resolve("lumen-power-utility.toml"), "[model]", "start = \"2000-01\"\n\n[model]");
        CliHarness.Result result = cli.run("check", cli.models.resolve("lumen-power-utility.toml").toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("T = 100").contains("WARNING [many-moments] K = 12 moments against T = 100");
    }

    @Test
    void checkRefusesBadDataWithExitTwo() throws IOException {
        CliHarness cli = new CliHarness(root);
        cli.edit(cli.data.resolve("lumen-factors-monthly.csv"), "1962-03,", "1962-02,");
        CliHarness.Result result = cli.run("check", cli.models.resolve("lumen-three-factor.toml").toString());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("lumen-factors-monthly.csv").contains("line 4").contains("1962-02");
        assertThat(result.out()).isEmpty();
    }
}
