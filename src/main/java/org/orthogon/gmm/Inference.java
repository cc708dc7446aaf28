package org.orthogon.gmm;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.NormOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
import org.ejml.interfaces.linsol.LinearSolverDense;

/**
 * Asymptotic inference for GMM estimates (Hansen 1982, "Large sample properties of generalized method
 * of moments estimators", Econometrica 50). All inputs are evaluated at the estimate: D = ∂g_T/∂θ'
 * (K x P), W the weight used to estimate (K x K), S the long-run covariance of f_t (K x K), T the
 * number of observations. Pure functions; inputs are never modified.
 */
public final class Inference {
    private Inference() {
    }

    /**
     * Covariance of the efficient estimate, V = (D' S^{-1} D)^{-1} / T (Hansen 1982, Theorem 3.2).
     */
    public static DMatrixRMaj efficientCovariance(DMatrixRMaj jacobian, DMatrixRMaj longRun, int observations) {
        DMatrixRMaj sInverse = Matrices.invertSymmetric(longRun, "S, the long-run covariance of the moments");
        DMatrixRMaj information = Matrices.quadraticForm(jacobian, sInverse);
        DMatrixRMaj covariance = Matrices.invertSymmetric(information, "D'S^{-1}D");
        CommonOps_DDRM.divide(covariance, observations);
        return covariance;
    }

    /**
     * The efficient weight W = S^{-1} (Hansen 1982, Theorem 3.2), refusing a numerically singular S
     * rather than regularising it silently.
     */
    public static DMatrixRMaj efficientWeight(DMatrixRMaj longRun) {
        return Matrices.invertSymmetric(longRun, "S, the long-run covariance of the moments");
    }

    /**
     * Sandwich covariance for any weight W:
     * V = (D'WD)^{-1} D'W S W D (D'WD)^{-1} / T (Hansen 1982, Theorem 3.1).
     */
    public static DMatrixRMaj sandwichCovariance(DMatrixRMaj jacobian, DMatrixRMaj weight, DMatrixRMaj longRun,
            int observations) {
        DMatrixRMaj bread = Matrices.invertSymmetric(Matrices.quadraticForm(jacobian, weight), "D'WD");
        DMatrixRMaj wd = new DMatrixRMaj(weight.numRows, jacobian.numCols);
        CommonOps_DDRM.mult(weight, jacobian, wd);
        DMatrixRMaj meat = Matrices.quadraticForm(wd, longRun);
        DMatrixRMaj covariance = Matrices.quadraticForm(bread, meat);
        CommonOps_DDRM.divide(covariance, observations);
        return Matrices.symmetrize(covariance);
    }

    /** (I - D H) S (I - D H)' / T for the P x K influence H of g_T on θ̂. */
    private static DMatrixRMaj projectedCovariance(DMatrixRMaj jacobian, DMatrixRMaj influence, DMatrixRMaj longRun,
            int observations) {
        int k = jacobian.numRows;
        DMatrixRMaj annihilator = CommonOps_DDRM.identity(k);
        CommonOps_DDRM.multAdd(-1.0, jacobian, influence, annihilator);
        DMatrixRMaj temp = new DMatrixRMaj(k, k);
        CommonOps_DDRM.mult(annihilator, longRun, temp);
        DMatrixRMaj covariance = new DMatrixRMaj(k, k);
        CommonOps_DDRM.multTransB(temp, annihilator, covariance);
        CommonOps_DDRM.divide(covariance, observations);
        return Matrices.symmetrize(covariance);
    }

    /**
     * Covariance of an estimate that solves a g_T(θ̂) = 0 for a fixed P x K selection a (Hansen 1982,
     * Theorem 3.1; Cochrane 2005, "Asset Pricing", revised edition, section 11.2):
     * V = (aD)^{-1} a S a' (aD)^{-1}' / T. With a = D'W it is {@link #sandwichCovariance}; S is never
     * inverted, so a singular S is fine.
     */
    public static DMatrixRMaj selectionCovariance(DMatrixRMaj jacobian, DMatrixRMaj selection, DMatrixRMaj longRun,
            int observations) {
        DMatrixRMaj influence = selectionInfluence(jacobian, selection);
        DMatrixRMaj transposed = new DMatrixRMaj(influence.numCols, influence.numRows);
        CommonOps_DDRM.transpose(influence, transposed);
        DMatrixRMaj covariance = Matrices.quadraticForm(transposed, longRun);
        CommonOps_DDRM.divide(covariance, observations);
        return Matrices.symmetrize(covariance);
    }

    /**
     * Covariance of the sample moments at an estimate that solves a g_T(θ̂) = 0 (Cochrane 2005, section
     * 11.2): Var(g_T) = (1/T) (I - D(aD)^{-1}a) S (I - D(aD)^{-1}a)'. With a = D'W it is
     * {@link #pricingErrorCovariance}; its rank is K - P.
     */
    public static DMatrixRMaj selectionErrorCovariance(DMatrixRMaj jacobian, DMatrixRMaj selection,
            DMatrixRMaj longRun, int observations) {
        return projectedCovariance(jacobian, selectionInfluence(jacobian, selection), longRun, observations);
    }

    /** (aD)^{-1} a, P x K: how θ̂ moves with g_T. */
    private static DMatrixRMaj selectionInfluence(DMatrixRMaj jacobian, DMatrixRMaj selection) {
        DMatrixRMaj ad = new DMatrixRMaj(selection.numRows, jacobian.numCols);
        CommonOps_DDRM.mult(selection, jacobian, ad);
        return Matrices.solveSquare(ad, selection, "aD, the selected moments' Jacobian");
    }

    /**
     * Hansen's (1982) J statistic T g_T' W g_T; chi-square with K - P degrees of freedom when
     * W is the efficient weight.
     */
    public static double quadraticStatistic(DMatrixRMaj meanMoments, DMatrixRMaj weight, int observations) {
        return observations * Matrices.quadraticValue(meanMoments, weight);
    }

    /**
     * Covariance of the sample moments at the estimate,
     * Var(g_T) = (1/T) (I - D(D'WD)^{-1}D'W) S (I - D(D'WD)^{-1}D'W)' (Hansen 1982, Lemma 4.1;
     * Cochrane 2005, "Asset Pricing", section 11.5). Its rank is K - P.
     *
     * <p>With M = (D'WD)^{-1}D'W (P x K) and N = M S, the product expands to
     * S - D N - N'D' + D (N M') D', which costs O(K² P) instead of the O(K³) of the two K x K products.
     */
    public static DMatrixRMaj pricingErrorCovariance(DMatrixRMaj jacobian, DMatrixRMaj weight,
            DMatrixRMaj longRun, int observations) {
        int k = jacobian.numRows;
        int p = jacobian.numCols;
        DMatrixRMaj bread = Matrices.invertSymmetric(Matrices.quadraticForm(jacobian, weight), "D'WD");
        DMatrixRMaj dtW = new DMatrixRMaj(p, k);
        CommonOps_DDRM.multTransA(jacobian, weight, dtW);
        DMatrixRMaj m = new DMatrixRMaj(p, k);
        CommonOps_DDRM.mult(bread, dtW, m);
        DMatrixRMaj n = new DMatrixRMaj(p, k);
        CommonOps_DDRM.mult(m, longRun, n);
        DMatrixRMaj nmt = new DMatrixRMaj(p, p);
        CommonOps_DDRM.multTransB(n, m, nmt);
        DMatrixRMaj dnmt = new DMatrixRMaj(k, p);
        CommonOps_DDRM.mult(jacobian, nmt, dnmt);
        DMatrixRMaj covariance = longRun.copy();
        // S - D N - (D N)' + D (N M') D', term by term on the K x K entries
        double[] c = covariance.data;
        double[] d = jacobian.data;
        double[] nn = n.data;
        double[] e = dnmt.data;
        for (int i = 0; i < k; i++) {
            for (int j = 0; j < k; j++) {
                double sum = 0.0;
                for (int a = 0; a < p; a++) {
                    sum += -d[i * p + a] * nn[a * k + j] - nn[a * k + i] * d[j * p + a] + e[i * p + a] * d[j * p + a];
                }
                c[i * k + j] += sum;
            }
        }
        CommonOps_DDRM.divide(covariance, observations);
        return Matrices.symmetrize(covariance);
    }

    /**
     * Joint test that all pricing errors are zero, g_T' Var(g_T)^+ g_T, with the pseudo-inverse taken
     * over the K - P largest eigenvalues of Var(g_T), its known rank (Cochrane 2005, section 11.5,
     * equation 11.17). With the efficient weight it equals the J statistic.
     *
     * <p>The null space of Var(g_T) is known: (I - D(D'WD)^{-1}D'W)' x = 0 exactly for x in the span of
     * WD. So the pseudo-inverse is Q (Q' Var Q)^{-1} Q' with Q an orthonormal basis of the complement
     * of that span, from the Householder QR of WD (Golub and Van Loan 2013, section 5.2), and one
     * Cholesky solve of order K - P replaces the eigen-decomposition. Should Q' Var Q not be positive
     * definite in floating point, the eigenvalue route decides.
     */
    public static double jointPricingStatistic(DMatrixRMaj meanMoments, DMatrixRMaj errorCovariance, int rank,
            DMatrixRMaj jacobian, DMatrixRMaj weight) {
        int k = errorCovariance.numRows;
        int p = jacobian.numCols;
        if (rank != k - p) {
            return jointPricingStatistic(meanMoments, errorCovariance, rank);
        }
        DMatrixRMaj wd = new DMatrixRMaj(k, p);
        CommonOps_DDRM.mult(weight, jacobian, wd);
        DMatrixRMaj v = errorCovariance.copy();
        double[] z = meanMoments.data.clone();
        double[] column = new double[k];
        for (int j = 0; j < p; j++) {
            // Householder vector h of column j of the partly reduced WD, below the diagonal: (I - 2hh'/h'h)
            double norm = 0.0;
            for (int i = j; i < k; i++) {
                column[i] = wd.unsafe_get(i, j);
                norm += column[i] * column[i];
            }
            norm = Math.sqrt(norm);
            if (norm == 0.0) {
                return jointPricingStatistic(meanMoments, errorCovariance, rank);
            }
            column[j] += column[j] >= 0 ? norm : -norm;
            double hh = 0.0;
            for (int i = j; i < k; i++) {
                hh += column[i] * column[i];
            }
            double tau = 2.0 / hh;
            reflectRows(wd, column, j, tau);
            reflectRows(v, column, j, tau);
            reflectColumns(v, column, j, tau);
            double dot = 0.0;
            for (int i = j; i < k; i++) {
                dot += column[i] * z[i];
            }
            for (int i = j; i < k; i++) {
                z[i] -= tau * dot * column[i];
            }
        }
        int m = k - p;
        DMatrixRMaj block = new DMatrixRMaj(m, m);
        for (int i = 0; i < m; i++) {
            for (int j = 0; j < m; j++) {
                block.unsafe_set(i, j, v.unsafe_get(p + i, p + j));
            }
        }
        Matrices.symmetrize(block);
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.chol(m);
        if (!solver.setA(block)) {
            return jointPricingStatistic(meanMoments, errorCovariance, rank);
        }
        DMatrixRMaj rhs = new DMatrixRMaj(m, 1);
        System.arraycopy(z, p, rhs.data, 0, m);
        DMatrixRMaj solved = new DMatrixRMaj(m, 1);
        solver.solve(rhs, solved);
        double statistic = 0.0;
        for (int i = 0; i < m; i++) {
            statistic += rhs.data[i] * solved.data[i];
        }
        return statistic;
    }

    /** A ← H A with H = I - τ h h', h zero above row {@code from}. */
    private static void reflectRows(DMatrixRMaj a, double[] h, int from, double tau) {
        int n = a.numCols;
        double[] data = a.data;
        double[] dots = new double[n];
        for (int i = from; i < a.numRows; i++) {
            double hi = h[i];
            int row = i * n;
            for (int c = 0; c < n; c++) {
                dots[c] += hi * data[row + c];
            }
        }
        for (int i = from; i < a.numRows; i++) {
            double hi = tau * h[i];
            int row = i * n;
            for (int c = 0; c < n; c++) {
                data[row + c] -= hi * dots[c];
            }
        }
    }

    /** A ← A H with H = I - τ h h', h zero above entry {@code from}. */
    private static void reflectColumns(DMatrixRMaj a, double[] h, int from, double tau) {
        int n = a.numCols;
        double[] data = a.data;
        for (int r = 0; r < a.numRows; r++) {
            int row = r * n;
            double dot = 0.0;
            for (int c = from; c < n; c++) {
                dot += data[row + c] * h[c];
            }
            dot *= tau;
            for (int c = from; c < n; c++) {
                data[row + c] -= dot * h[c];
            }
        }
    }

    /**
     * Joint test that all pricing errors are zero, g_T' Var(g_T)^+ g_T, with the pseudo-inverse taken
     * over the {@code rank} largest eigenvalues of Var(g_T) (Cochrane 2005, section 11.5, equation
     * 11.17): the route for any covariance whose null space is not known.
     */
    public static double jointPricingStatistic(DMatrixRMaj meanMoments, DMatrixRMaj errorCovariance, int rank) {
        int k = errorCovariance.numRows;
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(k, true, true);
        if (!eig.decompose(errorCovariance.copy())) {
            throw new IllegalStateException("eigen-decomposition of the pricing-error covariance failed");
        }
        double[] values = new double[k];
        Integer[] byDecreasingValue = new Integer[k];
        for (int i = 0; i < k; i++) {
            values[i] = eig.getEigenvalue(i).real;
            byDecreasingValue[i] = i;
        }
        Arrays.sort(byDecreasingValue, (a, b) -> Double.compare(values[b], values[a]));
        double statistic = 0.0;
        for (int r = 0; r < rank; r++) {
            int index = byDecreasingValue[r];
            DMatrixRMaj vector = eig.getEigenVector(index);
            double norm = NormOps_DDRM.normF(vector);
            double projection = 0.0;
            for (int i = 0; i < k; i++) {
                projection += vector.data[i] * meanMoments.data[i];
            }
            projection /= norm;
            statistic += projection * projection / values[index];
        }
        return statistic;
    }
}
