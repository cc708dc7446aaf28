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
        double[] sums = means.data;
        double[] row = new double[cols];
        for (int t = 0; t < rows; t++) {
            // a row copied out first: the add below then runs over two arrays at the same index, which
            // the JIT vectorises; the order of the sums is unchanged
            System.arraycopy(data, t * cols, row, 0, cols);
            addTo(sums, row, cols);
        }
        for (int k = 0; k < cols; k++) {
            sums[k] /= rows;
        }
        return means;
    }

    private static void addTo(double[] sums, double[] row, int cols) {
        for (int k = 0; k < cols; k++) {
            sums[k] += row[k];
        }
    }

    /**
     * Private copies of T rows of {@code width} values each, refusing a ragged row; {@code what} names
     * the rows in the message ("return", "factor").
     */
    static double[][] copyRows(double[][] rows, int width, String what) {
        double[][] copy = new double[rows.length][];
        for (int t = 0; t < rows.length; t++) {
            if (rows[t].length != width) {
                throw new IllegalArgumentException(what + " row " + t + " has " + rows[t].length
                        + " values, expected " + width);
            }
            copy[t] = rows[t].clone();
        }
        return copy;
    }

    /** Refuses two inputs that should cover the same T observations but do not. */
    static void requireRows(int expected, int actual, String first, String second) {
        if (expected != actual) {
            throw new IllegalArgumentException(first + " have " + expected + " rows but " + second + " have " + actual);
        }
    }

    /** The two lists one after the other. */
    static java.util.List<String> concat(java.util.List<String> first, java.util.List<String> second) {
        java.util.List<String> all = new java.util.ArrayList<>(first);
        all.addAll(second);
        return java.util.List.copyOf(all);
    }

    /** The names prefixed, e.g. "b_" + factor. */
    static java.util.List<String> prefixed(String prefix, java.util.List<String> names) {
        java.util.List<String> out = new java.util.ArrayList<>(names.size());
        for (String name : names) {
            out.add(prefix + name);
        }
        return java.util.List.copyOf(out);
    }

    /** Writes T rows of equal width into {@code out} row-major, the layout of {@link ObservationErrors}. */
    static void flatten(double[][] rows, double[] out) {
        int offset = 0;
        for (double[] row : rows) {
            System.arraycopy(row, 0, out, offset, row.length);
            offset += row.length;
        }
    }
}
