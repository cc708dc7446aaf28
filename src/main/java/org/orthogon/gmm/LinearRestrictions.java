package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;

/**
 * Linear restrictions R θ = r on the parameters, q rows, and their Wald test.
 *
 * <p>Text syntax: restrictions separated by commas, each an equation between linear combinations of
 * parameter names and numbers, e.g. {@code "b_SIZE = 0, b_TIDE = 0"}, {@code "beta = 0.99"},
 * {@code "b_MKT - b_SIZE = 0"}, {@code "2*b_MKT + 0.5 b_SIZE = 1 + b_TIDE"}. A coefficient is a number
 * before a name, with or without "*"; a name may repeat (its coefficients add up). Names are letters,
 * digits, '_' and '.', not starting with a digit.
 *
 * @param matrix R, q x P
 * @param values r, length q
 * @param text   the restrictions as written
 */
public record LinearRestrictions(DMatrixRMaj matrix, double[] values, String text) {

    public LinearRestrictions {
        matrix = matrix.copy();
        values = values.clone();
        if (matrix.numRows != values.length) {
            throw new IllegalArgumentException("R has " + matrix.numRows + " rows but r has " + values.length);
        }
    }

    @Override
    public DMatrixRMaj matrix() {
        return matrix.copy();
    }

    @Override
    public double[] values() {
        return values.clone();
    }

    /**
     * Parses restrictions on the named parameters.
     *
     * @throws IllegalArgumentException with the 1-based position for a syntax error, an unknown name (with
     *                                  the known ones), a restriction without a parameter, or restrictions
     *                                  that are linearly dependent
     */
    public static LinearRestrictions parse(String text, List<String> parameterNames) {
        Parser parser = new Parser(text, parameterNames);
        List<double[]> rows = new ArrayList<>();
        List<Double> rhs = new ArrayList<>();
        do {
            int start = parser.skipSpaces();
            double[] coefficients = new double[parameterNames.size()];
            double constant = parser.combination(coefficients, 1.0);
            parser.expect('=');
            constant += parser.combination(coefficients, -1.0);
            if (Arrays.stream(coefficients).allMatch(c -> c == 0.0)) {
                throw new IllegalArgumentException("restriction at position " + (start + 1) + " of \"" + text
                        + "\" involves no parameter");
            }
            rows.add(coefficients);
            rhs.add(constant == 0.0 ? 0.0 : -constant);
        } while (parser.accept(','));
        parser.end();
        DMatrixRMaj r = new DMatrixRMaj(rows.size(), parameterNames.size());
        for (int i = 0; i < rows.size(); i++) {
            for (int j = 0; j < parameterNames.size(); j++) {
                r.unsafe_set(i, j, rows.get(i)[j]);
            }
        }
        DMatrixRMaj rrt = new DMatrixRMaj(rows.size(), rows.size());
        CommonOps_DDRM.multTransB(r, r, rrt);
        if (!(Matrices.scaledReciprocalCondition(rrt) > 1e-12)) {
            throw new IllegalArgumentException("the restrictions \"" + text + "\" are linearly dependent: "
                    + "one of them follows from the others; drop it");
        }
        return new LinearRestrictions(r, rhs.stream().mapToDouble(Double::doubleValue).toArray(), text);
    }

    /** The number of restrictions q. */
    public int count() {
        return values.length;
    }

    /**
     * The Wald statistic W = (R θ̂ - r)' (R V R')^{-1} (R θ̂ - r), asymptotically χ²_q under R θ = r, V the
     * covariance of θ̂ (Newey and West 1987, "Hypothesis testing with efficient method of moments
     * estimation", International Economic Review 28).
     */
    public ChiSquareTest waldTest(double[] theta, DMatrixRMaj covariance) {
        if (theta.length != matrix.numCols) {
            throw new IllegalArgumentException("θ has " + theta.length + " values but the restrictions " + matrix.numCols);
        }
        int q = values.length;
        DMatrixRMaj distance = new DMatrixRMaj(q, 1);
        CommonOps_DDRM.mult(matrix, DMatrixRMaj.wrap(theta.length, 1, theta.clone()), distance);
        for (int i = 0; i < q; i++) {
            distance.data[i] -= values[i];
        }
        DMatrixRMaj rt = new DMatrixRMaj(matrix.numCols, q);
        CommonOps_DDRM.transpose(matrix, rt);
        DMatrixRMaj middle = Matrices.invertSymmetric(Matrices.quadraticForm(rt, covariance), "R V R'");
        return ChiSquareTest.of("wald", Matrices.quadraticValue(distance, middle), q);
    }

    /** Recursive-descent reader of the syntax in the class comment. */
    private static final class Parser {
        private final String text;
        private final List<String> names;
        private int position;

        Parser(String text, List<String> names) {
            this.text = text;
            this.names = names;
        }

        int skipSpaces() {
            while (position < text.length() && Character.isWhitespace(text.charAt(position))) {
                position++;
            }
            return position;
        }

        boolean accept(char c) {
            skipSpaces();
            if (position < text.length() && text.charAt(position) == c) {
                position++;
                return true;
            }
            return false;
        }

        void expect(char c) {
            if (!accept(c)) {
                throw error("expected '" + c + "'");
            }
        }

        void end() {
            skipSpaces();
            if (position < text.length()) {
                throw error("expected ',' or the end");
            }
        }

        /** Adds sign * (the combination's coefficients) into coefficients and returns sign * its constant. */
        double combination(double[] coefficients, double sign) {
            double constant = 0.0;
            boolean first = true;
            while (true) {
                double termSign = 1.0;
                if (accept('-')) {
                    termSign = -1.0;
                } else if (!accept('+') && !first) {
                    return constant;
                }
                first = false;
                skipSpaces();
                double number = Double.NaN;
                if (position < text.length() && (Character.isDigit(text.charAt(position)) || text.charAt(position) == '.')) {
                    number = number();
                    accept('*');
                }
                skipSpaces();
                if (position < text.length() && isNameStart(text.charAt(position))) {
                    int at = position;
                    String name = name();
                    int index = names.indexOf(name);
                    if (index < 0) {
                        position = at;
                        throw error("unknown parameter \"" + name + "\"; the parameters are " + names);
                    }
                    coefficients[index] += sign * termSign * (Double.isNaN(number) ? 1.0 : number);
                } else if (!Double.isNaN(number)) {
                    constant += sign * termSign * number;
                } else {
                    throw error("expected a number or a parameter name");
                }
            }
        }

        private double number() {
            int start = position;
            while (position < text.length() && (Character.isDigit(text.charAt(position)) || text.charAt(position) == '.')) {
                position++;
            }
            if (position < text.length() && (text.charAt(position) == 'e' || text.charAt(position) == 'E')) {
                int mark = position;
                position++;
                if (position < text.length() && (text.charAt(position) == '+' || text.charAt(position) == '-')) {
                    position++;
                }
                if (position < text.length() && Character.isDigit(text.charAt(position))) {
                    while (position < text.length() && Character.isDigit(text.charAt(position))) {
                        position++;
                    }
                } else {
                    position = mark;
                }
            }
            try {
                return Double.parseDouble(text.substring(start, position));
            } catch (NumberFormatException e) {
                position = start;
                throw error("malformed number \"" + text.substring(start, Math.min(text.length(), start + 12)) + "\"");
            }
        }

        private static boolean isNameStart(char c) {
            return Character.isLetter(c) || c == '_';
        }

        private String name() {
            int start = position;
            while (position < text.length() && (Character.isLetterOrDigit(text.charAt(position))
                    || text.charAt(position) == '_' || text.charAt(position) == '.')) {
                position++;
            }
            return text.substring(start, position);
        }

        private IllegalArgumentException error(String what) {
            return new IllegalArgumentException(what + " at position " + (position + 1) + " of \"" + text + "\"");
        }
    }
}
