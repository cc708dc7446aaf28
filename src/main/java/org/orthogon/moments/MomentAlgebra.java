package org.orthogon.moments;

import org.ejml.data.DMatrixRMaj;

/** Small matrix helpers shared by the moment families; allocation-free inner loops over row-major data. */
public final class MomentAlgebra {
    private MomentAlgebra() {
    }

    /** The K x 1 vector of column means of a T x K matrix. */
    public static DMatrixRMaj columnMeans(DMatrixRMaj matrix) {
        int rows = matrix.numRows;
        int cols = matrix.numCols;
        DMatrixRMaj means = new DMatrixRMaj(cols, 1);
        double[] data = matrix.data;
        for (int t = 0; t < rows; t++) {
            int offset = t * cols;
            for (int k = 0; k < cols; k++) {
                means.data[k] += data[offset + k];
            }
        }
        for (int k = 0; k < cols; k++) {
            means.data[k] /= rows;
        }
        return means;
    }
}
