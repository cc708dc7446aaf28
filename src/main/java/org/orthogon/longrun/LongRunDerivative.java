package org.orthogon.longrun;

import java.util.Objects;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;

/**
 * The kernel long-run covariance S of a series u_t held at one bandwidth, with the two quantities that
 * finite-sample and weak-identification-robust GMM inference build on it:
 * <ul>
 *   <li>the cross long-run covariance V_{qu} = (1/T) Σ_t Σ_s k((t-s)/b) q_t u_s' of another series q_t
 *       with u_t, so that V_{uu} = S (Andrews 1991, eq. 2.4, written in its double-sum form). With q_t the
 *       per-observation derivatives ∂f_t/∂θ_j it is the covariance of the Jacobian with the moments that
 *       Kleibergen's (2005) K statistic removes from D;</li>
 *   <li>the derivative ∂S/∂θ_j of the estimator itself when u_t = f_t(θ) moves with θ and the bandwidth
 *       stays where it is: with u̇ = ∂u/∂θ_j, ∂S/∂θ_j = V_{u̇u} + V_{u̇u}', the term of the finite-sample
 *       correction of Windmeijer (2005, Journal of Econometrics 126, section 3) for a kernel S.</li>
 * </ul>
 *
 * <p>Centering: u_t = f_t - f̄, so u̇_t = ḟ_t - mean(ḟ) (the same for q). Prewhitening (Andrews and
 * Monahan 1992): Y = u_{2..T}, X = u_{1..T-1}, B = (X'X)^{-1}X'Y (A = B'), residuals e = Y - XB, kernel sum
 * over the T - 1 residuals divided by the original T, S = Q S_e Q' with Q = (I - A)^{-1}, as in
 * {@link LongRunCovariance#estimate}. Then V_{qu} = Q V^e_{qu} Q' with q filtered by the same A (a
 * consistent estimate: filtering both series by I - A L multiplies their cross spectrum at frequency zero
 * by (I - A) on each side), and the derivative follows the chain rule through B:
 * Ḃ = (X'X)^{-1}[Ẋ'Y + X'Ẏ - (Ẋ'X + X'Ẋ)B], ė = Ẏ - ẊB - XḂ, Q̇ = Q Ḃ' Q,
 * ∂S = Q̇ S_e Q' + Q (V^e_{ėe} + V^e_{ėe}') Q' + Q S_e Q̇'.
 *
 * <p>The bandwidth is the one selected for S at this θ and is held fixed: an automatic rule re-selects it
 * at every θ, but its dependence on θ is of smaller order than that of the autocovariances and the rules
 * are not differentiable everywhere (Windmeijer 2005 treats W as a smooth function of θ only through the
 * moments). Pure numerics over EJML matrices; nothing is read or printed.
 */
public final class LongRunDerivative {
    private final int rows;
    private final int cols;
    private final double divisor;
    private final boolean centered;
    private final double[] weights; // w_j for j = 1..maxLag of the kernel series (index j - 1)
    private final double[] series; // u (or the residuals e with prewhitening), row-major
    private final int seriesRows;
    private final double[] weighted; // W u (or W e), row-major
    private DMatrixRMaj innerCovariance; // S (or S_e), formed when first needed
    // prewhitening only
    private final DMatrixRMaj lagged; // X
    private final DMatrixRMaj lead; // Y
    private final DMatrixRMaj coefficients; // B
    private final DMatrixRMaj lagGramInverse; // (X'X)^{-1}
    private final DMatrixRMaj recolour; // Q

    private LongRunDerivative(DMatrixRMaj moments, LongRunOptions options, double bandwidth) {
        LongRunCovariance.validate(moments);
        if (!(bandwidth >= 0.0) || Double.isInfinite(bandwidth)) {
            throw new IllegalArgumentException("bandwidth must be a finite number >= 0, got " + bandwidth);
        }
        this.rows = moments.numRows;
        this.cols = moments.numCols;
        this.divisor = rows;
        this.centered = options.centered();
        double[] u = demeaned(moments);
        if (!options.prewhiten()) {
            lagged = null;
            lead = null;
            coefficients = null;
            lagGramInverse = null;
            recolour = null;
            series = u;
            seriesRows = rows;
        } else {
            int n = rows - 1;
            DMatrixRMaj[] pair = laggedPair(u, n);
            lagged = pair[0];
            lead = pair[1];
            DMatrixRMaj gram = new DMatrixRMaj(cols, cols);
            CommonOps_DDRM.multTransA(lagged, lagged, gram);
            lagGramInverse = new DMatrixRMaj(cols, cols);
            if (!CommonOps_DDRM.invert(gram, lagGramInverse)) {
                throw new IllegalArgumentException("VAR(1) prewhitening: the lagged moment matrix is rank deficient");
            }
            DMatrixRMaj xy = new DMatrixRMaj(cols, cols);
            CommonOps_DDRM.multTransA(lagged, lead, xy);
            coefficients = new DMatrixRMaj(cols, cols);
            CommonOps_DDRM.mult(lagGramInverse, xy, coefficients);
            DMatrixRMaj residuals = lead.copy();
            CommonOps_DDRM.multAdd(-1.0, lagged, coefficients, residuals);
            DMatrixRMaj iMinusA = CommonOps_DDRM.identity(cols);
            DMatrixRMaj a = CommonOps_DDRM.transpose(coefficients, null);
            CommonOps_DDRM.subtractEquals(iMinusA, a);
            recolour = new DMatrixRMaj(cols, cols);
            if (!CommonOps_DDRM.invert(iMinusA, recolour)) {
                throw new IllegalArgumentException("VAR(1) prewhitening refused: I - A is singular");
            }
            series = residuals.data;
            seriesRows = n;
        }
        this.weights = kernelWeights(options.kernel(), bandwidth, seriesRows - 1);
        this.weighted = applyKernel(series, seriesRows);
    }

    /** S (or S_e with prewhitening) at the fixed bandwidth, T K² multiply-adds, formed once. */
    private DMatrixRMaj inner() {
        if (innerCovariance == null) {
            innerCovariance = symmetric(cross(series, weighted, seriesRows));
        }
        return innerCovariance;
    }

    /**
     * The estimator at the moments F (T x K, rows f_t') with the kernel, centering and prewhitening of
     * {@code options} and the bandwidth b held at {@code bandwidth} (0 for the heteroskedasticity-consistent
     * S; the bandwidth rule of the options is not used).
     *
     * @throws IllegalArgumentException for T &lt; 2, non-finite values, a negative bandwidth, or prewhitening
     *                                  whose lagged series or I - A is singular
     */
    public static LongRunDerivative at(DMatrixRMaj moments, LongRunOptions options, double bandwidth) {
        Objects.requireNonNull(options, "options");
        return new LongRunDerivative(moments, options, bandwidth);
    }

    /** S at the fixed bandwidth, K x K (equal to {@link LongRunCovariance#estimate} with that bandwidth). */
    public DMatrixRMaj covariance() {
        return recolour == null ? inner().copy() : sandwich(recolour, inner());
    }

    /**
     * V_{qu} = (1/T) Σ_t Σ_s k((t-s)/b) q_t u_s' (K_q x K; rows from q, columns from u), recoloured by
     * (I - A)^{-1} on both sides after filtering q by the moments' VAR(1) when prewhitening.
     *
     * @param other q, T x K_q, centered here when the options center
     */
    public DMatrixRMaj crossCovariance(DMatrixRMaj other) {
        double[] q = demeanedOther(other);
        int width = other.numCols;
        if (recolour == null) {
            return crossOf(q, width, weighted, rows);
        }
        if (width != cols) {
            throw new IllegalArgumentException("with prewhitening the other series must have the K = " + cols
                    + " columns of the moments, got " + width);
        }
        DMatrixRMaj filtered = filtered(q);
        DMatrixRMaj inner = crossOf(filtered.data, cols, weighted, seriesRows);
        DMatrixRMaj tmp = new DMatrixRMaj(cols, cols);
        DMatrixRMaj out = new DMatrixRMaj(cols, cols);
        CommonOps_DDRM.mult(recolour, inner, tmp);
        CommonOps_DDRM.multTransB(tmp, recolour, out);
        return out;
    }

    /**
     * ∂S/∂θ_j at the fixed bandwidth, from the per-observation derivatives ∂f_t/∂θ_j (T x K), by the
     * formulas of the class comment. A new symmetric K x K matrix.
     */
    public DMatrixRMaj derivative(DMatrixRMaj momentDerivative) {
        if (momentDerivative.numRows != rows || momentDerivative.numCols != cols) {
            throw new IllegalArgumentException("the derivative series must be " + rows + " x " + cols + ", got "
                    + momentDerivative.numRows + " x " + momentDerivative.numCols);
        }
        double[] du = demeanedOther(momentDerivative);
        if (recolour == null) {
            DMatrixRMaj m = crossOf(du, cols, weighted, rows);
            return symmetricSum(m);
        }
        int n = seriesRows;
        DMatrixRMaj[] pair = laggedPair(du, n);
        DMatrixRMaj dx = pair[0];
        DMatrixRMaj dy = pair[1];
        DMatrixRMaj inner = new DMatrixRMaj(cols, cols);
        CommonOps_DDRM.multTransA(dx, lead, inner);
        CommonOps_DDRM.multAddTransA(lagged, dy, inner);
        DMatrixRMaj gramDot = new DMatrixRMaj(cols, cols);
        CommonOps_DDRM.multTransA(dx, lagged, gramDot);
        CommonOps_DDRM.multAddTransA(lagged, dx, gramDot);
        CommonOps_DDRM.multAdd(-1.0, gramDot, coefficients, inner);
        DMatrixRMaj dB = new DMatrixRMaj(cols, cols);
        CommonOps_DDRM.mult(lagGramInverse, inner, dB);
        DMatrixRMaj de = dy.copy();
        CommonOps_DDRM.multAdd(-1.0, dx, coefficients, de);
        CommonOps_DDRM.multAdd(-1.0, lagged, dB, de);
        DMatrixRMaj dInner = symmetricSum(crossOf(de.data, cols, weighted, n));
        // Q̇ = Q Ȧ Q with Ȧ = Ḃ'
        DMatrixRMaj tmp = new DMatrixRMaj(cols, cols);
        DMatrixRMaj dQ = new DMatrixRMaj(cols, cols);
        CommonOps_DDRM.multTransB(recolour, dB, tmp);
        CommonOps_DDRM.mult(tmp, recolour, dQ);
        DMatrixRMaj half = new DMatrixRMaj(cols, cols);
        CommonOps_DDRM.mult(dQ, inner(), tmp);
        CommonOps_DDRM.multTransB(tmp, recolour, half);
        DMatrixRMaj out = sandwich(recolour, dInner);
        for (int p = 0; p < cols; p++) {
            for (int q = 0; q < cols; q++) {
                out.data[p * cols + q] += half.data[p * cols + q] + half.data[q * cols + p];
            }
        }
        return out;
    }

    /**
     * (∂S/∂θ_j) x for a K-vector x, without forming the K x K derivative when there is no prewhitening:
     * with M = u̇'V/T (V = W u), ∂S/∂θ_j = M + M', so the product is u̇'(V x)/T + V'(u̇ x)/T, two passes of
     * T K multiply-adds instead of the T K² of {@link #derivative}. With prewhitening the derivative is
     * formed and multiplied (the chain rule through the VAR(1) fit needs K x K products anyway).
     *
     * @param momentDerivative ∂f_t/∂θ_j, T x K
     * @param x                K values
     * @return a new array of K values
     */
    public double[] derivativeTimes(DMatrixRMaj momentDerivative, double[] x) {
        if (momentDerivative.numRows != rows || momentDerivative.numCols != cols) {
            throw new IllegalArgumentException("the derivative series must be " + rows + " x " + cols + ", got "
                    + momentDerivative.numRows + " x " + momentDerivative.numCols);
        }
        return derivativeTimes(momentDerivative.data, 1, 0, x);
    }

    /**
     * As {@link #derivativeTimes(DMatrixRMaj, double[])} for parameter j of the T x (K·P) row Jacobians of
     * {@link org.orthogon.moments.MomentModel#rowJacobians} (row t the K x P Jacobian of f_t), read in place.
     */
    public double[] derivativeTimes(DMatrixRMaj rowJacobians, int parameters, int j, double[] x) {
        if (rowJacobians.numRows != rows || rowJacobians.numCols != cols * parameters || j < 0 || j >= parameters) {
            throw new IllegalArgumentException("the row Jacobians must be " + rows + " x " + cols * parameters
                    + " with 0 <= j < " + parameters + ", got " + rowJacobians.numRows + " x " + rowJacobians.numCols
                    + " and j = " + j);
        }
        return derivativeTimes(rowJacobians.data, parameters, j, x);
    }

    /** The product for u̇_tc = data[(t K + c) stride + offset]. */
    private double[] derivativeTimes(double[] data, int stride, int offset, double[] x) {
        if (x.length != cols) {
            throw new IllegalArgumentException("x must have the K = " + cols + " values of the moments, got "
                    + x.length);
        }
        if (recolour != null) {
            DMatrixRMaj du = new DMatrixRMaj(rows, cols);
            for (int i = 0; i < rows * cols; i++) {
                du.data[i] = data[i * stride + offset];
            }
            DMatrixRMaj product = new DMatrixRMaj(cols, 1);
            CommonOps_DDRM.mult(derivative(du), DMatrixRMaj.wrap(cols, 1, x), product);
            return product.data;
        }
        // centering as in Autocovariances: the column means of u̇ come off every row
        double[] mean = new double[cols];
        if (centered) {
            for (int t = 0; t < rows; t++) {
                for (int c = 0; c < cols; c++) {
                    mean[c] += data[(t * cols + c) * stride + offset];
                }
            }
            for (int c = 0; c < cols; c++) {
                mean[c] /= rows;
            }
        }
        double[] out = new double[cols];
        double[] du = new double[cols];
        for (int t = 0; t < rows; t++) {
            int row = t * cols;
            double vx = 0.0;
            double dx = 0.0;
            for (int c = 0; c < cols; c++) {
                du[c] = data[(row + c) * stride + offset] - mean[c];
                vx += weighted[row + c] * x[c];
                dx += du[c] * x[c];
            }
            for (int c = 0; c < cols; c++) {
                out[c] += du[c] * vx + weighted[row + c] * dx;
            }
        }
        for (int c = 0; c < cols; c++) {
            out[c] /= divisor;
        }
        return out;
    }

    /** Number of observations T. */
    public int observations() {
        return rows;
    }

    private DMatrixRMaj filtered(double[] q) {
        DMatrixRMaj[] pair = laggedPair(q, seriesRows);
        DMatrixRMaj out = pair[1];
        CommonOps_DDRM.multAdd(-1.0, pair[0], coefficients, out);
        return out;
    }

    /** u_t, centered when the options center (the same centering as {@link Autocovariances#of}). */
    private double[] demeaned(DMatrixRMaj m) {
        return Autocovariances.of(m, centered).series(); // a fresh array, owned here
    }

    private double[] demeanedOther(DMatrixRMaj other) {
        if (other.numRows != rows) {
            throw new IllegalArgumentException("the other series has " + other.numRows + " rows, the moments " + rows);
        }
        return demeaned(other);
    }

    /** X = u_{1..n} and Y = u_{2..n+1} of a row-major series with n + 1 rows. */
    private DMatrixRMaj[] laggedPair(double[] u, int n) {
        DMatrixRMaj x = new DMatrixRMaj(n, cols);
        DMatrixRMaj y = new DMatrixRMaj(n, cols);
        System.arraycopy(u, 0, x.data, 0, n * cols);
        System.arraycopy(u, cols, y.data, 0, n * cols);
        return new DMatrixRMaj[] {x, y};
    }

    /** w_j = k(j/b) for j = 1..maxLag; all zero for b = 0 or the kernel "none". */
    private static double[] kernelWeights(Kernel kernel, double bandwidth, int maxLag) {
        double[] w = new double[Math.max(maxLag, 0)];
        if (kernel == Kernel.NONE || bandwidth == 0.0) {
            return w;
        }
        for (int j = 1; j <= maxLag; j++) {
            w[j - 1] = kernel.weight(j / bandwidth);
        }
        return w;
    }

    /** V = W u with W_ts = k((t-s)/b): V_t = u_t + Σ_j w_j (u_{t-j} + u_{t+j}). */
    private double[] applyKernel(double[] u, int n) {
        double[] v = java.util.Arrays.copyOf(u, n * cols);
        int size = n * cols;
        for (int j = 1; j < n; j++) {
            double w = weights[j - 1];
            if (w == 0.0) {
                continue;
            }
            int shift = j * cols;
            for (int i = 0; i < size - shift; i++) {
                v[shift + i] += w * u[i];
                v[i] += w * u[shift + i];
            }
        }
        return v;
    }

    /** q' v / T for row-major q (n x width) and v (n x K). */
    private DMatrixRMaj crossOf(double[] q, int width, double[] v, int n) {
        DMatrixRMaj out = new DMatrixRMaj(width, cols);
        CommonOps_DDRM.multTransA(DMatrixRMaj.wrap(n, width, q), DMatrixRMaj.wrap(n, cols, v), out);
        CommonOps_DDRM.divide(out, divisor);
        return out;
    }

    private DMatrixRMaj cross(double[] u, double[] v, int n) {
        return crossOf(u, cols, v, n);
    }

    private static DMatrixRMaj symmetric(DMatrixRMaj m) {
        int k = m.numRows;
        for (int p = 0; p < k; p++) {
            for (int q = p + 1; q < k; q++) {
                double mean = 0.5 * (m.data[p * k + q] + m.data[q * k + p]);
                m.data[p * k + q] = mean;
                m.data[q * k + p] = mean;
            }
        }
        return m;
    }

    private static DMatrixRMaj symmetricSum(DMatrixRMaj m) {
        int k = m.numRows;
        DMatrixRMaj out = new DMatrixRMaj(k, k);
        for (int p = 0; p < k; p++) {
            for (int q = 0; q < k; q++) {
                out.data[p * k + q] = m.data[p * k + q] + m.data[q * k + p];
            }
        }
        return out;
    }

    private static DMatrixRMaj sandwich(DMatrixRMaj outer, DMatrixRMaj inner) {
        int k = inner.numRows;
        DMatrixRMaj tmp = new DMatrixRMaj(k, k);
        DMatrixRMaj out = new DMatrixRMaj(k, k);
        CommonOps_DDRM.mult(outer, inner, tmp);
        CommonOps_DDRM.multTransB(tmp, outer, out);
        return symmetric(out);
    }
}
