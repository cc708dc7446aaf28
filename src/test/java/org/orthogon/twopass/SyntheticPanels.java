package org.orthogon.twopass;

import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.QRDecomposition;

/**
 * Seeded factor panels built so that a property holds exactly in the sample: residuals orthogonal to
 * a constant and the factors, so that least squares returns the loadings put in, and, when asked,
 * residuals whose sample covariance is exactly σ² I.
 */
final class SyntheticPanels {
    private SyntheticPanels() {
    }

    /**
     * R_t = a + β f_t + ε_t with ε orthogonal in sample to [1, f]; {@code sphericalResiduals} makes
     * (1/T) ε'ε = σ² I exactly.
     */
    static FactorSample panel(long seed, int t, int n, int k, double[] alpha, boolean sphericalResiduals) {
        SplittableRandom random = new SplittableRandom(seed);
        double[][] f = new double[t][k];
        for (double[] row : f) {
            for (int j = 0; j < k; j++) {
                row[j] = 0.005 + 0.04 * random.nextGaussian();
            }
        }
        double[][] beta = new double[n][k];
        for (double[] row : beta) {
            for (int j = 0; j < k; j++) {
                row[j] = 0.5 + random.nextDouble();
            }
        }
        DMatrixRMaj noise = new DMatrixRMaj(t, n);
        for (int s = 0; s < t; s++) {
            for (int i = 0; i < n; i++) {
                noise.set(s, i, 0.02 * (1 + i % 3) * random.nextGaussian());
            }
        }
        DMatrixRMaj residuals = orthogonalToConstantAndFactors(noise, f);
        if (sphericalResiduals) {
            QRDecomposition<DMatrixRMaj> qr = DecompositionFactory_DDRM.qr(t, n);
            qr.decompose(residuals.copy());
            DMatrixRMaj q = qr.getQ(null, true);
            residuals = q;
            CommonOps_DDRM.scale(0.03 * Math.sqrt(t), residuals);
        }
        double[][] r = new double[t][n];
        for (int s = 0; s < t; s++) {
            for (int i = 0; i < n; i++) {
                double value = alpha[i] + residuals.get(s, i);
                for (int j = 0; j < k; j++) {
                    value += beta[i][j] * f[s][j];
                }
                r[s][i] = value;
            }
        }
        return new FactorSample(names("P", n), names("F", k), r, f);
    }

    /** Z minus its least-squares projection on [1, f]. */
    static DMatrixRMaj orthogonalToConstantAndFactors(DMatrixRMaj z, double[][] f) {
        int t = z.numRows;
        int k = f[0].length;
        DMatrixRMaj x = new DMatrixRMaj(t, k + 1);
        for (int s = 0; s < t; s++) {
            x.set(s, 0, 1.0);
            for (int j = 0; j < k; j++) {
                x.set(s, j + 1, f[s][j]);
            }
        }
        DMatrixRMaj coefficients = new DMatrixRMaj(k + 1, z.numCols);
        CommonOps_DDRM.solve(x, z, coefficients);
        DMatrixRMaj fitted = new DMatrixRMaj(t, z.numCols);
        CommonOps_DDRM.mult(x, coefficients, fitted);
        DMatrixRMaj out = z.copy();
        CommonOps_DDRM.subtractEquals(out, fitted);
        return out;
    }

    static List<String> names(String prefix, int count) {
        List<String> out = new ArrayList<>();
        for (int i = 1; i <= count; i++) {
            out.add(prefix + i);
        }
        return out;
    }
}
