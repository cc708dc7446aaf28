package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URISyntaxException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * A real-data check of the power-utility two-step fit against an independent computation.
 *
 * <p>Data: the data set USMacroG of the R package AER 1.2-10 (US quarterly macroeconomic series
 * 1950Q1-2000Q4: real consumption, population, consumer prices, 3-month T-bill rate), as shipped by
 * the Debian package r-cran-aer, version 1.2-10-1. The script
 * src/test/resources/reference/realdata/usmacro_power_utility.R (run with Debian r-base-core
 * 4.2.2.20221110-2) builds gross real per-capita consumption growth, the gross real 3-month T-bill
 * return and the instrument file from it, and computes the two-step estimates, standard errors and
 * J in base R from the formulas of docs/methods.md (Hansen 1982; Newey and West 1987 for S), sharing no
 * code with Orthogon. The generated
 * files are committed because the build machines have no R.
 */
class RealDataCheckTest {
    private static final String FOLDER = "/reference/realdata/";
    /** The script converges to a Newton step below 1e-12, so 1e-6 leaves room only for Orthogon's solver. */
    private static final double RELATIVE = 1e-6;

    @TempDir
    Path root;

    @Test
    void heteroskedasticityConsistentFitMatchesTheIndependentScript() throws Exception {
        JsonNode fit = fit("none");
        assertThat(fit.at("/long_run_covariance/kernel").asString()).isEqualTo("none");
        assertMatches(fit, reference().get("none"));
    }

    @Test
    void bartlettFourLagFitMatchesTheIndependentScript() throws Exception {
        JsonNode fit = fit("bartlett", "--kernel", "bartlett", "--lags", "4");
        assertThat(fit.at("/long_run_covariance/kernel").asString()).isEqualTo("bartlett");
        assertThat(fit.at("/long_run_covariance/bandwidth").asDouble()).isEqualTo(5.0);
        assertMatches(fit, reference().get("bartlett"));
    }

    @Test
    void checkAcceptsTheModelFile() throws Exception {
        CliHarness.Result result = run("check", modelFile().toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("T = 202").contains("K = 3 moments");
    }

    private JsonNode fit(String name, String... options) throws Exception {
        Path json = root.resolve(name + ".json");
        List<String> args = new ArrayList<>(List.of("fit", modelFile().toString()));
        args.addAll(List.of(options));
        args.addAll(List.of("--json", json.toString(), "--quiet"));
        CliHarness.Result result = run(args.toArray(String[]::new));
        assertThat(result.code()).as(result.err()).isZero();
        return JsonMapper.builder().build().readTree(json.toFile());
    }

    private static void assertMatches(JsonNode fit, Map<String, String> expected) {
        assertThat(fit.get("family").asString()).isEqualTo("power-utility");
        assertThat(fit.get("method").asString()).isEqualTo("two-step");
        assertThat(fit.at("/sample/start").asString()).isEqualTo("1950Q3");
        assertThat(fit.at("/sample/end").asString()).isEqualTo("2000Q4");
        assertThat(fit.at("/sample/observations").asInt()).isEqualTo(Integer.parseInt(expected.get("observations")));
        assertThat(fit.at("/parameters/0/name").asString()).isEqualTo("beta");
        assertThat(fit.at("/parameters/1/name").asString()).isEqualTo("gamma");
        assertClose("beta", fit.at("/parameters/0/estimate").asDouble(), expected.get("beta"));
        assertClose("gamma", fit.at("/parameters/1/estimate").asDouble(), expected.get("gamma"));
        assertClose("se(beta)", fit.at("/parameters/0/std_error").asDouble(), expected.get("se_beta"));
        assertClose("se(gamma)", fit.at("/parameters/1/std_error").asDouble(), expected.get("se_gamma"));
        assertClose("J", fit.at("/overidentification/statistic").asDouble(), expected.get("j_stat"));
        assertThat(fit.at("/overidentification/df").asInt()).isEqualTo(Integer.parseInt(expected.get("j_df")));
    }

    private static void assertClose(String what, double actual, String expected) {
        double value = Double.parseDouble(expected);
        assertThat(Math.abs(actual - value) / Math.abs(value))
                .as("%s: Orthogon %s, script %s", what, actual, expected)
                .isLessThanOrEqualTo(RELATIVE);
    }

    /** One row per choice of S, keyed by the kernel column. */
    private static Map<String, Map<String, String>> reference() throws IOException, URISyntaxException {
        List<String> lines = Files.readAllLines(resource("usmacro_power_utility_values.csv"));
        String[] header = lines.get(0).split(",");
        Map<String, Map<String, String>> rows = new HashMap<>();
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            Map<String, String> row = new HashMap<>();
            for (int i = 0; i < header.length; i++) {
                row.put(header[i], cells[i]);
            }
            rows.put(row.get("kernel"), row);
        }
        assertThat(rows).containsOnlyKeys("none", "bartlett");
        return rows;
    }

    private static Path modelFile() throws URISyntaxException {
        return resource("usmacro-power-utility.toml");
    }

    private static Path resource(String name) throws URISyntaxException {
        return Path.of(RealDataCheckTest.class.getResource(FOLDER + name).toURI());
    }

    /** CliHarness copies models/ and demo-data/; this data lives among the test resources instead. */
    private static CliHarness.Result run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new PrintWriter(out), new PrintWriter(err), args);
        return new CliHarness.Result(code, out.toString(), err.toString());
    }
}
