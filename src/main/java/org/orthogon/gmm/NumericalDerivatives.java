package org.orthogon.gmm;

import java.util.function.Function;
import java.util.function.ToDoubleFunction;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.moments.MomentModel;

/**
 * Central-difference derivatives with steps scaled to each argument. For f with three continuous
 * derivatives the central difference [f(x + h e_j) - f(x - h e_j)] / 2h has truncation error O(h²) and
 * rounding error O(ε/h); h_j = ε^{1/3} max(|x_j|, 1) balances the two (Press et al. 2007, "Numerical
 * Recipes", 3rd ed., section 5.7), giving about two thirds of the double-precision digits.
 */
public final class NumericalDerivatives {
    /** ε^{1/3} for double precision. */
    public static final double CUBE_ROOT_EPSILON = Math.cbrt(Math.ulp(1.0));

    private NumericalDerivatives() {
    }

    /** The step h_j = ε^{1/3} max(|x_j|, 1), rounded so that x_j ± h_j is exactly representable. */
    public static double step(double x) {
        double h = CUBE_ROOT_EPSILON * Math.max(Math.abs(x), 1.0);
        double up = x + h;
        return up - x;
    }

    /**
     * The m x n Jacobian ∂f_i/∂x_j of f: R^n → R^m by central differences with {@link #step(double)}.
     */
    public static DMatrixRMaj jacobian(Function<double[], double[]> f, double[] x) {
        int n = x.length;
        DMatrixRMaj out = null;
        double[] point = x.clone();
        for (int j = 0; j < n; j++) {
            double h = step(x[j]);
            point[j] = x[j] + h;
            double[] up = f.apply(point.clone());
            point[j] = x[j] - h;
            double[] down = f.apply(point.clone());
            point[j] = x[j];
            if (out == null) {
                out = new DMatrixRMaj(up.length, n);
            }
            for (int i = 0; i < up.length; i++) {
                out.unsafe_set(i, j, (up[i] - down[i]) / (2.0 * h));
            }
        }
        return out == null ? new DMatrixRMaj(f.apply(x.clone()).length, 0) : out;
    }

    /**
     * The K x P Jacobian D = ∂g_T/∂θ' of a moment model by central differences, for models without an
     * analytic one (user-written SDF expressions) and to check analytic ones.
     */
    public static DMatrixRMaj meanJacobian(MomentModel model, double[] theta) {
        return jacobian(t -> model.meanMoments(t).data, theta);
    }

    /**
     * Gradient and Hessian of a scalar f by central differences with steps h_j = relativeStep scale_j:
     * ∂f/∂x_j ≈ [f(x + h_j e_j) - f(x - h_j e_j)] / 2h_j and
     * ∂²f/∂x_j∂x_k ≈ [f(++) - f(+-) - f(-+) + f(--)] / 4 h_j h_k (Abramowitz and Stegun 1964, 25.3.26).
     */
    static void gradientAndHessian(ToDoubleFunction<double[]> f, double[] x, double[] scales, double relativeStep,
            double[] gradient, DMatrixRMaj hessian) {
        int n = x.length;
        double[] h = new double[n];
        for (int j = 0; j < n; j++) {
            h[j] = (x[j] + relativeStep * scales[j]) - x[j];
        }
        double center = f.applyAsDouble(x);
        double[] point = x.clone();
        for (int j = 0; j < n; j++) {
            point[j] = x[j] + h[j];
            double up = f.applyAsDouble(point);
            point[j] = x[j] - h[j];
            double down = f.applyAsDouble(point);
            point[j] = x[j];
            gradient[j] = (up - down) / (2.0 * h[j]);
            hessian.unsafe_set(j, j, (up - 2.0 * center + down) / (h[j] * h[j]));
        }
        for (int j = 0; j < n; j++) {
            for (int k = j + 1; k < n; k++) {
                double sum = 0.0;
                for (int corner = 0; corner < 4; corner++) {
                    double sj = (corner & 1) == 0 ? 1.0 : -1.0;
                    double sk = (corner & 2) == 0 ? 1.0 : -1.0;
                    point[j] = x[j] + sj * h[j];
                    point[k] = x[k] + sk * h[k];
                    sum += sj * sk * f.applyAsDouble(point);
                }
                point[j] = x[j];
                point[k] = x[k];
                double value = sum / (4.0 * h[j] * h[k]);
                hessian.unsafe_set(j, k, value);
                hessian.unsafe_set(k, j, value);
            }
        }
    }
}
