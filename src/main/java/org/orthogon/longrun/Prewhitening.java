package org.orthogon.longrun;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.SingularOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.QRPDecomposition_F64;

/**
 * VAR(1) prewhitening of Andrews and Monahan (1992), "An Improved Heteroskedasticity and
 * Autocorrelation Consistent Covariance Matrix Estimator", Econometrica 60(4), 953-966:
 * u_t = A u_{t-1} + e_t fitted by OLS without intercept on t = 2..T, the kernel estimate S_e is
 * formed from the T - 1 residuals e_t, and S = (I - A)^{-1} S_e (I - A)^{-1}'.
 */
final class Prewhitening {

    /**
     * Smallest singular value of I - A accepted. The recolouring multiplies S_e by up to
     * 1/σ_min², so an A with a unit root makes S meaningless; I's singular values are 1, which
     * makes an absolute threshold scale-free.
     */
    static final double MIN_SINGULAR_VALUE = 1e-8;

    /**
     * Smallest accepted ratio of the smallest to the largest |r_ii| of the pivoted QR of the lagged
     * series: below it the columns are collinear to about 12 digits and A is not determined.
     */
    static final double MIN_DIAGONAL_RATIO = 1e-12;

    final DMatrixRMaj coefficients;
    final DMatrixRMaj recolour;
    final double[] residuals;
    final int rows;

    private Prewhitening(DMatrixRMaj a, DMatrixRMaj d, double[] e, int rows) {
        this.coefficients = a;
        this.recolour = d;
        this.residuals = e;
        this.rows = rows;
    }

    /**
     * Fits the VAR(1) to the row-major series u (T x K).
     *
     * @throws IllegalArgumentException if T - 1 &lt; K + 1 (too few rows to fit and keep a residual
     *     degree of freedom), the lagged series is rank deficient, or I - A is near singular
     */
    static Prewhitening fit(double[] u, int t, int k) {
        int n = t - 1;
        if (n < k + 1) {
            throw new LongRunException("VAR(1) prewhitening of " + k + " moment columns needs at least "
                    + (k + 2) + " observations, got T=" + t);
        }
        DMatrixRMaj x = new DMatrixRMaj(n, k);
        DMatrixRMaj y = new DMatrixRMaj(n, k);
        System.arraycopy(u, 0, x.data, 0, n * k);
        System.arraycopy(u, k, y.data, 0, n * k);
        QRPDecomposition_F64<DMatrixRMaj> qrp = DecompositionFactory_DDRM.qrp(n, k);
        if (!qrp.decompose(x.copy())) {
            throw new LongRunException("VAR(1) prewhitening: the lagged moment matrix is rank deficient");
        }
        // EJML's solver quality() is the product of |r_ii| / max |r_ii|, which underflows with
        // many well-conditioned columns (K = 43 gave 4e-17); the smallest ratio of the pivoted-QR
        // diagonal is a rank indicator that does not shrink with K.
        DMatrixRMaj r = qrp.getR(null, true);
        double largest = 0.0;
        double least = Double.POSITIVE_INFINITY;
        for (int i = 0; i < k; i++) {
            double d = Math.abs(r.get(i, i));
            largest = Math.max(largest, d);
            least = Math.min(least, d);
        }
        double ratio = least / largest;
        if (!(ratio >= MIN_DIAGONAL_RATIO)) {
            throw new LongRunException("VAR(1) prewhitening: the lagged moment matrix is rank deficient"
                    + " (smallest/largest pivoted-QR diagonal " + ratio + ", limit " + MIN_DIAGONAL_RATIO + ")");
        }
        // X P = Q R, so R (P'B) = Q'Y. EJML's least-squares solve applies the reflectors one
        // right-hand side at a time (65 ms for K = 100, T = 1200); forming the thin Q and one
        // product Q'Y gives the same B in a quarter of the time.
        DMatrixRMaj q = qrp.getQ(null, true);
        DMatrixRMaj z = new DMatrixRMaj(k, k);
        CommonOps_DDRM.multTransA(q, y, z);
        backSubstitute(r, z);
        int[] pivots = qrp.getColPivots();
        DMatrixRMaj b = new DMatrixRMaj(k, k);
        for (int i = 0; i < k; i++) {
            System.arraycopy(z.data, i * k, b.data, pivots[i] * k, k);
        }
        DMatrixRMaj e = y.copy();
        CommonOps_DDRM.multAdd(-1.0, x, b, e);
        DMatrixRMaj a = CommonOps_DDRM.transpose(b, null);
        DMatrixRMaj iMinusA = CommonOps_DDRM.identity(k);
        CommonOps_DDRM.subtractEquals(iMinusA, a);
        double smallest = Double.POSITIVE_INFINITY;
        for (double sv : SingularOps_DDRM.singularValues(iMinusA)) {
            smallest = Math.min(smallest, sv);
        }
        if (!(smallest >= MIN_SINGULAR_VALUE)) {
            throw new LongRunException("VAR(1) prewhitening refused: I - A is near singular (smallest singular"
                    + " value " + smallest + ", limit " + MIN_SINGULAR_VALUE + "), the moments behave like a"
                    + " unit-root process; estimate without prewhitening");
        }
        DMatrixRMaj d = new DMatrixRMaj(k, k);
        if (!CommonOps_DDRM.invert(iMinusA, d)) {
            throw new LongRunException("VAR(1) prewhitening refused: I - A is singular");
        }
        return new Prewhitening(a, d, e.data, n);
    }

    /** Overwrites Z with R^{-1} Z for upper-triangular R (K x K) and Z (K x K), row by row from the bottom. */
    private static void backSubstitute(DMatrixRMaj r, DMatrixRMaj z) {
        int k = r.numRows;
        double[] zd = z.data;
        for (int i = k - 1; i >= 0; i--) {
            int row = i * k;
            for (int m = i + 1; m < k; m++) {
                double rim = r.data[row + m];
                int other = m * k;
                for (int c = 0; c < k; c++) {
                    zd[row + c] -= rim * zd[other + c];
                }
            }
            double d = r.data[row + i];
            for (int c = 0; c < k; c++) {
                zd[row + c] /= d;
            }
        }
    }

    /** D S D' with D = (I - A)^{-1}, symmetrised so rounding leaves no asymmetry downstream. */
    DMatrixRMaj recolour(DMatrixRMaj s) {
        int k = s.numRows;
        DMatrixRMaj tmp = new DMatrixRMaj(k, k);
        DMatrixRMaj out = new DMatrixRMaj(k, k);
        CommonOps_DDRM.mult(recolour, s, tmp);
        CommonOps_DDRM.multTransB(tmp, recolour, out);
        for (int p = 0; p < k; p++) {
            for (int q = p + 1; q < k; q++) {
                double m = 0.5 * (out.get(p, q) + out.get(q, p));
                out.set(p, q, m);
                out.set(q, p, m);
            }
        }
        return out;
    }
}
