package org.orthogon.analysis;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.moments.MomentModel;

/**
 * Windows [from, to) of a model linear in θ, cut from running sums. Such a model has
 * f_t(θ) = f_t(0) + J_t θ with J_t the K x P Jacobian of row t ({@link MomentModel#rowJacobians}), so
 * the window means g(0) and D are differences of running sums of f_t(0) and J_t, O(KP) per window
 * whatever its length, and g(θ) = g(0) + D θ: the closed-form estimate of every window needs no pass
 * over its rows. Only S, which is quadratic in the rows, is formed from the window's own rows
 * f_t(0) + J_t θ, in O(T_window K P). Every window of a sup-Wald or rolling run is therefore as cheap
 * as its long-run covariance.
 *
 * <p>Running sums lose only rounding relative to their total (|Σ f| ≤ T max |f|), which for moment
 * contributions is many orders of magnitude below their sampling error. Immutable after
 * construction and safe to share between threads.
 */
final class LinearWindows {
    private final MomentModel base;
    private final int rows;
    private final int k;
    private final int p;
    private final double[] intercepts; // T x K, f_t(0)
    private final double[] slopes; // T x K x P, J_t row-major
    private final double[] slopesByParameter; // T x P x K: row t holds J_t' row-major, for contiguous adds
    private final double[] interceptSums; // (T+1) x K
    private final double[] slopeSums; // (T+1) x K x P
    private DMatrixRMaj payoffs;

    private LinearWindows(MomentModel base) {
        this.base = base;
        this.rows = base.observations();
        this.k = base.momentCount();
        this.p = base.parameterCount();
        this.intercepts = base.contributions(new double[p]).data;
        this.slopes = base.rowJacobians(new double[p]).data;
        this.slopesByParameter = new double[slopes.length];
        for (int t = 0; t < rows; t++) {
            for (int i = 0; i < k; i++) {
                for (int a = 0; a < p; a++) {
                    slopesByParameter[(t * p + a) * k + i] = slopes[(t * k + i) * p + a];
                }
            }
        }
        this.interceptSums = runningSums(intercepts, rows, k);
        this.slopeSums = runningSums(slopes, rows, k * p);
    }

    /** Windows of {@code model} from running sums when it is linear and has per-row Jacobians; null otherwise. */
    static LinearWindows of(MomentModel model) {
        if (!model.isLinear()) {
            return null;
        }
        try {
            return new LinearWindows(model);
        } catch (UnsupportedOperationException e) {
            return null;
        }
    }

    /** The window [from, to) as a moment model. */
    MomentModel window(int from, int to) {
        if (from < 0 || to > rows || to - from < 1) {
            throw new IllegalArgumentException("window [" + from + ", " + to + ") is not inside the " + rows
                    + " observations");
        }
        return new Window(from, to);
    }

    private static double[] runningSums(double[] values, int rows, int width) {
        double[] sums = new double[(rows + 1) * width];
        for (int t = 0; t < rows; t++) {
            int in = t * width;
            int before = t * width;
            int after = before + width;
            for (int c = 0; c < width; c++) {
                sums[after + c] = sums[before + c] + values[in + c];
            }
        }
        return sums;
    }

    private static void addScaled(double[] target, int at, double[] source, int from, double scale, int length) {
        for (int i = 0; i < length; i++) {
            target[at + i] += scale * source[from + i];
        }
    }

    private synchronized DMatrixRMaj fullPayoffs() {
        if (payoffs == null) {
            payoffs = base.payoffs();
        }
        return payoffs;
    }

    /** One window; its means come from the running sums, its rows from f_t(0) and J_t. */
    private final class Window implements MomentModel {
        private final int from;
        private final int to;
        private final int count;
        private DMatrixRMaj jacobian;

        Window(int from, int to) {
            this.from = from;
            this.to = to;
            this.count = to - from;
        }

        @Override
        public List<String> parameterNames() {
            return base.parameterNames();
        }

        @Override
        public List<String> momentNames() {
            return base.momentNames();
        }

        @Override
        public int observations() {
            return count;
        }

        @Override
        public boolean isLinear() {
            return true;
        }

        @Override
        public int pricingMomentCount() {
            return base.pricingMomentCount();
        }

        @Override
        public DMatrixRMaj contributions(double[] theta) {
            DMatrixRMaj out = new DMatrixRMaj(count, k);
            contributions(theta, out);
            return out;
        }

        @Override
        public void contributions(double[] theta, DMatrixRMaj out) {
            checkLength(theta);
            out.reshape(count, k);
            double[] f = out.data;
            System.arraycopy(intercepts, from * k, f, 0, count * k);
            // f_t = f_t(0) + Σ_a θ_a J_t[:, a]: each term a contiguous add over the K moments of row t
            for (int t = 0; t < count; t++) {
                int at = t * k;
                int slope = (from + t) * p * k;
                for (int a = 0; a < p; a++) {
                    addScaled(f, at, slopesByParameter, slope + a * k, theta[a], k);
                }
            }
        }

        @Override
        public DMatrixRMaj meanMoments(double[] theta) {
            checkLength(theta);
            DMatrixRMaj g = new DMatrixRMaj(k, 1);
            DMatrixRMaj d = jacobian();
            for (int i = 0; i < k; i++) {
                double value = (interceptSums[to * k + i] - interceptSums[from * k + i]) / count;
                for (int a = 0; a < p; a++) {
                    value += d.data[i * p + a] * theta[a];
                }
                g.data[i] = value;
            }
            return g;
        }

        @Override
        public DMatrixRMaj meanJacobian(double[] theta) {
            checkLength(theta);
            return jacobian().copy();
        }

        /** D of the window, formed once (a window is used by one estimation, on one thread). */
        private DMatrixRMaj jacobian() {
            if (jacobian == null) {
                int width = k * p;
                DMatrixRMaj d = new DMatrixRMaj(k, p);
                for (int c = 0; c < width; c++) {
                    d.data[c] = (slopeSums[to * width + c] - slopeSums[from * width + c]) / count;
                }
                jacobian = d;
            }
            return jacobian;
        }

        @Override
        public DMatrixRMaj rowJacobians(double[] theta) {
            checkLength(theta);
            int width = k * p;
            DMatrixRMaj out = new DMatrixRMaj(count, width);
            System.arraycopy(slopes, from * width, out.data, 0, count * width);
            return out;
        }

        @Override
        public DMatrixRMaj payoffs() {
            DMatrixRMaj full = fullPayoffs();
            DMatrixRMaj out = new DMatrixRMaj(count, full.numCols);
            System.arraycopy(full.data, from * full.numCols, out.data, 0, count * full.numCols);
            return out;
        }

        @Override
        public double meanDiscountFactor(double[] theta) {
            return base.rows(from, to).meanDiscountFactor(theta);
        }

        @Override
        public double[] discountFactors(double[] theta) {
            return java.util.Arrays.copyOfRange(base.discountFactors(theta), from, to);
        }

        /** The window itself when the model takes the distance over itself, else the model's own choice cut. */
        @Override
        public java.util.Optional<MomentModel> distanceMoments() {
            return base.distanceMoments().flatMap(priced -> priced == base ? java.util.Optional.of(this)
                    : base.rows(from, to).distanceMoments());
        }

        @Override
        public MomentModel rows(int start, int end) {
            if (start < 0 || end > count || end - start < 1) {
                throw new IllegalArgumentException("window [" + start + ", " + end + ") is not inside the " + count
                        + " observations");
            }
            return new Window(from + start, from + end);
        }

        private void checkLength(double[] theta) {
            if (theta.length != p) {
                throw new IllegalArgumentException("θ has " + theta.length + " values, the model has parameters "
                        + base.parameterNames());
            }
        }
    }
}
