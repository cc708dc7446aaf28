package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.demo.LumenEconomy;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * `fit` of the demeaned linear SDF reports the risk premia λ = Cov(F, F') b: the identity with the reported
 * b and the sample factor covariance (Cochrane 2005, section 6.3), and the Lumen truth λ = μ_F (traded
 * factors, no alphas; docs/demo-scenario.md) within 2.5 standard errors.
 */
class RiskPremiaFitTest {
    @TempDir
    Path root;

    @Test
    void demeanedFitReportsRiskPremia() throws Exception {
        CliHarness cli = new CliHarness(root);
        Path json = root.resolve("fit.json");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor-demeaned.toml").toString(),
                "--json", json.toString(), "--out", root.resolve("report").toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("Risk premia");
        JsonNode node = JsonMapper.builder().build().readTree(json.toFile());
        JsonNode premia = node.get("risk_premia");
        assertThat(premia).hasSize(3);
        double[][] f = factors(cli.data.resolve("lumen-factors-monthly.csv"));
        double[] b = new double[3];
        for (int k = 0; k < 3; k++) {
            b[k] = node.at("/parameters/" + k + "/estimate").asDouble();
        }
        LumenEconomy economy = LumenEconomy.standard();
        for (int k = 0; k < 3; k++) {
            double lambda = 0.0;
            for (int j = 0; j < 3; j++) {
                lambda += covariance(f, k, j) * b[j];
            }
            JsonNode premium = premia.get(k);
            assertThat(premium.get("factor").asString()).isEqualTo(List.of("MKT", "SIZE", "TIDE").get(k));
            assertThat(premium.get("estimate").asDouble()).isCloseTo(lambda, within(1e-12));
            double se = premium.get("std_error").asDouble();
            assertThat(Math.abs(premium.get("estimate").asDouble() - economy.factorMeans()[k]) / se).isLessThan(2.5);
        }
        assertThat(Files.exists(root.resolve("report/tables/risk-premia.tex"))).isTrue();
        // The HJ distance of the demeaned form is taken over the 12 assets with mu at the factor means: 12 - 3 weights.
        assertThat(node.at("/hj_distance/value").asDouble()).isPositive();
    }

    @Test
    void otherFormsReportNone() throws Exception {
        CliHarness cli = new CliHarness(root);
        Path json = root.resolve("fit.json");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(), "--json",
                json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(JsonMapper.builder().build().readTree(json.toFile()).has("risk_premia")).isFalse();
    }

    private static double[][] factors(Path file) throws Exception {
        List<String> lines = Files.readAllLines(file);
        return lines.subList(1, lines.size()).stream().map(line -> java.util.Arrays.stream(line.split(",")).skip(1)
                .mapToDouble(Double::parseDouble).toArray()).toArray(double[][]::new);
    }

    /** Sample covariance with divisor T. */
    private static double covariance(double[][] f, int a, int b) {
        double ma = 0.0;
        double mb = 0.0;
        for (double[] row : f) {
            ma += row[a] / f.length;
            mb += row[b] / f.length;
        }
        double sum = 0.0;
        for (double[] row : f) {
            sum += (row[a] - ma) * (row[b] - mb) / f.length;
        }
        return sum;
    }
}
