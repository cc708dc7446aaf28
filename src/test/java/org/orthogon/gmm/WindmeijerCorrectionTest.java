package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.api.Test;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.RunSpec;

/**
 * Windmeijer's (2005, Journal of Econometrics 126) corrected two-step covariance, checked three ways:
 * <ul>
 *   <li>against src/test/resources/reference/robust/windmeijer_reference.py (numpy 2.4, scipy 1.17), which
 *       estimates both steps itself and applies the paper's formula with ∂S/∂θ formed lag by lag, on a seeded
 *       linear IV regression (HC S, 2SLS first step) and on the Lumen power-utility model (Bartlett, 4 lags);</li>
 *   <li>the identity behind the correction: for moments linear in θ the matrix 𝒟 is exactly the derivative of
 *       the two-step estimator θ̂2(θ1) = -(D'W(θ1)D)^{-1}D'W(θ1)g(0) in the first-step value θ1 (Windmeijer 2005,
 *       section 3), here taken by central differences (common practice, no source).</li>
 * </ul>
 */
class WindmeijerCorrectionTest {
    /** The script solves both steps to machine precision; what is left is Orthogon's solver and rounding. */
    private static final double RELATIVE = 1e-6;

    @Test
    void linearInstrumentalVariablesCaseMatchesTheIndependentScript() {
        LinearRegressionMoments model = ivModel();
        GmmOptions options = new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.heteroskedasticityConsistent())
                .withInitialWeight(new InitialWeight.SecondMoment());
        GmmFit fit = GmmEstimator.estimate(model, new double[2], options);
        WindmeijerCorrection.Result result = WindmeijerCorrection.of(model, new double[2], options, fit).orElseThrow();
        assertMatchesScript("iv", fit, result);
        // Endogeneity and heteroskedasticity make the correction bite: the slope's error grows by 14%.
        assertThat(result.stdErrors()[1] / fit.parameters().get(1).stdError()).isBetween(1.10, 1.20);
    }

    @Test
    void lumenPowerUtilityMatchesTheIndependentScript() {
        RunSpec spec = ModelFile.read(Paths.get("models/lumen-power-utility.toml"));
        FittedRun run = FittedRun.of(spec);
        WindmeijerCorrection.Result result = WindmeijerCorrection.of(run.prepared().moments(),
                run.prepared().startValues(), FittedRun.options(spec, run.prepared()), run.fit()).orElseThrow();
        assertMatchesScript("lumen", run.fit(), result);
        assertThat(result.bandwidth()).isEqualTo(5.0);
    }

    @Test
    void correctionTermIsTheDerivativeOfTheTwoStepEstimatorInTheFirstStep() {
        LinearRegressionMoments model = ivModel();
        LongRunOptions hc = LongRunOptions.heteroskedasticityConsistent();
        GmmOptions options = new GmmOptions(EstimationMethod.TWO_STEP, hc)
                .withInitialWeight(new InitialWeight.SecondMoment());
        GmmFit fit = GmmEstimator.estimate(model, new double[2], options);
        WindmeijerCorrection.Result result = WindmeijerCorrection.of(model, new double[2], options, fit).orElseThrow();
        double[] first = result.firstStep();
        assertThat(secondStepFrom(model, first, hc)).containsExactly(fit.estimates(), org.assertj.core.api.Assertions.within(1e-10));
        DMatrixRMaj d = result.derivative();
        for (int j = 0; j < 2; j++) {
            double h = 1e-5 * Math.max(1.0, Math.abs(first[j]));
            double[] up = first.clone();
            double[] down = first.clone();
            up[j] += h;
            down[j] -= h;
            double[] plus = secondStepFrom(model, up, hc);
            double[] minus = secondStepFrom(model, down, hc);
            for (int i = 0; i < 2; i++) {
                double numerical = (plus[i] - minus[i]) / (2 * h);
                assertThat(d.get(i, j)).as("∂θ2_%d/∂θ1_%d", i, j).isCloseTo(numerical,
                        org.assertj.core.api.Assertions.within(1e-7 * Math.max(1.0, Math.abs(numerical))));
            }
        }
    }

    @Test
    void theFirstStepKeptByTheFitGivesTheCorrectionOfARepeatedFirstStep() {
        RunSpec spec = ModelFile.read(Paths.get("models/lumen-power-utility.toml"));
        FittedRun run = FittedRun.of(spec);
        GmmFit fit = run.fit();
        assertThat(fit.firstStepKept()).isPresent();
        GmmFit withoutFirstStep = new GmmFit(fit.method(), fit.parameters(), fit.covariance(), fit.observations(),
                fit.momentCount(), fit.objective(), fit.overidentification(), fit.pricingErrors(),
                fit.pricingErrorsJoint(), fit.longRun(), fit.solverIterations(), fit.warnings(), fit.weight(),
                fit.diagnostics(), fit.hjDistance(), fit.confidenceLevel(), null);
        GmmOptions options = FittedRun.options(spec, run.prepared());
        WindmeijerCorrection.Result kept = WindmeijerCorrection.of(run.prepared().moments(),
                run.prepared().startValues(), options, fit).orElseThrow();
        WindmeijerCorrection.Result repeated = WindmeijerCorrection.of(run.prepared().moments(),
                run.prepared().startValues(), options, withoutFirstStep).orElseThrow();
        // the same first step either way; only the order of sums differs (the estimator's linear view)
        assertThat(kept.firstStep()).containsExactly(repeated.firstStep(),
                org.assertj.core.api.Assertions.within(1e-12));
        for (int i = 0; i < kept.stdErrors().length; i++) {
            assertThat(kept.stdErrors()[i]).isCloseTo(repeated.stdErrors()[i],
                    org.assertj.core.api.Assertions.within(1e-10 * repeated.stdErrors()[i]));
        }
    }

    @Test
    void onlyOverIdentifiedTwoStepFitsAreCorrected() {
        LinearRegressionMoments model = ivModel();
        GmmOptions iterated = new GmmOptions(EstimationMethod.ITERATED, LongRunOptions.heteroskedasticityConsistent());
        GmmFit fit = GmmEstimator.estimate(model, new double[2], iterated);
        assertThat(WindmeijerCorrection.notApplicable(fit)).hasValueSatisfying(r -> assertThat(r).contains("two-step"));
        assertThat(WindmeijerCorrection.of(model, new double[2], iterated, fit)).isEmpty();
    }

    /** θ̂2 = -(D'WD)^{-1} D'W g(0) with W = S(θ1)^{-1}, the closed form of a linear model. */
    private static double[] secondStepFrom(LinearRegressionMoments model, double[] firstStep, LongRunOptions options) {
        DMatrixRMaj w = Inference.efficientWeight(LongRunCovariance.estimate(model.contributions(firstStep), options)
                .covariance());
        DMatrixRMaj d = model.meanJacobian(firstStep);
        DMatrixRMaj g0 = model.meanMoments(new double[2]);
        DMatrixRMaj bread = Matrices.invertSymmetric(Matrices.quadraticForm(d, w), "D'WD");
        DMatrixRMaj wg = new DMatrixRMaj(w.numRows, 1);
        org.ejml.dense.row.CommonOps_DDRM.mult(w, g0, wg);
        DMatrixRMaj dwg = new DMatrixRMaj(2, 1);
        org.ejml.dense.row.CommonOps_DDRM.multTransA(d, wg, dwg);
        DMatrixRMaj theta = new DMatrixRMaj(2, 1);
        org.ejml.dense.row.CommonOps_DDRM.mult(-1.0, bread, dwg, theta);
        return theta.data.clone();
    }

    private static void assertMatchesScript(String name, GmmFit fit, WindmeijerCorrection.Result result) {
        List<Map<String, String>> rows = reference(name);
        // Entries of 𝒟 that vanish in theory (∂θ̂2/∂β1 for power utility: S scales with β², so its β-derivative
        // is 2S/β and 𝒟 times it is (2/β) A2^{-1} times the gradient G2'W2 g2, zero at an exact minimum) are as
        // small as each solver's first-order condition: compare every entry on 1e-5 of the largest.
        double scale = 0;
        for (double v : result.derivative().data) {
            scale = Math.max(scale, Math.abs(v));
        }
        for (int i = 0; i < rows.size(); i++) {
            Map<String, String> row = rows.get(i);
            assertClose("first step " + i, result.firstStep()[i], row.get("first_step"));
            assertClose("estimate " + i, fit.estimates()[i], row.get("estimate"));
            assertClose("std error " + i, fit.parameters().get(i).stdError(), row.get("std_error"));
            assertClose("Windmeijer std error " + i, result.stdErrors()[i], row.get("std_error_windmeijer"));
            String[] dRow = row.get("d_row").split(" ");
            for (int j = 0; j < dRow.length; j++) {
                double expected = Double.parseDouble(dRow[j]);
                assertThat(result.derivative().get(i, j)).as("D[%d][%d]", i, j)
                        .isCloseTo(expected, org.assertj.core.api.Assertions.within(1e-5 * scale));
            }
        }
    }

    private static void assertClose(String what, double actual, String expected) {
        double value = Double.parseDouble(expected);
        assertThat(Math.abs(actual - value)).as("%s: Orthogon %s, script %s", what, actual, expected)
                .isLessThanOrEqualTo(RELATIVE * Math.abs(value));
    }

    private static LinearRegressionMoments ivModel() {
        List<String> lines = resourceLines("iv_data.csv");
        int t = lines.size() - 1;
        double[] y = new double[t];
        double[][] x = new double[t][2];
        double[][] z = new double[t][4];
        for (int r = 0; r < t; r++) {
            String[] cells = lines.get(r + 1).split(",");
            y[r] = Double.parseDouble(cells[0]);
            for (int p = 0; p < 2; p++) {
                x[r][p] = Double.parseDouble(cells[1 + p]);
            }
            for (int k = 0; k < 4; k++) {
                z[r][k] = Double.parseDouble(cells[3 + k]);
            }
        }
        return new LinearRegressionMoments(y, x, z, List.of("const", "slope"));
    }

    private static List<Map<String, String>> reference(String name) {
        List<String> lines = resourceLines("windmeijer_values.csv");
        String[] header = lines.get(0).split(",");
        List<Map<String, String>> rows = new ArrayList<>();
        for (String line : lines.subList(1, lines.size())) {
            String[] cells = line.split(",");
            Map<String, String> row = new HashMap<>();
            for (int i = 0; i < header.length; i++) {
                row.put(header[i], cells[i]);
            }
            if (row.get("case").equals(name)) {
                rows.add(row);
            }
        }
        assertThat(rows).isNotEmpty();
        return rows;
    }

    static List<String> resourceLines(String name) {
        try (InputStream in = WindmeijerCorrectionTest.class.getResourceAsStream("/reference/robust/" + name)) {
            if (in == null) {
                throw new IllegalStateException("missing test resource /reference/robust/" + name);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8).lines().toList();
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
