package org.orthogon.data;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.SingularValueDecomposition_F64;

/**
 * Checks on the columns of a table that the moment conditions need: no column is constant, and no
 * column is an exact linear combination of the others. Either defect makes the long-run covariance S
 * or the Jacobian D singular, so GMM could not report standard errors; it is cheaper to name the
 * column here than to report a singular matrix later.
 */
public final class ColumnChecks {
    /** Columns whose values all lie within this of their first value are constant. */
    private static final double CONSTANT_TOLERANCE = 1e-14;
    /** Reciprocal condition number below which columns are treated as linearly dependent. */
    private static final double DEPENDENT_RCOND = 1e-10;

    private ColumnChecks() {
    }

    /** Refuses a column whose values are all the same, naming it and its value. */
    public static void requireVarying(SeriesTable table, String role) {
        double[][] columns = table.columns();
        for (int j = 0; j < columns.length; j++) {
            double first = columns[j][0];
            boolean constant = true;
            for (double value : columns[j]) {
                constant &= Math.abs(value - first) <= CONSTANT_TOLERANCE * Math.max(1.0, Math.abs(first));
            }
            if (constant && columns[j].length > 1) {
                throw InputException.in(table.source()).line(1).column(j + 2, table.columnNames().get(j))
                        .problem("the " + role + " column \"" + table.columnNames().get(j) + "\" is constant ("
                                + first + " in every row), so it carries no information and makes the estimate singular",
                                "drop the column, or check that the right file and column were named");
            }
        }
    }

    /**
     * Refuses columns that are exact linear combinations of earlier ones (in the uncentered sense, so
     * a portfolio of other test assets is caught), naming the first such column. Columns are added one
     * at a time and the smallest singular value of the columns so far is compared with the largest.
     */
    public static void requireIndependent(SeriesTable table, String role) {
        double[][] columns = table.columns();
        int rows = table.rows();
        for (int j = 1; j < columns.length; j++) {
            DMatrixRMaj x = new DMatrixRMaj(rows, j + 1);
            for (int t = 0; t < rows; t++) {
                for (int c = 0; c <= j; c++) {
                    x.unsafe_set(t, c, columns[c][t]);
                }
            }
            if (rows <= j || reciprocalCondition(x) < DEPENDENT_RCOND) {
                throw InputException.in(table.source()).line(1).column(j + 2, table.columnNames().get(j))
                        .problem("the " + role + " column \"" + table.columnNames().get(j) + "\" is (up to rounding) a "
                                + "linear combination of the columns before it, so the long-run covariance S would be "
                                + "singular", "drop this column or one of the columns it combines");
            }
        }
    }

    private static double reciprocalCondition(DMatrixRMaj x) {
        SingularValueDecomposition_F64<DMatrixRMaj> svd = DecompositionFactory_DDRM.svd(x.numRows, x.numCols, false,
                false, true);
        if (!svd.decompose(x)) {
            return 0.0;
        }
        double max = 0.0;
        double min = Double.POSITIVE_INFINITY;
        for (double value : svd.getSingularValues()) {
            max = Math.max(max, value);
            min = Math.min(min, value);
        }
        return max == 0.0 ? 0.0 : min / max;
    }
}
