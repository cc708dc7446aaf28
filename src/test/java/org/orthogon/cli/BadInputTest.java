package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Each kind of bad input gives exit code 2 and one message naming the file, the line (and column
 * where there is one) and the fix; no stack trace, and no output file.
 */
class BadInputTest {
    @TempDir
    Path root;
    CliHarness cli;
    Path json;

    @BeforeEach
    void copyProject() throws IOException {
        cli = new CliHarness(root);
        json = root.resolve("results.json");
    }

    private CliHarness.Result fit(String model) {
        return cli.run("fit", cli.models.resolve(model).toString(), "--json", json.toString());
    }

    private void assertRefused(CliHarness.Result result, String file, int line, String... mentions) {
        assertThat(result.code()).as(result.err()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).startsWith("error: ").contains(file).contains("fix:");
        assertThat(result.err()).doesNotContain("Exception").doesNotContain("\tat ");
        assertThat(result.err().lines().count()).as("one message of at most two lines: %s", result.err())
                .isLessThanOrEqualTo(2);
        Matcher matcher = Pattern.compile("line (\\d+)").matcher(result.err());
        assertThat(matcher.find()).as("names a line: %s", result.err()).isTrue();
        assertThat(Integer.parseInt(matcher.group(1))).as(result.err()).isEqualTo(line);
        for (String mention : mentions) {
            assertThat(result.err()).contains(mention);
        }
        assertThat(result.out()).isEmpty();
        assertThat(json).as("no output file is written").doesNotExist();
        assertThat(root.resolve("out")).doesNotExist();
    }

    @Test
    void missingDataFile() throws IOException {
        cli.edit(cli.models.resolve("lumen-power-utility.toml"), "lumen-consumption-quarterly.csv", "no-such-file.csv");
        assertRefused(fit("lumen-power-utility.toml"), "lumen-power-utility.toml", 10, "does not exist", "no-such-file.csv");
    }

    @Test
    void missingModelFile() {
        CliHarness.Result result = cli.run("fit", cli.models.resolve("nope.toml").toString());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("nope.toml").contains("does not exist").contains("fix:");
    }

    @Test
    void missingColumn() throws IOException {
        cli.edit(cli.models.resolve("lumen-power-utility.toml"), "consumption_column = \"cons_growth\"",
                "consumption_column = \"cons_grwth\"");
        assertRefused(fit("lumen-power-utility.toml"), "lumen-consumption-quarterly.csv", 1, "cons_grwth",
                "did you mean \"cons_growth\"", "consumption_column", "line 14");
    }

    @Test
    void nonNumericCell() throws IOException {
        cli.edit(cli.data.resolve("lumen-factors-monthly.csv"), "1962-02,0.070819", "1962-02,0.07o819");
        assertRefused(fit("lumen-three-factor.toml"), "lumen-factors-monthly.csv", 3, "column 2", "0.07o819");
    }

    @Test
    void duplicateDate() throws IOException {
        cli.edit(cli.data.resolve("lumen-consumption-quarterly.csv"), "1962Q2,", "1962Q1,");
        assertRefused(fit("lumen-power-utility.toml"), "lumen-consumption-quarterly.csv", 3, "1962Q1");
    }

    @Test
    void unsortedDates() throws IOException {
        Path file = cli.data.resolve("lumen-riskfree-monthly.csv");
        List<String> lines = new java.util.ArrayList<>(Files.readAllLines(file));
        String third = lines.get(3);
        lines.set(3, lines.get(4));
        lines.set(4, third);
        Files.write(file, lines);
        assertRefused(fit("lumen-three-factor.toml"), "lumen-riskfree-monthly.csv", 5);
    }

    @Test
    void percentLookingReturnsDeclaredDecimal() throws IOException {
        Path file = cli.data.resolve("lumen-portfolios-monthly.csv");
        List<String> lines = Files.readAllLines(file);
        StringBuilder scaled = new StringBuilder(lines.get(0)).append('\n');
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            scaled.append(cells[0]);
            for (int j = 1; j < cells.length; j++) {
                scaled.append(',').append(new java.math.BigDecimal(cells[j]).movePointRight(2).toPlainString());
            }
            scaled.append('\n');
        }
        Files.writeString(file, scaled.toString());
        CliHarness.Result result = fit("lumen-three-factor.toml");
        assertThat(result.err()).contains("percent");
        Matcher line = Pattern.compile("line (\\d+)").matcher(result.err());
        assertThat(line.find()).isTrue();
        assertRefused(result, "lumen-portfolios-monthly.csv", Integer.parseInt(line.group(1)), "column");
    }

    @Test
    void fewerObservationsThanMoments() throws IOException {
        cli.edit(cli.models.resolve("lumen-power-utility.toml"), "[model]", "start = \"2023-01\"\nend = \"2024-12\"\n\n[model]");
        assertRefused(fit("lumen-power-utility.toml"), "lumen-power-utility.toml", 12, "8 observations", "12 moments");
    }

    @Test
    void unknownModelFileKey() throws IOException {
        cli.edit(cli.models.resolve("lumen-power-utility.toml"), "kernel = \"bartlett\"", "kernal = \"bartlett\"");
        assertRefused(fit("lumen-power-utility.toml"), "lumen-power-utility.toml", 19, "kernal",
                "did you mean \"kernel\"");
    }

    @Test
    void unknownMethodOnTheCommandLine() {
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-power-utility.toml").toString(),
                "--method", "three-step", "--json", json.toString());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("three-step").contains("one-step, two-step");
        assertThat(json).doesNotExist();
    }
}
