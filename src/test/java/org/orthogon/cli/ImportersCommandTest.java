package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The importers and transforms reached from model files: the multi-section text layout, two-column
 * series files with missing values at the edges, consumption levels, a price deflator and declared
 * instrument lags. Each must give the numbers the plain wide CSV gives (up to the demo files' rounding).
 */
class ImportersCommandTest {
    private static final JsonMapper JSON = JsonMapper.builder().build();

    @TempDir
    Path root;
    CliHarness cli;

    @BeforeEach
    void copy() throws IOException {
        cli = new CliHarness(root);
    }

    private Path model(String name, String text) throws IOException {
        Path file = cli.models.resolve(name);
        Files.writeString(file, text);
        return file;
    }

    private JsonNode fit(Path model) throws IOException {
        Path json = root.resolve(model.getFileName() + ".json");
        CliHarness.Result result = cli.run("fit", model.toString(), "--quiet", "--json", json.toString());
        assertThat(result.code()).as(result.err()).isZero();
        return JSON.readTree(json.toFile());
    }

    @Test
    void sectionedTextTableGivesTheWideCsvEstimates() throws IOException {
        String csvModel = Files.readString(cli.models.resolve("lumen-three-factor.toml"));
        Path sectioned = model("sectioned.toml", csvModel
                .replace("returns = \"../demo-data/lumen-portfolios-monthly.csv\"",
                        "returns = \"../demo-data/lumen-portfolios-sections.txt\"\n"
                                + "returns_table = \"Lumen size/tide portfolios, value-weighted monthly returns\"")
                .replace("units = \"decimal\"", "units = \"percent\"")
                .replace("factors = \"../demo-data/lumen-factors-monthly.csv\"",
                        "factors = \"../demo-data/lumen-factors-percent.csv\""));
        // The factors in percent too, since units apply to every return-like series of a model file.
        StringBuilder percent = new StringBuilder();
        for (String line : Files.readAllLines(cli.data.resolve("lumen-factors-monthly.csv"))) {
            String[] cells = line.split(",");
            percent.append(cells[0]);
            for (int j = 1; j < cells.length; j++) {
                percent.append(',').append(line.startsWith("date") ? cells[j]
                        : new java.math.BigDecimal(cells[j]).movePointRight(2).toPlainString());
            }
            percent.append('\n');
        }
        Files.writeString(cli.data.resolve("lumen-factors-percent.csv"), percent.toString());
        Files.writeString(cli.data.resolve("lumen-riskfree-percent.csv"), percentOf("lumen-riskfree-monthly.csv"));
        cli.edit(sectioned, "lumen-riskfree-monthly.csv", "lumen-riskfree-percent.csv");
        JsonNode fromSections = fit(sectioned);
        JsonNode fromCsv = fit(cli.models.resolve("lumen-three-factor.toml"));
        for (int i = 0; i < 3; i++) {
            assertThat(fromSections.at("/parameters/" + i + "/estimate").asDouble())
                    .isCloseTo(fromCsv.at("/parameters/" + i + "/estimate").asDouble(), within(1e-9));
        }
        assertThat(fromSections.at("/overidentification/statistic").asDouble())
                .isCloseTo(fromCsv.at("/overidentification/statistic").asDouble(), within(1e-8));
    }

    private String percentOf(String file) throws IOException {
        StringBuilder out = new StringBuilder();
        for (String line : Files.readAllLines(cli.data.resolve(file))) {
            String[] cells = line.split(",");
            out.append(cells[0]).append(',').append(line.startsWith("date") ? cells[1]
                    : new java.math.BigDecimal(cells[1]).movePointRight(2).toPlainString()).append('\n');
        }
        return out.toString();
    }

    @Test
    void consumptionLevelsGiveTheGrowthSeries() throws IOException {
        Path levels = model("levels.toml", Files.readString(cli.models.resolve("lumen-power-utility.toml"))
                .replace("macro = \"../demo-data/lumen-consumption-quarterly.csv\"",
                        "macro = \"../demo-data/lumen-macro-levels-quarterly.csv\"")
                .replace("consumption_column = \"cons_growth\"", "consumption_level_column = \"cons_nominal\"\n"
                        + "population_column = \"population\"\nprice_column = \"deflator\""));
        JsonNode fromLevels = fit(levels);
        JsonNode fromGrowth = fit(cli.models.resolve("lumen-power-utility.toml"));
        assertThat(fromLevels.at("/sample/start").asString()).isEqualTo("1962Q1");
        // Nominal per-capita levels deflated reproduce cons_growth up to the files' six-decimal rounding
        // (docs/demo-scenario.md), so the estimates agree to far less than a standard error.
        double se = fromGrowth.at("/parameters/1/std_error").asDouble();
        assertThat(fromLevels.at("/parameters/1/estimate").asDouble())
                .isCloseTo(fromGrowth.at("/parameters/1/estimate").asDouble(), within(0.01 * se));
    }

    @Test
    void aDeflatorInATwoColumnSeriesFileTurnsNominalReturnsReal() throws IOException {
        // One asset scaled by two instruments: K = 2 moments for the P = 2 parameters (fewer would be refused).
        String base = "[data]\nreturns = \"../demo-data/lumen-wealth-quarterly.csv\"\nreturns_kind = \"gross\"\n"
                + "macro = \"../demo-data/lumen-consumption-quarterly.csv\"\n"
                + "instruments = \"../demo-data/lumen-instruments-quarterly.csv\"\n";
        String model = "\n[model]\nfamily = \"power-utility\"\nconsumption_column = \"cons_growth\"\n"
                + "instrument_columns = [\"const\", \"z_cons\"]\n";
        PreparedRun nominal = ModelAssembler.prepare(ModelFile.read(model("nominal.toml", base
                + "assets = [\"wealth_nominal\"]\ndeflator = \"../demo-data/lumen-deflator-series.csv\"\n" + model)));
        PreparedRun real = ModelAssembler.prepare(ModelFile.read(model("real.toml", base
                + "assets = [\"wealth_return\"]\n" + model)));
        // R_real = R_nominal P_{t-1}/P_t (Fisher relation); the deflator file's "." at 2025Q1 lies at the edge.
        assertThat(nominal.sample().start()).isEqualTo(real.sample().start());
        assertThat(nominal.sample().end()).isEqualTo(real.sample().end());
        var x = nominal.moments().payoffs();
        var y = real.moments().payoffs();
        for (int t = 0; t < x.numRows; t++) {
            assertThat(x.get(t, 0)).as("row %d", t).isCloseTo(y.get(t, 0), within(5e-6));
        }
        assertThat(nominal.notes()).anyMatch(note -> note.contains("deflated"));
    }

    @Test
    void declaredInstrumentLagsMoveTheFirstMoment() throws IOException {
        Path lagged = model("lagged.toml", Files.readString(cli.models.resolve("lumen-power-utility-instruments.toml"))
                .replace("[model]", "instrument_lags = { z_cons = 3 }\n\n[model]"));
        CliHarness.Result result = cli.run("check", lagged.toString());
        assertThat(result.code()).as(result.err()).isZero();
        // One-period lag: moments from 1962Q2 (T = 251); z_cons lagged 3: from 1962Q4 (T = 249).
        assertThat(result.out()).contains("1962Q4 to 2024Q4, T = 249");
    }

    @Test
    void malformedSectionedFilesAreRefusedWithFileLineAndColumn() throws IOException {
        Path sections = cli.data.resolve("lumen-portfolios-sections.txt");
        String text = Files.readString(sections);
        Path model = model("sections-bad.toml", Files.readString(cli.models.resolve("lumen-three-factor.toml"))
                .replace("returns = \"../demo-data/lumen-portfolios-monthly.csv\"",
                        "returns = \"../demo-data/lumen-portfolios-sections.txt\"\nreturns_table = \"Lumen size/tide "
                                + "portfolios, value-weighted montly returns\""));
        CliHarness.Result unknown = cli.run("check", model.toString());
        assertThat(unknown.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(unknown.err()).contains("lumen-portfolios-sections.txt").contains("did you mean").contains("fix:");

        cli.edit(model, "montly", "monthly");
        Files.writeString(sections, text.replace("196203     -4.8285     -0.9409", "196203     -4.8285"));
        CliHarness.Result ragged = cli.run("check", model.toString());
        assertThat(ragged.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(ragged.err()).contains("lumen-portfolios-sections.txt").contains("line 9, column 13").contains("fix:");
    }

    /** The malformed variants of the sectioned layout, each through `check`: exit 2 with file, line, column. */
    @org.junit.jupiter.params.ParameterizedTest(name = "{0}")
    @org.junit.jupiter.params.provider.CsvSource(delimiter = '|', value = {
        "truncated table | 102 | 196912      7.2381      5.9744       4.391      6.5577 | 196912      7.2381",
        "bad date        | 10  | 196204      6.0625 | 1962-4      6.0625",
        "missing code in the middle | 101 | 196911     -8.0503 | 196911     -99.99",
    })
    void malformedSectionedVariantsAreRefused(String variant, int line, String from, String to) throws IOException {
        Path sections = cli.data.resolve("lumen-portfolios-sections.txt");
        List<String> lines = new java.util.ArrayList<>(Files.readAllLines(sections));
        int index = line - 1;
        assertThat(lines.get(index)).as(variant).startsWith(from.strip());
        lines.set(index, to.strip() + lines.get(index).substring(from.strip().length()));
        if (variant.startsWith("truncated")) {
            lines.set(index, to.strip());
            lines = lines.subList(0, line);
        }
        Files.write(sections, lines);
        CliHarness.Result result = cli.run("check", sectionedModel().toString());
        assertThat(result.code()).as(result.err()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("lumen-portfolios-sections.txt").contains("line " + line).contains("column")
                .contains("fix:");
    }

    @Test
    void aDuplicateTableTitleIsRefused() throws IOException {
        Path sections = cli.data.resolve("lumen-portfolios-sections.txt");
        Files.writeString(sections, Files.readString(sections).replace("value-weighted annual returns",
                "value-weighted monthly returns"));
        CliHarness.Result result = cli.run("check", sectionedModel().toString());
        assertThat(result.code()).as(result.err()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("lumen-portfolios-sections.txt").contains("line 764").contains("fix:");
    }

    private Path sectionedModel() throws IOException {
        return model("sectioned-check.toml", Files.readString(cli.models.resolve("lumen-three-factor.toml"))
                .replace("returns = \"../demo-data/lumen-portfolios-monthly.csv\"",
                        "returns = \"../demo-data/lumen-portfolios-sections.txt\"\nreturns_table = \"Lumen size/tide "
                                + "portfolios, value-weighted monthly returns\"")
                .replace("units = \"decimal\"", "units = \"percent\""));
    }
}
