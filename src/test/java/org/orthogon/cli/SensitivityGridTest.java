package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.analysis.SensitivityGrid;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** `fit --sensitivity` rows equal separate `fit` runs with the same long-run covariance options. */
class SensitivityGridTest {
    private static final JsonMapper JSON = JsonMapper.builder().build();

    @TempDir
    Path root;

    @Test
    void gridRowsAgreeWithSeparateFits() throws IOException {
        CliHarness cli = new CliHarness(root);
        String model = cli.models.resolve("lumen-power-utility.toml").toString();
        Path gridJson = root.resolve("grid.json");
        CliHarness.Result result = cli.run("fit", model, "--sensitivity", "--json", gridJson.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("Sensitivity of the overidentification test").contains("quadratic-spectral");
        JsonNode grid = JSON.readTree(gridJson.toFile()).get("sensitivity");
        assertThat(grid).hasSize(SensitivityGrid.choices(true).size());

        // A spread of rows: HC, fixed lags, a QS bandwidth, both automatic rules, prewhitened ones.
        List<String[]> checks = new ArrayList<>();
        checks.add(new String[] {"none", "-", "no", "--kernel", "none"});
        checks.add(new String[] {"bartlett", "lags 7", "no", "--kernel", "bartlett", "--lags", "7"});
        checks.add(new String[] {"parzen", "lags 3", "yes", "--kernel", "parzen", "--lags", "3", "--prewhiten"});
        checks.add(new String[] {"quadratic-spectral", "b = 5", "no", "--kernel", "quadratic-spectral", "--bandwidth", "5"});
        checks.add(new String[] {"quadratic-spectral", "andrews", "yes", "--kernel", "quadratic-spectral",
            "--bandwidth", "andrews", "--prewhiten"});
        checks.add(new String[] {"bartlett", "newey-west", "no", "--kernel", "bartlett", "--bandwidth", "newey-west"});
        for (String[] check : checks) {
            JsonNode row = find(grid, check[0], check[1], check[2].equals("yes"));
            Path single = root.resolve("single.json");
            List<String> args = new ArrayList<>(List.of("fit", model, "--quiet", "--json", single.toString()));
            args.addAll(List.of(check).subList(3, check.length));
            CliHarness.Result separate = cli.run(args.toArray(String[]::new));
            assertThat(separate.code()).as(separate.err()).isZero();
            JsonNode fit = JSON.readTree(single.toFile());
            String label = String.join(" ", check);
            assertThat(row.get("statistic").asDouble()).as(label)
                    .isCloseTo(fit.at("/overidentification/statistic").asDouble(), within(1e-12));
            assertThat(row.get("bandwidth").asDouble()).as(label)
                    .isCloseTo(fit.at("/long_run_covariance/bandwidth").asDouble(), within(1e-12));
            for (JsonNode parameter : fit.get("parameters")) {
                assertThat(row.at("/std_errors/" + parameter.get("name").asString()).asDouble()).as(label)
                        .isCloseTo(parameter.get("std_error").asDouble(), within(1e-12));
            }
        }
    }

    private static JsonNode find(JsonNode grid, String kernel, String bandwidth, boolean prewhitened) {
        for (JsonNode row : grid) {
            if (row.get("kernel").asString().equals(kernel) && row.get("bandwidth_choice").asString().equals(bandwidth)
                    && row.get("prewhitened").asBoolean() == prewhitened) {
                return row;
            }
        }
        throw new AssertionError("no grid row " + kernel + " " + bandwidth + " prewhitened=" + prewhitened);
    }
}
