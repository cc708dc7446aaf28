package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * `two-pass` against an independent computation on real data.
 *
 * <p>Data: the data set SMALLCAP.RET of the R package fPortfolio, as shipped by the Debian package
 * r-cran-fportfolio 3042.83.1-1+b1: monthly returns of 20 US small-cap stocks 1997-2001 with a market
 * index and a 90-day T-bill rate. The script src/test/resources/reference/twopass/smallcap_two_pass.R (run
 * with Debian r-base-core 4.2.2.20221110-2) writes the test assets (the first 12 stocks), the risk-free
 * rate and two factors (the market excess return, and a small-minus-market spread of the other 8 stocks),
 * and computes with base R's lm and matrix algebra, from the published formulas, the alphas, the GRS test
 * (Gibbons, Ross and Shanken 1989), the Fama-MacBeth (1973) OLS and GLS risk premia with Fama-MacBeth,
 * Shanken (1992) and Kan-Robotti-Shanken (2013) standard errors and the cross-sectional R² with its
 * standard error, for a one-factor and a two-factor model, with and without the intercept. The same script
 * checks the KRS formulas against a numerical delta method on the raw sample moments; the largest gap is
 * committed with the values and checked here too. Agreement is required to a relative 1e-8.
 */
class TwoPassReferenceTest {
    private static final String FOLDER = "/reference/twopass/";
    private static final double RELATIVE = 1e-8;

    @TempDir
    Path root;

    @Test
    void marketModelMatchesTheScript() throws Exception {
        int compared = compare("capm", "smallcap-market.toml");
        assertThat(compared).isEqualTo(2 + 3 * 12 + 2 * (4 * 2 + 2) + 2 * (4 + 2));
    }

    @Test
    void twoFactorModelMatchesTheScript() throws Exception {
        int compared = compare("two_factor", "smallcap-two-factor.toml");
        assertThat(compared).isEqualTo(2 + 3 * 12 + 2 * (4 * 3 + 2) + 2 * (4 * 2 + 2));
    }

    @Test
    void theScriptsOwnCheckOfTheRobustFormulasHeld() throws Exception {
        Map<String, Double> values = reference();
        List<String> checks = values.keySet().stream().filter(k -> k.endsWith("delta_check.max_relative_gap")).toList();
        assertThat(checks).hasSize(4);
        // A numerical gradient with steps of 1e-6 leaves gaps near 1e-9; a wrong term would show at 1e-2 or more.
        checks.forEach(k -> assertThat(values.get(k)).as(k).isLessThan(1e-7));
    }

    /** Runs both intercept choices and compares every value of the model; returns how many were compared. */
    private int compare(String tag, String model) throws Exception {
        Map<String, Double> expected = reference();
        JsonNode with = run(model, "with");
        JsonNode without = run(model, "without", "--no-intercept");
        int compared = 2;
        close(tag + ".grs.statistic", with.at("/time_series/grs/statistic"), expected);
        close(tag + ".grs.p_value", with.at("/time_series/grs/p_value"), expected);
        for (JsonNode alpha : with.at("/time_series/alphas")) {
            String prefix = tag + ".alpha." + alpha.get("asset").asString();
            close(prefix + ".estimate", alpha.get("estimate"), expected);
            close(prefix + ".std_error", alpha.get("std_error"), expected);
            close(prefix + ".p_value", alpha.get("p_value"), expected);
            compared += 3;
        }
        compared += crossSection(tag + ".ols", with.get("cross_section"), expected);
        compared += crossSection(tag + ".gls", with.get("cross_section_gls"), expected);
        compared += crossSection(tag + ".ols.nointercept", without.get("cross_section"), expected);
        compared += crossSection(tag + ".gls.nointercept", without.get("cross_section_gls"), expected);
        assertThat(without.at("/cross_section/intercept").isNull()).isTrue();
        return compared;
    }

    private static int crossSection(String prefix, JsonNode node, Map<String, Double> expected) {
        int compared = 0;
        List<JsonNode> coefficients = new ArrayList<>();
        List<String> names = new ArrayList<>();
        if (!node.get("intercept").isNull()) {
            coefficients.add(node.get("intercept"));
            names.add("intercept");
        }
        for (JsonNode premium : node.get("risk_premia")) {
            coefficients.add(premium);
            names.add(premium.get("factor").asString());
        }
        for (int j = 0; j < coefficients.size(); j++) {
            String p = prefix + "." + names.get(j);
            JsonNode c = coefficients.get(j);
            close(p + ".estimate", c.get("estimate"), expected);
            close(p + ".se_fm", c.get("std_error_fama_macbeth"), expected);
            close(p + ".se_shanken", c.get("std_error_shanken"), expected);
            close(p + ".se_robust", c.get("std_error_misspecification_robust"), expected);
            compared += 4;
        }
        close(prefix + ".r2.estimate", node.at("/r2/estimate"), expected);
        close(prefix + ".r2.std_error", node.at("/r2/std_error"), expected);
        return compared + 2;
    }

    private static void close(String name, JsonNode actual, Map<String, Double> expected) {
        assertThat(expected).as("the script wrote " + name).containsKey(name);
        double value = expected.get(name);
        assertThat(Math.abs(actual.asDouble() - value))
                .as("%s: Orthogon %s, script %s", name, actual.asDouble(), value)
                .isLessThanOrEqualTo(RELATIVE * Math.abs(value) + 1e-15);
    }

    private JsonNode run(String model, String name, String... options) throws Exception {
        Path json = root.resolve(name + ".json");
        List<String> args = new ArrayList<>(List.of("two-pass", resource(model).toString()));
        args.addAll(List.of(options));
        args.addAll(List.of("--json", json.toString(), "--quiet"));
        CliHarness.Result result = CliHarness.runIn(args.toArray(String[]::new));
        assertThat(result.code()).as(result.err()).isZero();
        return JsonMapper.builder().build().readTree(json.toFile());
    }

    private static Map<String, Double> reference() throws Exception {
        List<String> lines = Files.readAllLines(resource("smallcap_two_pass_values.csv"));
        assertThat(lines.get(0)).isEqualTo("name,value");
        Map<String, Double> values = new LinkedHashMap<>();
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            values.put(cells[0], Double.parseDouble(cells[1]));
        }
        return values;
    }

    private static Path resource(String name) throws Exception {
        return Path.of(TwoPassReferenceTest.class.getResource(FOLDER + name).toURI());
    }
}
