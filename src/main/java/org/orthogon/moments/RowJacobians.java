package org.orthogon.moments;

import org.ejml.data.DMatrixRMaj;

/**
 * Per-observation derivatives ∂f_t/∂θ' of any moment model: the model's own
 * {@link MomentModel#rowJacobians(double[])} when it has them (every family does), otherwise central
 * differences of its contributions with the steps of {@link CentralDifferences}.
 */
public final class RowJacobians {
    private RowJacobians() {
    }

    /** The T x (K·P) matrix of {@link MomentModel#rowJacobians(double[])}, row t the K x P Jacobian of f_t. */
    public static DMatrixRMaj of(MomentModel model, double[] theta) {
        try {
            return model.rowJacobians(theta);
        } catch (UnsupportedOperationException e) {
            return numerical(model, theta);
        }
    }

    /** Central differences of the contributions, laid out as {@link MomentModel#rowJacobians(double[])}. */
    static DMatrixRMaj numerical(MomentModel model, double[] theta) {
        int t = model.observations();
        int k = model.momentCount();
        int p = theta.length;
        double[][] columns = new double[p][t * k];
        CentralDifferences.derivatives((point, out) -> {
            DMatrixRMaj f = model.contributions(point);
            System.arraycopy(f.data, 0, out, 0, t * k);
        }, theta, t * k, columns);
        DMatrixRMaj out = new DMatrixRMaj(t, k * p);
        for (int j = 0; j < p; j++) {
            for (int i = 0; i < t * k; i++) {
                out.data[i * p + j] = columns[j][i];
            }
        }
        return out;
    }

    /** The T x K series ∂f_t/∂θ_j of one parameter, cut from the row Jacobians of K moments and P parameters. */
    public static DMatrixRMaj parameter(DMatrixRMaj rowJacobians, int moments, int parameters, int j) {
        int t = rowJacobians.numRows;
        DMatrixRMaj out = new DMatrixRMaj(t, moments);
        for (int r = 0; r < t; r++) {
            int at = r * moments * parameters + j;
            for (int k = 0; k < moments; k++) {
                out.data[r * moments + k] = rowJacobians.data[at + k * parameters];
            }
        }
        return out;
    }
}
