package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.List;
import java.util.Locale;
import java.util.stream.Stream;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

class FitOutputFolderTest {
    private static final List<String> THREE_FACTOR_FILES = List.of("charts/pricing-errors.png",
            "charts/pricing-errors.svg", "charts/realised-vs-implied.png", "charts/realised-vs-implied.svg",
            "manifest.json", "report.html", "results.json", "tables/overidentification.csv",
            "tables/overidentification.md", "tables/overidentification.tex", "tables/parameters.csv",
            "tables/parameters.md", "tables/parameters.tex", "tables/pricing-errors.csv", "tables/pricing-errors.md",
            "tables/pricing-errors.tex");

    @TempDir
    Path root;
    CliHarness cli;
    Path model;

    @BeforeEach
    void copyProject() throws IOException {
        cli = new CliHarness(root);
        model = cli.models.resolve("lumen-three-factor.toml");
    }

    @Test
    void folderHoldsEveryFileAndResultsJsonIsWhatJsonWrites() throws IOException {
        Path out = root.resolve("reports/three");
        Path json = root.resolve("fit.json");
        CliHarness.Result result = cli.run("fit", model.toString(), "--out", out.toString(), "--json",
                json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(files(out)).containsExactlyElementsOf(THREE_FACTOR_FILES);
        assertThat(Files.readString(out.resolve("results.json"))).isEqualTo(Files.readString(json));
        assertThat(Files.readString(out.resolve("tables/parameters.csv")))
                .startsWith("parameter,estimate,std. error,Windmeijer s.e.,t-stat,p-value,95% low,95% high\nb_MKT,");
        assertThat(Files.readString(out.resolve("tables/parameters.tex"))).contains("\\toprule")
                .contains("$b_{\\mathrm{TIDE}}$").contains("\\label{tab:lumen-three-factor-parameters}");
        Document html = Jsoup.parse(out.resolve("report.html").toFile());
        assertThat(html.select("figure.tablewrap table")).hasSize(3);
        assertThat(html.select("figure.chart svg")).hasSize(2);
        assertThat(Files.readString(out.resolve("report.html"))).doesNotContain("http");
        assertThat(siblingsOf(out)).containsExactly("three");
    }

    @Test
    void linearSdfImpliedMeansFollowTheDefinition() throws IOException {
        Path out = root.resolve("three");
        assertThat(cli.run("fit", model.toString(), "--out", out.toString(), "--quiet").code()).isZero();
        JsonNode results = JsonMapper.builder().build().readTree(out.resolve("results.json").toFile());
        // Mean SDF 1 - b' mean(F), from the factor file and the estimates, outside Orthogon's code.
        List<String> factors = Files.readAllLines(cli.data.resolve("lumen-factors-monthly.csv"));
        double meanSdf = 0;
        for (String line : factors.subList(1, factors.size())) {
            String[] f = line.split(",");
            double m = 1;
            for (int k = 0; k < 3; k++) {
                m -= results.at("/parameters/" + k + "/estimate").asDouble() * Double.parseDouble(f[k + 1]);
            }
            meanSdf += m / (factors.size() - 1);
        }
        List<String> lines = Files.readAllLines(out.resolve("tables/pricing-errors.csv"));
        assertThat(lines.get(0)).isEqualTo("moment,error,std. error,t-stat,realised mean,model-implied mean");
        assertThat(lines).hasSize(13);
        for (int i = 1; i < lines.size(); i++) {
            String[] cells = lines.get(i).split(",");
            JsonNode error = results.at("/pricing_errors/" + (i - 1));
            assertThat(cells[0]).isEqualTo(error.get("asset").asString());
            assertThat(Double.parseDouble(cells[1])).isEqualTo(error.get("error").asDouble());
            assertThat(Double.parseDouble(cells[5])).isCloseTo(Double.parseDouble(cells[4])
                    - error.get("error").asDouble() / meanSdf, within(1e-14));
        }
        // S1T1's realised mean excess return, recomputed from the CSV files: portfolio minus risk-free rate.
        assertThat(Double.parseDouble(lines.get(1).split(",")[4])).isCloseTo(meanExcess("S1T1"), within(1e-12));
        assertThat(Files.readString(out.resolve("tables/pricing-errors.md")))
                .contains(String.format(Locale.ROOT, "mean SDF %.6f", meanSdf));
    }

    @Test
    void powerUtilityImpliedMeansUseTheConsumptionDiscountFactor() throws IOException {
        Path out = root.resolve("power");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-power-utility.toml").toString(), "--out",
                out.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("Hansen J test").endsWith("Report folder: " + out.toAbsolutePath() + "\n");
        assertThat(files(out)).contains("charts/pricing-errors.svg", "charts/realised-vs-implied.svg");
        JsonNode results = JsonMapper.builder().build().readTree(out.resolve("results.json").toFile());
        double beta = results.at("/parameters/0/estimate").asDouble();
        double gamma = results.at("/parameters/1/estimate").asDouble();
        List<String> consumption = Files.readAllLines(cli.data.resolve("lumen-consumption-quarterly.csv"));
        double meanSdf = 0;
        for (String line : consumption.subList(1, consumption.size())) {
            meanSdf += beta * Math.pow(Double.parseDouble(line.split(",")[1]), -gamma) / (consumption.size() - 1);
        }
        String[] first = Files.readAllLines(out.resolve("tables/pricing-errors.csv")).get(1).split(",");
        // S1T1's mean gross quarterly return, compounding the monthly net returns three at a time.
        List<String> monthly = Files.readAllLines(cli.data.resolve("lumen-portfolios-monthly.csv"));
        double realised = 0;
        for (int q = 0; q < 252; q++) {
            double gross = 1;
            for (int m = 1; m <= 3; m++) {
                gross *= 1 + Double.parseDouble(monthly.get(3 * q + m).split(",")[1]);
            }
            realised += gross / 252;
        }
        assertThat(Double.parseDouble(first[4])).isCloseTo(realised, within(1e-12));
        assertThat(Double.parseDouble(first[5])).isCloseTo(realised - Double.parseDouble(first[1]) / meanSdf,
                within(1e-12));
        Document html = Jsoup.parse(out.resolve("report.html").toFile());
        assertThat(html.select("#chart-realised-vs-implied text").eachText()).contains("realised mean gross return");
    }

    @Test
    void instrumentsLeaveOnlyThePricingErrorChart() throws IOException {
        List<String> consumption = Files.readAllLines(cli.data.resolve("lumen-consumption-quarterly.csv"));
        StringBuilder text = new StringBuilder("date,lag_growth\n");
        for (String line : consumption.subList(1, consumption.size())) {
            text.append(line).append('\n');
        }
        Files.writeString(cli.data.resolve("lumen-instruments.csv"), text);
        Path power = cli.models.resolve("lumen-power-utility.toml");
        cli.edit(power, "macro = ", "instruments = \"../demo-data/lumen-instruments.csv\"\nmacro = ");
        cli.edit(power, "consumption_column", "instrument_columns = [\"const\", \"lag_growth\"]\nconsumption_column");
        Path out = root.resolve("scaled");
        CliHarness.Result result = cli.run("fit", power.toString(), "--out", out.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(files(out)).contains("charts/pricing-errors.svg").doesNotContain("charts/realised-vs-implied.svg");
        assertThat(Files.readString(out.resolve("tables/pricing-errors.csv")).lines().findFirst().orElseThrow())
                .isEqualTo("moment,error,std. error,t-stat");
    }

    @Test
    void manifestHashesEqualAnIndependentSha256() throws IOException, NoSuchAlgorithmException {
        Path out = root.resolve("three");
        assertThat(cli.run("fit", model.toString(), "--out", out.toString(), "--lags", "2", "--quiet").code())
                .isZero();
        JsonNode manifest = JsonMapper.builder().build().readTree(out.resolve("manifest.json").toFile());
        JsonNode inputs = manifest.at("/models/0/inputs");
        assertThat(inputs).hasSize(4);
        List<Path> expected = List.of(model, cli.data.resolve("lumen-portfolios-monthly.csv"),
                cli.data.resolve("lumen-riskfree-monthly.csv"), cli.data.resolve("lumen-factors-monthly.csv"));
        for (int i = 0; i < expected.size(); i++) {
            assertThat(Path.of(inputs.get(i).get("path").asString()).toAbsolutePath())
                    .isEqualTo(expected.get(i).toAbsolutePath());
            assertThat(inputs.get(i).get("sha256").asString()).isEqualTo(sha256(expected.get(i)));
        }
        assertThat(inputs.get(0).get("role").asString()).isEqualTo("model");
        for (String file : THREE_FACTOR_FILES) {
            if (!file.equals("manifest.json")) {
                assertThat(manifest.at("/outputs").get(file).asString()).as(file).isEqualTo(sha256(out.resolve(file)));
            }
        }
        // The option from the command line, not the model file's lags = 4, is recorded.
        assertThat(manifest.at("/models/0/estimation/lags").asInt()).isEqualTo(2);
        assertThat(manifest.at("/models/0/estimation/method").asString()).isEqualTo("two-step");
        assertThat(manifest.at("/models/0/estimation/kernel").asString()).isEqualTo("bartlett");
        assertThat(manifest.get("orthogon_version").asString()).isEqualTo(Version.current());
        assertThat(manifest.get("java_version").asString()).isEqualTo(System.getProperty("java.version"));
        assertThat(manifest.get("started").asString()).matches("\\d{4}-\\d\\d-\\d\\dT\\d\\d:\\d\\d:\\d\\d.*Z");
        assertThat(manifest.get("seeds").isObject()).isTrue();
        assertThat(manifest.get("arguments").get(4).asString()).isEqualTo("--lags");
    }

    @Test
    void aFileInsteadOfAFolderIsRefusedWithExitTwo() throws IOException {
        Path file = root.resolve("taken.txt");
        Files.writeString(file, "harbour log\n");
        CliHarness.Result result = cli.run("fit", model.toString(), "--out", file.toString(), "--quiet");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("taken.txt").contains("is a file, not a folder").contains("fix:")
                .doesNotContain("Exception");
        assertThat(Files.readString(file)).isEqualTo("harbour log\n");
        assertThat(hidden(root)).isEmpty();
    }

    @Test
    void anExistingReportIsKeptUnlessOverwriteIsGiven() throws IOException {
        Path out = root.resolve("three");
        assertThat(cli.run("fit", model.toString(), "--out", out.toString(), "--quiet").code()).isZero();
        String manifest = Files.readString(out.resolve("manifest.json"));

        CliHarness.Result again = cli.run("fit", model.toString(), "--out", out.toString(), "--lags", "2", "--quiet");
        assertThat(again.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(again.err()).contains("already holds a report").contains("--overwrite");
        assertThat(Files.readString(out.resolve("manifest.json"))).isEqualTo(manifest);
        assertThat(files(out)).containsExactlyElementsOf(THREE_FACTOR_FILES);
        assertThat(hidden(root)).isEmpty();

        CliHarness.Result replaced = cli.run("fit", model.toString(), "--out", out.toString(), "--lags", "2",
                "--overwrite", "--quiet");
        assertThat(replaced.code()).as(replaced.err()).isZero();
        assertThat(Files.readString(out.resolve("manifest.json"))).contains("\"lags\" : 2");
        assertThat(files(out)).containsExactlyElementsOf(THREE_FACTOR_FILES);
        assertThat(hidden(root)).isEmpty();
    }

    @Test
    void aFolderOfOtherFilesIsNeverReplaced() throws IOException {
        Path out = Files.createDirectories(root.resolve("notes"));
        Files.writeString(out.resolve("draft.txt"), "tide notes\n");
        CliHarness.Result result = cli.run("fit", model.toString(), "--out", out.toString(), "--overwrite", "--quiet");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("not an Orthogon report");
        assertThat(files(out)).containsExactly("draft.txt");
    }

    @Test
    void badInputLeavesNoFolderBehind() throws IOException {
        Path out = root.resolve("never");
        cli.edit(model, "lags = 4", "lags = -1");
        CliHarness.Result result = cli.run("fit", model.toString(), "--out", out.toString(), "--quiet");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(Files.exists(out)).isFalse();
        assertThat(hidden(root)).isEmpty();
    }

    @Test
    void outWithoutAValueNamesTheFolderAfterTheModelFile() {
        ResultOptions options = new ResultOptions();
        options.out = Path.of("");
        String stem = ResultOptions.stem(Path.of("models/lumen-three-factor.toml"));
        assertThat(options.target(stem)).isEqualTo(Path.of("out", "lumen-three-factor"));
        options.out = Path.of("x/y");
        assertThat(options.target(stem)).isEqualTo(Path.of("x/y"));
    }

    private double meanExcess(String column) throws IOException {
        List<String> returns = Files.readAllLines(cli.data.resolve("lumen-portfolios-monthly.csv"));
        List<String> riskfree = Files.readAllLines(cli.data.resolve("lumen-riskfree-monthly.csv"));
        int at = List.of(returns.get(0).split(",")).indexOf(column);
        int rf = List.of(riskfree.get(0).split(",")).indexOf("RF");
        double sum = 0;
        for (int t = 1; t < returns.size(); t++) {
            String[] r = returns.get(t).split(",");
            String[] f = riskfree.get(t).split(",");
            assertThat(r[0]).isEqualTo(f[0]);
            sum += Double.parseDouble(r[at]) - Double.parseDouble(f[rf]);
        }
        return sum / (returns.size() - 1);
    }

    private static List<String> files(Path folder) throws IOException {
        try (Stream<Path> walk = Files.walk(folder)) {
            return walk.filter(Files::isRegularFile).map(p -> folder.relativize(p).toString().replace('\\', '/'))
                    .sorted().toList();
        }
    }

    private static List<String> siblingsOf(Path folder) throws IOException {
        try (Stream<Path> list = Files.list(folder.getParent())) {
            return list.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }

    /** Leftover temporary folders (Orthogon's start with a dot). */
    private static List<String> hidden(Path folder) throws IOException {
        try (Stream<Path> list = Files.list(folder)) {
            return list.map(p -> p.getFileName().toString()).filter(name -> name.startsWith(".")).toList();
        }
    }

    private static String sha256(Path file) throws IOException, NoSuchAlgorithmException {
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(file)));
    }
}
