package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Paths;
import java.util.List;
import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelFile;

/**
 * Identification diagnostics: the smallest singular value of the scaled Jacobian on designs whose answer is
 * known, and the economic ranges on the demo models.
 */
class IdentificationDiagnosticsTest {

    @Test
    void scaledSingularValueOfKnownJacobians() {
        // With Ŝ = I the scaled Jacobian is D with unit columns: orthogonal columns give σ_min = 1; columns at an
        // angle φ give σ_min = sqrt(1 - cos φ), the smaller eigenvalue of [[1, c], [c, 1]] being 1 - c
        // (linear algebra; common practice, no source).
        DMatrixRMaj identity = CommonOps_DDRM.identity(3);
        double[] direction = new double[2];
        DMatrixRMaj orthogonal = new DMatrixRMaj(new double[][] {{2, 0}, {0, 5}, {0, 0}});
        assertThat(IdentificationDiagnostics.smallestScaledSingularValue(orthogonal, identity, direction))
                .isCloseTo(1.0, within(1e-12));
        double c = Math.cos(0.01);
        DMatrixRMaj nearlyParallel = new DMatrixRMaj(new double[][] {{1, 3 * c}, {0, 3 * Math.sin(0.01)}, {0, 0}});
        assertThat(IdentificationDiagnostics.smallestScaledSingularValue(nearlyParallel, identity, direction))
                .isCloseTo(Math.sqrt(1 - c), within(1e-10));
        // The weak direction is the difference of the two (unit-scaled) parameters.
        assertThat(Math.abs(direction[0])).isCloseTo(Math.sqrt(0.5), within(1e-6));
        assertThat(direction[0] * direction[1]).isNegative();
    }

    @Test
    void nearlyCollinearRegressorsAreNotACleanEstimate() {
        Random random = new Random(3);
        int t = 300;
        double[] y = new double[t];
        double[][] x = new double[t][2];
        double[][] z = new double[t][3];
        for (int s = 0; s < t; s++) {
            double a = random.nextGaussian();
            x[s][0] = a;
            x[s][1] = a + 3e-4 * random.nextGaussian();
            z[s][0] = x[s][0];
            z[s][1] = x[s][1];
            z[s][2] = random.nextGaussian();
            y[s] = x[s][0] + random.nextGaussian();
        }
        LinearRegressionMoments model = new LinearRegressionMoments(y, x, z, List.of("first", "second"));
        GmmFit fit = GmmEstimator.estimate(model, new double[2], new GmmOptions(EstimationMethod.TWO_STEP,
                LongRunOptions.heteroskedasticityConsistent()));
        GmmFit assessed = IdentificationDiagnostics.assess(model, fit, List.of());
        assertThat(assessed.diagnostics().smallestSingularValue()).isLessThan(IdentificationDiagnostics.UNIDENTIFIED);
        assertThat(assessed.diagnostics().clean()).isFalse();
        assertThat(assessed.warnings()).anyMatch(w -> w.startsWith(GmmEstimator.NOT_CLEAN)
                && w.contains("first and second move the moments almost alike"));
        assertThat(assessed.estimates()).containsExactly(fit.estimates());
    }

    @Test
    void recursiveUtilityOfTheDemoIsFlaggedAndPowerUtilityIsClean() {
        var recursive = FittedRun.of(ModelFile.read(Paths.get("models/lumen-recursive-utility.toml"))).fit();
        // The estimate the issue reported as clean: psi = -0.03, beta = 1.108 (SE 1.11).
        assertThat(recursive.parameter("psi").estimate()).isCloseTo(-0.0295, within(1e-3));
        assertThat(recursive.parameter("beta").estimate()).isCloseTo(1.1076, within(1e-3));
        assertThat(recursive.diagnostics().clean()).isFalse();
        assertThat(recursive.diagnostics().identificationProblems()).hasSize(2)
                .anyMatch(p -> p.startsWith("psi = ") && p.contains("(0, inf)"))
                .anyMatch(p -> p.startsWith("beta = ") && p.contains("(0, 1.1)"));
        assertThat(recursive.warnings()).anyMatch(w -> w.startsWith("weak identification"));
        var power = FittedRun.of(ModelFile.read(Paths.get("models/lumen-power-utility.toml"))).fit();
        assertThat(power.diagnostics().clean()).isTrue();
        assertThat(power.diagnostics().smallestSingularValue()).isGreaterThan(0.9);
    }
}
