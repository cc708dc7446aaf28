package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;
import org.orthogon.TestLog;
import org.orthogon.longrun.LongRunOptions;

/**
 * GMM with instruments equal to the regressors is OLS. Checked on R's longley dataset (package datasets
 * of Debian r-base-core) against R's lm() and the R package sandwich (Debian r-cran-sandwich), values
 * written by src/test/resources/reference/longley_reference.R, and against the NIST StRD certified
 * values for the Longley data.
 */
class LongleyRegressionTest {
    private static final List<String> REGRESSORS = List.of("const", "GNP.deflator", "GNP", "Unemployed",
            "Armed.Forces", "Population", "Year");

    /** NIST/ITL Statistical Reference Datasets, linear regression, "Longley", certified parameter values. */
    private static final double[] NIST_CERTIFIED = {
        -3482258.63459582, 15.0618722713733, -0.358191792925910e-1, -2.02022980381683, -1.03322686717359,
        -0.511041056535807e-1, 1829.15146461355};

    private static List<String[]> rows(String resource) {
        try (InputStream in = LongleyRegressionTest.class.getResourceAsStream("/reference/" + resource)) {
            String[] lines = new String(in.readAllBytes(), StandardCharsets.UTF_8).split("\r?\n");
            List<String[]> out = new ArrayList<>();
            for (int i = 1; i < lines.length; i++) {
                if (!lines[i].isBlank()) {
                    out.add(lines[i].split(",", -1));
                }
            }
            return out;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Columns Year, Employed, GNP.deflator, GNP, Unemployed, Armed.Forces, Population as R wrote them. */
    private static double[][] data() {
        return rows("longley.csv").stream()
                .map(r -> java.util.Arrays.stream(r).mapToDouble(Double::parseDouble).toArray())
                .toArray(double[][]::new);
    }

    /** y = Employed; x = (1, GNP.deflator, GNP, Unemployed, Armed.Forces, Population, Year), each column scaled. */
    private static LinearRegressionMoments regression(double yScale, double[] xScales) {
        double[][] d = data();
        double[] y = new double[d.length];
        double[][] x = new double[d.length][7];
        for (int t = 0; t < d.length; t++) {
            y[t] = d[t][1] * yScale;
            x[t][0] = 1.0;
            for (int j = 0; j < 5; j++) {
                x[t][1 + j] = d[t][2 + j] * xScales[j];
            }
            x[t][6] = d[t][0];
        }
        return LinearRegressionMoments.ols(y, x, REGRESSORS);
    }

    private static Map<String, Double> reference() {
        Map<String, Double> out = new HashMap<>();
        for (String[] r : rows("longley_reference.csv")) {
            out.put(r[0] + "/" + r[1] + "/" + r[2], Double.parseDouble(r[3]));
        }
        return out;
    }

    private static final double[] R_UNITS = {1, 1, 1, 1, 1};

    @ParameterizedTest(name = "{0}")
    @EnumSource(EstimationMethod.class)
    void everyEstimatorReproducesTheRLmCoefficients(EstimationMethod method) {
        GmmFit fit = GmmEstimator.estimate(regression(1.0, R_UNITS), new double[7],
                new GmmOptions(method, LongRunOptions.heteroskedasticityConsistent()));
        Map<String, Double> ref = reference();
        double[] b = fit.estimates();
        for (int j = 0; j < 7; j++) {
            // R 4.2.2 lm() (QR), written by longley_reference.R.
            double expected = ref.get("coefficient/" + REGRESSORS.get(j) + "/");
            assertThat(b[j]).as(REGRESSORS.get(j)).isCloseTo(expected, within(1e-8 * Math.abs(expected)));
        }
        assertThat(fit.overidentification().df()).isZero();
    }

    @Test
    void nistCertifiedLongleyCoefficients() {
        // NIST StRD "Longley" certified values (typed from memory; they agree with R's lm() on R's rescaled
        // copy of the data to 14 digits, see longley_reference.csv). NIST's data are R's with Employed and
        // GNP in thousands of R's units, Unemployed and Armed.Forces in tenths, Population in thousands.
        GmmFit fit = GmmEstimator.estimate(regression(1000.0, new double[] {1, 1000, 10, 10, 1000}), new double[7],
                new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.heteroskedasticityConsistent()));
        double[] b = fit.estimates();
        for (int j = 0; j < 7; j++) {
            assertThat(b[j]).as(REGRESSORS.get(j)).isCloseTo(NIST_CERTIFIED[j],
                    within(1e-8 * Math.abs(NIST_CERTIFIED[j])));
        }
    }

    @Test
    void heteroskedasticityConsistentCovarianceMatchesSandwichHc0() {
        checkCovariance(LongRunOptions.heteroskedasticityConsistent(), "hc0");
    }

    @Test
    void bartlettFourLagCovarianceMatchesSandwichNeweyWest() {
        checkCovariance(LongRunOptions.bartlettLags(4), "bartlett4");
    }

    /**
     * The covariance needs D^{-1} = -T (X'X)^{-1}: GMM forms D from the moments, and with cond(X'X) = 5.7e14
     * on these data (R's kappa(crossprod(X), exact = TRUE)) about seven digits survive, where R's QR never
     * forms X'X. Hence 1e-7 relative here for standard errors and 5e-7 sqrt(v_ii v_jj) for covariances
     * (correlation units; the const-GNP correlation is near one, measured 1.3e-7 with Bartlett 4), against 1e-8 for the coefficients, which the estimator refines
     * from the moments themselves.
     */
    private static void checkCovariance(LongRunOptions longRun, String quantity) {
        GmmFit fit = GmmEstimator.estimate(regression(1.0, R_UNITS), new double[7],
                new GmmOptions(EstimationMethod.TWO_STEP, longRun));
        Map<String, Double> ref = reference();
        DMatrixRMaj v = fit.covariance();
        double worstSe = 0.0;
        double worstEntry = 0.0;
        for (int i = 0; i < 7; i++) {
            double se = Math.sqrt(ref.get(quantity + "/" + REGRESSORS.get(i) + "/" + REGRESSORS.get(i)));
            worstSe = Math.max(worstSe, Math.abs(fit.parameters().get(i).stdError() / se - 1.0));
            for (int j = 0; j < 7; j++) {
                double expected = ref.get(quantity + "/" + REGRESSORS.get(i) + "/" + REGRESSORS.get(j));
                worstEntry = Math.max(worstEntry, Math.abs(v.get(i, j) / expected - 1.0));
            }
        }
        TestLog.printf(LongleyRegressionTest.class,
                "Longley %s: largest relative difference from sandwich: standard errors %.2e, "
                + "covariance entries %.2e (relative to themselves)%n", quantity, worstSe, worstEntry);
        for (int i = 0; i < 7; i++) {
            // sandwich 3.0.2: vcovHC(type = "HC0") or NeweyWest(lag = 4, prewhite = FALSE, adjust = FALSE).
            double se = Math.sqrt(ref.get(quantity + "/" + REGRESSORS.get(i) + "/" + REGRESSORS.get(i)));
            assertThat(fit.parameters().get(i).stdError()).as("se " + REGRESSORS.get(i))
                    .isCloseTo(se, within(1e-7 * se));
            for (int j = 0; j < 7; j++) {
                double expected = ref.get(quantity + "/" + REGRESSORS.get(i) + "/" + REGRESSORS.get(j));
                double scale = Math.sqrt(ref.get(quantity + "/" + REGRESSORS.get(i) + "/" + REGRESSORS.get(i))
                        * ref.get(quantity + "/" + REGRESSORS.get(j) + "/" + REGRESSORS.get(j)));
                // In correlation units, so that entries near zero are not held to a relative standard.
                assertThat(v.get(i, j)).as("cov %s %s", REGRESSORS.get(i), REGRESSORS.get(j))
                        .isCloseTo(expected, within(5e-7 * scale));
            }
        }
    }
}
