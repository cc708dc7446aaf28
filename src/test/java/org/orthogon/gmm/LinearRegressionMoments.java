package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.moments.MomentModel;

/**
 * Instrumental-variable regression moments f_t(θ) = z_t (y_t - x_t'θ); with z_t = x_t, GMM is OLS
 * (Hansen 1982, section 5; common practice). Payoffs are taken to be z_t, so that the "second-moment"
 * weight is (Z'Z/T)^{-1} and one-step GMM with it is two-stage least squares.
 */
final class LinearRegressionMoments implements MomentModel {
    private final double[] y;
    private final double[][] x; // [t][p]
    private final double[][] z; // [t][k]
    private final List<String> parameterNames;
    private final List<String> momentNames;

    LinearRegressionMoments(double[] y, double[][] x, double[][] z, List<String> regressorNames) {
        this.y = y.clone();
        this.x = x;
        this.z = z;
        this.parameterNames = List.copyOf(regressorNames);
        List<String> names = new ArrayList<>();
        for (int k = 0; k < z[0].length; k++) {
            names.add("z" + (k + 1));
        }
        this.momentNames = List.copyOf(names);
    }

    /** OLS: instruments equal to the regressors. */
    static LinearRegressionMoments ols(double[] y, double[][] x, List<String> regressorNames) {
        List<String> moments = new ArrayList<>();
        for (String name : regressorNames) {
            moments.add("x_" + name);
        }
        LinearRegressionMoments m = new LinearRegressionMoments(y, x, x, regressorNames);
        return m;
    }

    @Override
    public List<String> parameterNames() {
        return parameterNames;
    }

    @Override
    public List<String> momentNames() {
        return momentNames;
    }

    @Override
    public int observations() {
        return y.length;
    }

    @Override
    public DMatrixRMaj contributions(double[] theta) {
        int k = momentNames.size();
        DMatrixRMaj f = new DMatrixRMaj(y.length, k);
        for (int t = 0; t < y.length; t++) {
            double e = y[t];
            for (int p = 0; p < theta.length; p++) {
                e -= x[t][p] * theta[p];
            }
            for (int j = 0; j < k; j++) {
                f.data[t * k + j] = z[t][j] * e;
            }
        }
        return f;
    }

    @Override
    public DMatrixRMaj meanJacobian(double[] theta) {
        int k = momentNames.size();
        int p = parameterNames.size();
        DMatrixRMaj d = new DMatrixRMaj(k, p);
        for (int t = 0; t < y.length; t++) {
            for (int j = 0; j < k; j++) {
                for (int q = 0; q < p; q++) {
                    d.data[j * p + q] -= z[t][j] * x[t][q];
                }
            }
        }
        for (int i = 0; i < d.data.length; i++) {
            d.data[i] /= y.length;
        }
        return d;
    }

    @Override
    public boolean isLinear() {
        return true;
    }

    @Override
    public DMatrixRMaj payoffs() {
        int k = momentNames.size();
        DMatrixRMaj out = new DMatrixRMaj(y.length, k);
        for (int t = 0; t < y.length; t++) {
            System.arraycopy(z[t], 0, out.data, t * k, k);
        }
        return out;
    }
}
