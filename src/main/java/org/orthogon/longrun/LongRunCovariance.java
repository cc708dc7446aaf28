package org.orthogon.longrun;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;

/**
 * Long-run covariance S of GMM moment contributions f_t (rows of a T x K matrix F), the
 * "S" of Hansen (1982): S = Γ_0 + Σ_{j≥1} k(j/b)(Γ_j + Γ_j'), Γ_j = (1/T) Σ_{t=j+1..T} u_t u_{t-j}',
 * u_t = f_t - mean f (centered, the default) or u_t = f_t. Kernels after Andrews (1991); Bartlett
 * with b = L + 1 is Newey and West (1987); optional VAR(1) prewhitening after Andrews and
 * Monahan (1992). Pure functions, no I/O.
 */
public final class LongRunCovariance {

    private LongRunCovariance() {}

    /**
     * Estimates S from the moment contributions.
     *
     * <p>With prewhitening, u_t = A u_{t-1} + e_t is fitted by OLS without intercept, the kernel
     * and the automatic bandwidth act on the T - 1 residuals (autocovariances still divided by T),
     * and S = (I - A)^{-1} S_e (I - A)^{-1}'.
     *
     * @param moments F, T x K, rows f_t'; T ≥ 2, all values finite
     * @param options kernel, bandwidth rule, centering and prewhitening
     * @return S with the bandwidth actually used and any warnings, among them a warning when a
     *     kernel without a PSD guarantee (truncated, as in Hansen-Hodrick 1980, or Tukey-Hanning)
     *     gave an S whose smallest eigenvalue is below -1e-12 trace(S)
     * @throws IllegalArgumentException for T &lt; 2, K &lt; 1, non-finite values in F, a negative lag
     *     count, a bandwidth rule the kernel cannot use, or prewhitening with I - A near singular
     */
    public static LongRunEstimate estimate(DMatrixRMaj moments, LongRunOptions options) {
        Objects.requireNonNull(options, "options");
        List<String> warnings = new ArrayList<>();
        if (!options.prewhiten()) {
            // nothing of this estimate outlives it, so its series lives in the thread's work arrays
            Autocovariances ac = Autocovariances.inWorkspace(moments, options.centered());
            double b = bandwidth(ac, options, moments.numRows, false, warnings);
            DMatrixRMaj s = ac.longRun(options.kernel(), b);
            checkPositiveSemidefinite(s, options.kernel(), warnings);
            return new LongRunEstimate(s, options.kernel(), b, options.centered(), false, warnings);
        }
        Autocovariances ac = Autocovariances.of(moments, options.centered());
        Prewhitening pw = Prewhitening.fit(ac.series(), ac.observations(), ac.columns());
        // The residuals' autocovariances still divide by the original T, as R's sandwich does (n.orig).
        Autocovariances residuals = Autocovariances.ofSeries(pw.residuals, pw.rows, ac.columns(),
                ac.observations(), ac.centered());
        double b = bandwidth(residuals, options, moments.numRows, true, warnings);
        DMatrixRMaj s = pw.recolour(residuals.longRun(options.kernel(), b));
        checkPositiveSemidefinite(s, options.kernel(), warnings);
        return new LongRunEstimate(s, options.kernel(), b, options.centered(), true, warnings);
    }

    /**
     * The estimate of {@link #estimate(DMatrixRMaj, LongRunOptions)} without prewhitening, from
     * autocovariances computed once, so trying several kernels or bandwidths on the same moments
     * reuses the Γ_j already formed.
     *
     * @param autocovariances Γ_j of the (centered or uncentered) moments
     * @param kernel the lag window
     * @param rule how the bandwidth is chosen
     * @throws IllegalArgumentException for a bandwidth rule the kernel cannot use
     */
    public static LongRunEstimate estimate(Autocovariances autocovariances, Kernel kernel, BandwidthRule rule) {
        Objects.requireNonNull(autocovariances, "autocovariances");
        LongRunOptions options = new LongRunOptions(kernel, rule, autocovariances.centered(), false);
        List<String> warnings = new ArrayList<>();
        double b = bandwidth(autocovariances, options, autocovariances.observations(), false, warnings);
        DMatrixRMaj s = autocovariances.longRun(kernel, b);
        checkPositiveSemidefinite(s, kernel, warnings);
        return new LongRunEstimate(s, kernel, b, autocovariances.centered(), false, warnings);
    }

    private static double bandwidth(Autocovariances ac, LongRunOptions options, int originalT,
            boolean prewhitened, List<String> warnings) {
        Kernel kernel = options.kernel();
        if (kernel == Kernel.NONE) {
            return 0.0;
        }
        BandwidthRule rule = options.bandwidth();
        double b;
        if (rule instanceof BandwidthRule.Fixed f) {
            b = f.bandwidth();
        } else if (rule instanceof BandwidthRule.Lags l) {
            b = kernel.bandwidthForLags(l.lags());
        } else if (rule instanceof BandwidthRule.Andrews) {
            b = Bandwidths.andrews(ac.series(), ac.observations(), ac.columns(), kernel, equalWeights(ac),
                    warnings);
        } else if (rule instanceof BandwidthRule.NeweyWest) {
            b = Bandwidths.neweyWest(ac.series(), ac.observations(), ac.columns(), kernel, equalWeights(ac),
                    originalT, prewhitened);
        } else {
            throw new AssertionError(rule);
        }
        if (kernel.isTruncated() && b * kernel.support() > ac.maxLag() + 1) {
            warnings.add("bandwidth " + b + " reaches beyond the " + ac.maxLag()
                    + " lags the sample has; all available lags were used");
        }
        return b;
    }

    /**
     * Tolerance of the PSD check relative to trace(S): rounding in a PSD estimate leaves
     * eigenvalues of order 1e-16 trace(S) below zero, which must not raise an alarm.
     */
    static final double PSD_TOLERANCE = 1e-12;

    /**
     * Warns when a kernel without a PSD guarantee gave an S with an eigenvalue below
     * -{@link #PSD_TOLERANCE} trace(S); such an S makes a J statistic or a variance negative.
     * Kernels with the guarantee are not checked, saving the K^3 eigendecomposition.
     */
    private static void checkPositiveSemidefinite(DMatrixRMaj s, Kernel kernel, List<String> warnings) {
        if (kernel.guaranteesPositiveSemidefinite()) {
            return;
        }
        double smallest = smallestEigenvalue(s);
        double trace = CommonOps_DDRM.trace(s);
        if (smallest < -PSD_TOLERANCE * Math.abs(trace)) {
            String what = kernel == Kernel.TRUNCATED
                    ? "the truncated-kernel (equal-weight, Hansen-Hodrick 1980) estimate"
                    : "the " + kernel.id() + " estimate";
            warnings.add(what + " of S is not positive semidefinite: smallest eigenvalue " + smallest
                    + " against trace " + trace + "; use the Bartlett kernel, which is always PSD");
        }
    }

    /** Smallest eigenvalue of the symmetric matrix s. */
    static double smallestEigenvalue(DMatrixRMaj s) {
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(s.numRows, false, true);
        if (!eig.decompose(s.copy())) {
            throw new IllegalStateException("eigendecomposition of the " + s.numRows + " x " + s.numRows
                    + " long-run covariance did not converge");
        }
        double smallest = Double.POSITIVE_INFINITY;
        for (int i = 0; i < s.numRows; i++) {
            smallest = Math.min(smallest, eig.getEigenvalue(i).getReal());
        }
        return smallest;
    }

    /**
     * Every moment column counts the same in the automatic bandwidth rules: unlike a regression's
     * intercept score, which sandwich down-weights, no moment column has a special role.
     */
    private static double[] equalWeights(Autocovariances ac) {
        double[] w = new double[ac.columns()];
        java.util.Arrays.fill(w, 1.0);
        return w;
    }

    /**
     * The second-moment matrix (1/T) Σ_t x_t x_t' of the rows of a T x K matrix, as the symmetric
     * rank-k product of {@link CrossProducts}: the uncentered Γ_0, and the G of the Hansen-Jagannathan
     * distance (Hansen and Jagannathan 1997). Returns a new symmetric K x K matrix.
     */
    public static DMatrixRMaj secondMoments(DMatrixRMaj x) {
        int k = x.numCols;
        DMatrixRMaj g = new DMatrixRMaj(k, k);
        CrossProducts.addUpper(x.data, x.data, x.numRows, k, g.data);
        CrossProducts.symmetricFromUpper(g.data, k, 1.0 / x.numRows);
        return g;
    }

    /**
     * The small-sample factor T/(T - P) applied to S (off by default; P the number of estimated
     * parameters). Returns a new matrix.
     *
     * @throws IllegalArgumentException unless 0 ≤ P &lt; T
     */
    public static DMatrixRMaj smallSampleAdjusted(DMatrixRMaj s, int observations, int parameters) {
        double f = smallSampleFactor(observations, parameters);
        DMatrixRMaj out = new DMatrixRMaj(s.numRows, s.numCols);
        CommonOps_DDRM.scale(f, s, out);
        return out;
    }

    /**
     * T/(T - P).
     *
     * @throws IllegalArgumentException unless 0 ≤ P &lt; T
     */
    public static double smallSampleFactor(int observations, int parameters) {
        if (parameters < 0 || parameters >= observations) {
            throw new IllegalArgumentException("small-sample factor T/(T-P) needs 0 <= P < T, got T="
                    + observations + ", P=" + parameters);
        }
        return observations / (double) (observations - parameters);
    }

    /** Rejects matrices no estimate can be formed from, naming the offending values. */
    static void validate(DMatrixRMaj f) {
        Objects.requireNonNull(f, "moments");
        if (f.numRows < 2) {
            throw new LongRunException("long-run covariance needs at least 2 observations (rows), got T="
                    + f.numRows);
        }
        if (f.numCols < 1) {
            throw new IllegalArgumentException("long-run covariance needs at least 1 moment column, got K="
                    + f.numCols);
        }
        for (int r = 0; r < f.numRows; r++) {
            for (int c = 0; c < f.numCols; c++) {
                double v = f.data[r * f.numCols + c];
                if (!Double.isFinite(v)) {
                    throw new LongRunException("moment matrix holds " + v + " at row " + r + ", column "
                            + c + " (0-based); all values must be finite");
                }
            }
        }
    }
}
