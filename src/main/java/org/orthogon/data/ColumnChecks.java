package org.orthogon.data;

import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.EigenDecomposition_F64;
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
     * a portfolio of other test assets is caught), naming the first such column: the first j whose
     * columns 1..j have a smallest singular value below 1e-10 of the largest. Appending a column never
     * raises the smallest singular value nor lowers the largest (the singular values interlace, Golub
     * and Van Loan 2013, "Matrix Computations", section 8.6.1), so that ratio only falls as columns are
     * added: one decomposition of all the columns clears a valid table, and bisection finds the first
     * offending column of an invalid one in log2(N) more.
     */
    public static void requireIndependent(SeriesTable table, String role) {
        double[][] columns = table.columns();
        int count = columns.length;
        int rows = table.rows();
        if (count < 2 || rows > count && clearlyIndependent(columns, rows) || !dependent(columns, rows, count - 1)) {
            return;
        }
        int clean = 0; // columns 0..clean are independent (one column always is, if it varies)
        int bad = count - 1; // columns 0..bad are not
        while (bad - clean > 1) {
            int middle = (clean + bad) >>> 1;
            if (dependent(columns, rows, middle)) {
                bad = middle;
            } else {
                clean = middle;
            }
        }
        throw InputException.in(table.source()).line(1).column(bad + 2, table.columnNames().get(bad))
                .problem("the " + role + " column \"" + table.columnNames().get(bad) + "\" is (up to rounding) a "
                        + "linear combination of the columns before it, so the long-run covariance S would be "
                        + "singular", "drop this column or one of the columns it combines");
    }

    /**
     * A quick pass that settles the usual case: the eigenvalues of X'X are the squared singular values of
     * X, so sqrt(λ_min/λ_max) is the ratio the check compares. They are only accurate to about K times
     * the rounding unit of λ_max, which cannot resolve the 1e-10 threshold itself, but a ratio above 1e-6
     * (λ_min/λ_max above 1e-12, a hundred times that error) certainly clears it. Anything less goes to the
     * singular value decomposition.
     */
    private static boolean clearlyIndependent(double[][] columns, int rows) {
        int count = columns.length;
        DMatrixRMaj x = new DMatrixRMaj(rows, count);
        for (int t = 0; t < rows; t++) {
            for (int c = 0; c < count; c++) {
                x.unsafe_set(t, c, columns[c][t]);
            }
        }
        DMatrixRMaj gram = new DMatrixRMaj(count, count);
        CommonOps_DDRM.multInner(x, gram);
        EigenDecomposition_F64<DMatrixRMaj> eig = DecompositionFactory_DDRM.eig(count, false, true);
        if (!eig.decompose(gram)) {
            return false;
        }
        double max = 0.0;
        double min = Double.POSITIVE_INFINITY;
        for (int i = 0; i < count; i++) {
            double value = eig.getEigenvalue(i).real;
            max = Math.max(max, value);
            min = Math.min(min, value);
        }
        return max > 0.0 && min / max > 1e-12;
    }

    /** Whether columns 0..last are linearly dependent (or outnumber the rows). */
    private static boolean dependent(double[][] columns, int rows, int last) {
        if (rows <= last) {
            return true;
        }
        DMatrixRMaj x = new DMatrixRMaj(rows, last + 1);
        for (int t = 0; t < rows; t++) {
            for (int c = 0; c <= last; c++) {
                x.unsafe_set(t, c, columns[c][t]);
            }
        }
        return reciprocalCondition(x) < DEPENDENT_RCOND;
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
