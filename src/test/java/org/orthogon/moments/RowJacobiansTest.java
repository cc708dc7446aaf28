package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.api.Test;

/**
 * Per-observation Jacobians: their mean is the mean Jacobian D (by definition, D = (1/T) Σ ∂f_t/∂θ'),
 * and the analytic rows agree with central differences of the contributions (common practice, no
 * source; the difference error is of order ε^{2/3}, see {@link CentralDifferences}).
 */
class RowJacobiansTest {

    @Test
    void scaledRecursiveUtilityRowsAverageToTheMeanJacobianAndMatchDifferences() {
        FamilyFixtures data = new FamilyFixtures(9, 40, 3, 1);
        double[][] z = new double[40][2];
        for (int t = 0; t < 40; t++) {
            z[t][0] = 1.0;
            z[t][1] = data.factors[t][0];
        }
        MomentModel model = ScaledMoments.scaled(new RecursiveUtilityErrors(data.gross, data.growth, data.wealth,
                List.of("A", "B", "C"), "W"), z, List.of("const", "z"));
        double[] theta = {0.97, 6.0, 0.4};
        assertRowsAverageToD(model, theta);
        assertClose(model.rowJacobians(theta), RowJacobians.numerical(model, theta), 1e-8);
    }

    @Test
    void modelsWithoutRowJacobiansFallBackToDifferences() {
        FamilyFixtures data = new FamilyFixtures(4, 30, 2, 1);
        MomentModel family = ScaledMoments.unscaled(new PowerUtilityErrors(data.gross, data.growth, List.of("A", "B")));
        MomentModel bare = new MomentModel() {
            @Override
            public List<String> parameterNames() {
                return family.parameterNames();
            }

            @Override
            public List<String> momentNames() {
                return family.momentNames();
            }

            @Override
            public int observations() {
                return family.observations();
            }

            @Override
            public DMatrixRMaj contributions(double[] theta) {
                return family.contributions(theta);
            }

            @Override
            public DMatrixRMaj meanJacobian(double[] theta) {
                return family.meanJacobian(theta);
            }

            @Override
            public boolean isLinear() {
                return false;
            }

            @Override
            public DMatrixRMaj payoffs() {
                return family.payoffs();
            }
        };
        double[] theta = {0.98, 3.0};
        assertClose(RowJacobians.of(bare, theta), family.rowJacobians(theta), 1e-8);
        DMatrixRMaj gamma = RowJacobians.parameter(family.rowJacobians(theta), 2, 2, 1);
        // ∂e/∂γ = -β ln(g) g^{-γ} R (the family's analytic derivative, Hansen and Singleton 1982)
        double expected = -0.98 * Math.log(data.growth[7]) * Math.pow(data.growth[7], -3.0) * data.gross[7][1];
        assertThat(gamma.get(7, 1)).isCloseTo(expected, org.assertj.core.api.Assertions.within(1e-14));
    }

    private static void assertRowsAverageToD(MomentModel model, double[] theta) {
        DMatrixRMaj rows = model.rowJacobians(theta);
        DMatrixRMaj d = model.meanJacobian(theta);
        int width = rows.numCols;
        for (int c = 0; c < width; c++) {
            double sum = 0;
            for (int t = 0; t < rows.numRows; t++) {
                sum += rows.get(t, c);
            }
            assertThat(sum / rows.numRows).isCloseTo(d.data[c], org.assertj.core.api.Assertions.within(1e-13));
        }
    }

    private static void assertClose(DMatrixRMaj actual, DMatrixRMaj expected, double relative) {
        assertThat(actual.numRows).isEqualTo(expected.numRows);
        assertThat(actual.numCols).isEqualTo(expected.numCols);
        for (int i = 0; i < expected.getNumElements(); i++) {
            assertThat(Math.abs(actual.data[i] - expected.data[i]))
                    .isLessThanOrEqualTo(relative * Math.max(1.0, Math.abs(expected.data[i])));
        }
    }
}
