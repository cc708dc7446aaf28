package org.orthogon.bootstrap;

import org.ejml.data.DMatrixRMaj;

/**
 * The automatic block length: the rule of Politis and White (2004, "Automatic block-length selection
 * for the dependent bootstrap", Econometric Reviews 23) with the correction of Patton, Politis and
 * White (2009, Econometric Reviews 28), applied to each moment column of the contributions f_t(θ̂).
 *
 * <p>For one series x_1..x_T with autocovariances R(k) (demeaned, divided by T) and autocorrelations
 * ρ(k):
 * <ol>
 *   <li>K_T = max(5, ⌈log10 T⌉), m_max = ⌈√T⌉ + K_T, critical value c √(log10 T / T) with c = 2;</li>
 *   <li>m̂ is the first lag m ≥ 1 from which K_T autocorrelations in a row, ρ(m)..ρ(m + K_T - 1), are all
 *       below the critical value; if there is none, the largest lag whose autocorrelation is above it (1 if
 *       none is); M = min(2 m̂, m_max);</li>
 *   <li>with the flat-top window λ(s) = 1 for |s| &lt; 1/2, 2(1 - |s|) for 1/2 ≤ |s| ≤ 1 (Politis and Romano
 *       1995), Ĝ = Σ_{|k|≤M} λ(k/M) |k| R(k) and ĝ = Σ_{|k|≤M} λ(k/M) R(k);</li>
 *   <li>the block length of the circular (and moving) block bootstrap, b = (2 Ĝ² / D̂)^{1/3} T^{1/3} with
 *       D̂ = (4/3) ĝ², capped at ⌈min(3√T, T/3)⌉.</li>
 * </ol>
 * Moving and circular blocks share the same optimal length (Politis and White 2004, section 3). The
 * run's block length is the mean of the columns' lengths rounded up to a whole number, at least 1;
 * columns without variation (a constant moment) are skipped. The rule minimises the mean squared error
 * of the bootstrap's variance of a mean; it is the standard data-driven choice, cheap, and its value is
 * checked against a script written from the published formulas
 * ({@code src/test/resources/reference/bootstrap/block_length.R}).
 */
public final class BlockLengthRule {
    /** The multiple c of √(log10 T / T) that marks an autocorrelation as negligible (Politis and White 2004). */
    static final double CRITICAL_MULTIPLE = 2.0;

    private BlockLengthRule() {
    }

    /** The run's block length for the T x K contributions: the columns' lengths averaged, rounded up. */
    public static int choose(DMatrixRMaj contributions) {
        int t = contributions.numRows;
        int k = contributions.numCols;
        double sum = 0.0;
        int counted = 0;
        double[] column = new double[t];
        for (int c = 0; c < k; c++) {
            for (int r = 0; r < t; r++) {
                column[r] = contributions.data[r * k + c];
            }
            double length = circularBlockLength(column);
            if (Double.isFinite(length)) {
                sum += length;
                counted++;
            }
        }
        if (counted == 0) {
            return 1;
        }
        int length = (int) Math.ceil(sum / counted - 1e-12);
        return Math.max(1, Math.min(length, t / 2));
    }

    /**
     * The optimal circular-block (and moving-block) length of one series, not rounded, capped at
     * ⌈min(3√T, T/3)⌉; NaN for a series without variation.
     */
    public static double circularBlockLength(double[] x) {
        int n = x.length;
        int kn = Math.max(5, (int) Math.ceil(Math.log10(n)));
        int mMax = (int) Math.ceil(Math.sqrt(n)) + kn;
        double cap = Math.ceil(Math.min(3.0 * Math.sqrt(n), n / 3.0));
        int lags = Math.min(mMax, n - 1);
        double[] r = autocovariances(x, lags);
        if (!(r[0] > 0.0)) {
            return Double.NaN;
        }
        double critical = CRITICAL_MULTIPLE * Math.sqrt(Math.log10(n) / n);
        int mHat = -1;
        for (int m = 1; m + kn - 1 <= lags; m++) {
            boolean negligible = true;
            for (int j = m; j < m + kn; j++) {
                if (Math.abs(r[j] / r[0]) >= critical) {
                    negligible = false;
                    break;
                }
            }
            if (negligible) {
                mHat = m;
                break;
            }
        }
        if (mHat < 0) {
            mHat = 1;
            for (int j = 1; j <= lags; j++) {
                if (Math.abs(r[j] / r[0]) > critical) {
                    mHat = j;
                }
            }
        }
        int bigM = Math.min(2 * mHat, lags);
        double g = 0.0;
        double longRun = r[0];
        for (int k = 1; k <= bigM; k++) {
            double weight = flatTop((double) k / bigM);
            g += 2.0 * weight * k * r[k];
            longRun += 2.0 * weight * r[k];
        }
        double d = 4.0 / 3.0 * longRun * longRun;
        double length = Math.cbrt(2.0 * g * g / d) * Math.cbrt(n);
        return Math.min(length, cap);
    }

    /** The flat-top lag window of Politis and Romano (1995). */
    static double flatTop(double s) {
        double a = Math.abs(s);
        if (a < 0.5) {
            return 1.0;
        }
        return a <= 1.0 ? 2.0 * (1.0 - a) : 0.0;
    }

    /** R(0..lags): autocovariances of the demeaned series divided by n. */
    private static double[] autocovariances(double[] x, int lags) {
        int n = x.length;
        double mean = 0.0;
        for (double v : x) {
            mean += v;
        }
        mean /= n;
        double[] r = new double[lags + 1];
        for (int k = 0; k <= lags; k++) {
            double s = 0.0;
            for (int t = k; t < n; t++) {
                s += (x[t] - mean) * (x[t - k] - mean);
            }
            r[k] = s / n;
        }
        return r;
    }
}
