package org.orthogon.gmm;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.junit.jupiter.api.Test;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ScaledMoments;

/** The Hansen-Jagannathan distance, its limit weights and its simulated p-value. */
class HjDistanceTest {
    private static final LongRunOptions HC = LongRunOptions.heteroskedasticityConsistent();

    /**
     * Excess returns shifted so that m = 1 - b*'F prices them exactly in the sample:
     * mean((R_i + c_i) m_t) = 0 for c_i = -mean(R_i m)/mean(m).
     */
    private static MomentModel exactlyPriced(double[] bStar) {
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1962, 30, 77L);
        int months = sample.months().size();
        int assets = 8;
        double[][] f = sample.factors();
        double[] m = new double[months];
        double meanM = 0.0;
        for (int t = 0; t < months; t++) {
            m[t] = 1.0;
            for (int k = 0; k < 3; k++) {
                m[t] -= bStar[k] * f[t][k];
            }
            meanM += m[t] / months;
        }
        double[][] excess = new double[months][assets];
        for (int i = 0; i < assets; i++) {
            double meanRm = 0.0;
            for (int t = 0; t < months; t++) {
                excess[t][i] = sample.portfolioReturns()[t][i] - sample.riskfree()[t];
                meanRm += excess[t][i] * m[t] / months;
            }
            double shift = -meanRm / meanM;
            for (int t = 0; t < months; t++) {
                excess[t][i] += shift;
            }
        }
        return ScaledMoments.unscaled(new LinearFactorErrors(excess, f, economy.portfolioNames().subList(0, assets),
                economy.factorNames()));
    }

    @Test
    void distanceIsZeroWhenTheSdfPricesThePayoffsExactly() {
        double[] bStar = {2.5, 1.0, 4.0};
        MomentModel model = exactlyPriced(bStar);
        // Construction: g_T(b*) = 0 exactly up to rounding, so min g'G^{-1}g = 0 at b = b*.
        GmmFit fit = GmmEstimator.estimate(model, new double[3], new GmmOptions(EstimationMethod.TWO_STEP, HC));
        HjDistance hj = fit.hjDistance();
        assertThat(hj.value()).isCloseTo(0.0, within(1e-10));
        assertThat(hj.weights()).hasSize(5);
        assertThat(hj.pValue()).isEqualTo(1.0);
        for (int k = 0; k < 3; k++) {
            assertThat(fit.estimates()[k]).isCloseTo(bStar[k], within(1e-9));
        }
    }

    @Test
    void simulatedPValueIsReproducibleForASeed() {
        MomentModel model = LumenModels.linearSdf(10, 40, 78L);
        GmmOptions options = new GmmOptions(EstimationMethod.TWO_STEP, HC).withHjSimulation(20240101L, 50_000);
        HjDistance first = GmmEstimator.estimate(model, new double[3], options).hjDistance();
        HjDistance again = GmmEstimator.estimate(model, new double[3], options).hjDistance();
        assertThat(again.pValue()).isEqualTo(first.pValue());
        assertThat(again.seed()).isEqualTo(20240101L);
        assertThat(again.draws()).isEqualTo(50_000);
        HjDistance otherSeed = GmmEstimator.estimate(model, new double[3], options.withHjSimulation(7L, 50_000))
                .hjDistance();
        double p = first.pValue();
        // Another seed moves the estimate only by simulation noise: 5 binomial standard errors.
        assertThat(otherSeed.pValue()).isCloseTo(p, within(5 * Math.sqrt(p * (1 - p) / 50_000) + 1e-9));
        assertThat(otherSeed.value()).isEqualTo(first.value());
        assertThat(p).isBetween(0.0, 1.0);
    }

    @Test
    void equalWeightsGiveTheChiSquareTail() {
        // NIST/SEMATECH e-Handbook of Statistical Methods, table 1.3.6.7.4: the upper 5% point of χ²_5 is
        // 11.070; Σ λ z² with λ_j = 2 is 2 χ²_5.
        int draws = 200_000;
        double tolerance = 4 * Math.sqrt(0.05 * 0.95 / draws);
        assertThat(HansenJagannathan.weightedChiSquareUpperTail(11.070, new double[] {1, 1, 1, 1, 1}, 3L, draws))
                .isCloseTo(0.05, within(tolerance));
        assertThat(HansenJagannathan.weightedChiSquareUpperTail(22.140, new double[] {2, 2, 2, 2, 2}, 4L, draws))
                .isCloseTo(0.05, within(tolerance));
    }

    @Test
    void limitWeightsMatchTheSquareRootFormulaOfJagannathanAndWang() {
        // λ = eig(S^{1/2} G^{-1/2} [I - G^{-1/2} D (D'G^{-1}D)^{-1} D' G^{-1/2}] G^{-1/2} S^{1/2}) as written in
        // Jagannathan and Wang (1996), built here with symmetric square roots from eigen-decompositions,
        // against the estimator's Cholesky route.
        MomentModel model = LumenModels.linearSdf(10, 40, 79L);
        DMatrixRMaj gMatrix = InitialWeight.secondMoments(model);
        DMatrixRMaj gInverse = Matrices.invertSymmetric(gMatrix, "G");
        double[] theta = WeightedMinimizer.minimize(model, gInverse, new double[3]).theta();
        DMatrixRMaj s = GmmEstimator.longRun(model, theta, HC).covariance();
        DMatrixRMaj d = model.meanJacobian(theta);
        double[] weights = HansenJagannathan.limitWeights(d, gInverse, s, 7);

        DMatrixRMaj gHalfInv = symmetricPower(gMatrix, -0.5);
        DMatrixRMaj sHalf = symmetricPower(s, 0.5);
        DMatrixRMaj a = new DMatrixRMaj(10, 3);
        CommonOps_DDRM.mult(gHalfInv, d, a);
        DMatrixRMaj ata = new DMatrixRMaj(3, 3);
        CommonOps_DDRM.multTransA(a, a, ata);
        CommonOps_DDRM.invert(ata);
        DMatrixRMaj temp = new DMatrixRMaj(10, 3);
        CommonOps_DDRM.mult(a, ata, temp);
        DMatrixRMaj projection = new DMatrixRMaj(10, 10);
        CommonOps_DDRM.multTransB(temp, a, projection);
        DMatrixRMaj annihilator = CommonOps_DDRM.identity(10);
        CommonOps_DDRM.subtractEquals(annihilator, projection);
        DMatrixRMaj left = new DMatrixRMaj(10, 10);
        CommonOps_DDRM.mult(sHalf, gHalfInv, left);
        DMatrixRMaj middle = new DMatrixRMaj(10, 10);
        CommonOps_DDRM.mult(left, annihilator, middle);
        DMatrixRMaj full = new DMatrixRMaj(10, 10);
        CommonOps_DDRM.multTransB(middle, left, full);
        double[] eig = eigenvalues(full);
        Arrays.sort(eig);
        for (int j = 0; j < 7; j++) {
            assertThat(weights[j]).isCloseTo(eig[9 - j], within(1e-9 * eig[9]));
        }
        // Three eigenvalues are zero: the rank is K - P.
        for (int j = 0; j < 3; j++) {
            assertThat(eig[j]).isCloseTo(0.0, within(1e-9 * eig[9]));
        }
    }

    @Test
    void aSingularSecondMomentMatrixLeavesTheDistanceOutWithAReason() {
        // A payoff repeated: G is singular, so G^{-1} and δ do not exist; the fit itself still stands.
        MomentModel base = LumenModels.linearSdf(6, 30, 80L);
        MomentModel repeated = new ForwardingMomentModel(base) {
            @Override
            public java.util.List<String> momentNames() {
                var names = new java.util.ArrayList<>(base.momentNames());
                names.add(names.get(0) + "_again");
                return names;
            }

            @Override
            public DMatrixRMaj contributions(double[] theta) {
                return repeatFirstColumn(base.contributions(theta));
            }

            @Override
            public DMatrixRMaj meanJacobian(double[] theta) {
                return repeatFirstRow(base.meanJacobian(theta));
            }

            @Override
            public DMatrixRMaj payoffs() {
                return repeatFirstColumn(base.payoffs());
            }
        };
        GmmFit fit = GmmEstimator.estimate(repeated, new double[3], new GmmOptions(EstimationMethod.ONE_STEP, HC));
        assertThat(fit.hjDistance()).isNull();
        assertThat(fit.hj()).isEmpty();
        assertThat(fit.warnings()).anyMatch(w -> w.startsWith("the Hansen-Jagannathan distance is not reported")
                && w.contains("G, the second-moment matrix"));
        assertThat(fit.warnings()).anyMatch(w -> w.startsWith("S is nearly singular"));
    }

    private static DMatrixRMaj repeatFirstColumn(DMatrixRMaj m) {
        DMatrixRMaj out = new DMatrixRMaj(m.numRows, m.numCols + 1);
        for (int r = 0; r < m.numRows; r++) {
            for (int c = 0; c < m.numCols; c++) {
                out.set(r, c, m.get(r, c));
            }
            out.set(r, m.numCols, m.get(r, 0));
        }
        return out;
    }

    /** The K x P Jacobian with its first row repeated as a last row. */
    private static DMatrixRMaj repeatFirstRow(DMatrixRMaj d) {
        DMatrixRMaj out = new DMatrixRMaj(d.numRows + 1, d.numCols);
        for (int r = 0; r < d.numRows; r++) {
            for (int c = 0; c < d.numCols; c++) {
                out.set(r, c, d.get(r, c));
            }
        }
        for (int c = 0; c < d.numCols; c++) {
            out.set(d.numRows, c, d.get(0, c));
        }
        return out;
    }

    private static DMatrixRMaj symmetricPower(DMatrixRMaj a, double power) {
        int n = a.numRows;
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(n, true, true);
        eig.decompose(a.copy());
        DMatrixRMaj out = new DMatrixRMaj(n, n);
        for (int i = 0; i < n; i++) {
            double value = Math.pow(eig.getEigenvalue(i).real, power);
            DMatrixRMaj v = eig.getEigenVector(i);
            for (int r = 0; r < n; r++) {
                for (int c = 0; c < n; c++) {
                    out.add(r, c, value * v.get(r) * v.get(c));
                }
            }
        }
        return out;
    }

    private static double[] eigenvalues(DMatrixRMaj a) {
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(a.numRows, false, true);
        DMatrixRMaj symmetric = a.copy();
        Matrices.symmetrize(symmetric);
        eig.decompose(symmetric);
        double[] out = new double[a.numRows];
        for (int i = 0; i < a.numRows; i++) {
            out[i] = eig.getEigenvalue(i).real;
        }
        return out;
    }
}
