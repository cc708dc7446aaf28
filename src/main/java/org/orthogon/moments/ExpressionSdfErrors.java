package org.orthogon.moments;

import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import net.objecthunter.exp4j.Expression;
import net.objecthunter.exp4j.ExpressionBuilder;
import net.objecthunter.exp4j.ValidationResult;
import net.objecthunter.exp4j.tokenizer.UnknownFunctionOrVariableException;

/**
 * Pricing errors of an SDF the user writes as a formula over data columns and parameters, e.g.
 * {@code "beta * cons_growth^(-gamma)"}: m_t(θ) is the formula evaluated with the data of observation
 * t, and e_{t,i} = m_t(θ) x_{t,i} - p with p = 1 for gross returns and p = 0 for excess returns
 * (the basic pricing equation E[m x] = p, Cochrane 2005, "Asset Pricing", revised edition, chapter 1).
 *
 * <p>The formula is parsed by exp4j into a token list that only evaluates arithmetic (+ - * / ^ %,
 * unary minus, parentheses) and exp4j's fixed set of mathematical functions (exp, log, sqrt, abs,
 * trigonometric and others) on doubles; nothing in it can call Java, a script engine or the file
 * system. Implicit multiplication ("2beta") is switched off so that a forgotten operator is an error,
 * not a silent product.
 *
 * <p>Derivatives are numerical: {@link CentralDifferences} of m_t with steps ε^{1/3} max(|θ_p|, 1); the
 * errors' derivatives follow as ∂m_t/∂θ_p · x_{t,i}.
 */
public final class ExpressionSdfErrors extends SdfErrors {

    /** A formula the family refuses, with the offending name and its place when there is one. */
    public static final class ExpressionException extends IllegalArgumentException {
        private static final long serialVersionUID = 1L;
        private final String name;
        private final int position;

        ExpressionException(String message, String name, int position) {
            super(message);
            this.name = name;
            this.position = position;
        }

        /** The unknown or misplaced name, or null when the problem is not about a name. */
        public String name() {
            return name;
        }

        /** The 1-based character position of {@link #name()} in the formula, or 0 if unknown. */
        public int position() {
            return position;
        }
    }

    /** Names exp4j reserves for constants; a variable of that name would be shadowed. */
    private static final Set<String> RESERVED = Set.of("e", "pi", "π", "φ");

    private final String formula;
    private final Expression template;
    private final List<String> dataNames;
    private final double[][] data; // [column][t], only the columns the formula uses

    /**
     * @param formula        the SDF, e.g. "beta * cons_growth^(-gamma)"
     * @param parameterNames the parameters θ, in order; each must occur in the formula
     * @param dataColumns    data series by name, each of length T; columns the formula does not use are
     *                       ignored
     * @param payoffs        T x N payoffs x_t (gross or excess returns)
     * @param assetNames     N names
     * @param kind           gross (p = 1) or excess (p = 0)
     * @throws ExpressionException for a formula that does not parse, names something that is neither a
     *                             data column nor a parameter (with the 1-based position), uses a name
     *                             both as a column and as a parameter, or leaves a parameter unused
     */
    public ExpressionSdfErrors(String formula, List<String> parameterNames, Map<String, double[]> dataColumns,
            double[][] payoffs, List<String> assetNames, Payoff kind) {
        super(parameterNames, assetNames, payoffs, kind, List.of());
        this.formula = formula;
        if (formula == null || formula.isBlank()) {
            throw new ExpressionException("the SDF expression is empty; write it over data columns and parameters,"
                    + " e.g. \"beta * cons_growth^(-gamma)\"", null, 0);
        }
        Set<String> names = new LinkedHashSet<>();
        for (String p : parameterNames()) {
            if (dataColumns.containsKey(p)) {
                throw new ExpressionException("\"" + p + "\" is both a parameter and a data column; rename the"
                        + " parameter so the SDF expression \"" + formula + "\" is unambiguous", p, 0);
            }
            names.add(p);
        }
        names.addAll(dataColumns.keySet());
        for (String name : names) {
            if (RESERVED.contains(name)) {
                throw new ExpressionException("\"" + name + "\" is a mathematical constant in SDF expressions and"
                        + " cannot name a parameter or a data column; rename it", name, 0);
            }
        }
        Expression parsed;
        try {
            parsed = new ExpressionBuilder(formula).implicitMultiplication(false).variables(names).build();
        } catch (UnknownFunctionOrVariableException e) {
            int position = e.getPosition() + 1;
            String token = e.getToken();
            int after = e.getPosition() + token.length();
            boolean called = formula.substring(Math.min(after, formula.length())).stripLeading().startsWith("(");
            String what = called
                    ? "it is not one of the functions (exp, log, log10, sqrt, abs, sin, cos and others); the"
                    + " natural logarithm is log"
                    : "it is neither a parameter (" + String.join(", ", parameterNames()) + ") nor a data column ("
                    + String.join(", ", dataColumns.keySet()) + ")";
            throw new ExpressionException("unknown " + (called ? "function" : "name") + " \"" + token
                    + "\" at character " + position + " of the SDF expression \"" + formula + "\": " + what,
                    token, position);
        } catch (IllegalArgumentException | java.util.EmptyStackException e) {
            // The formula library reports some malformed input (an operator with no operand) as an empty stack.
            throw new ExpressionException("the SDF expression \"" + formula + "\" cannot be read: "
                    + (e.getMessage() == null ? "an operator lacks an operand" : e.getMessage()), null, 0);
        }
        ValidationResult validation = parsed.validate(false);
        if (!validation.isValid()) {
            throw new ExpressionException("the SDF expression \"" + formula + "\" cannot be evaluated: "
                    + String.join("; ", validation.getErrors()), null, 0);
        }
        Set<String> used = parsed.getVariableNames();
        for (String p : parameterNames()) {
            if (!used.contains(p)) {
                throw new ExpressionException("the parameter \"" + p + "\" does not occur in the SDF expression \""
                        + formula + "\", so the data cannot identify it; remove it or use it in the expression", p, 0);
            }
        }
        Map<String, double[]> kept = new LinkedHashMap<>();
        for (Map.Entry<String, double[]> column : dataColumns.entrySet()) {
            if (used.contains(column.getKey())) {
                MomentAlgebra.requireRows(payoffs.length, column.getValue().length, "payoffs",
                        "data column " + column.getKey() + " values");
                kept.put(column.getKey(), column.getValue().clone());
            }
        }
        this.template = parsed;
        this.dataNames = List.copyOf(kept.keySet());
        this.data = kept.values().toArray(new double[0][]);
    }

    private ExpressionSdfErrors(ExpressionSdfErrors source, int[] rows) {
        super(source, rows);
        this.formula = source.formula;
        this.template = source.template;
        this.dataNames = source.dataNames;
        this.data = new double[source.data.length][];
        for (int j = 0; j < data.length; j++) {
            this.data[j] = pick(source.data[j], rows);
        }
    }

    @Override
    protected ExpressionSdfErrors onRows(int[] rows) {
        return new ExpressionSdfErrors(this, rows);
    }

    /** The formula as given. */
    public String formula() {
        return formula;
    }

    /** The data columns the formula uses, in the order they were given. */
    public List<String> dataColumnsUsed() {
        return dataNames;
    }

    /**
     * The SDF m_t(θ) at every observation.
     *
     * @throws IllegalArgumentException if θ has the wrong length
     */
    public double[] sdf(double[] theta) {
        if (theta.length != parameterNames().size()) {
            throw new IllegalArgumentException("θ has " + theta.length + " values, the expression has parameters "
                    + parameterNames());
        }
        // A private copy per call: exp4j expressions hold their variable values.
        Expression expression = new Expression(template);
        for (int p = 0; p < theta.length; p++) {
            expression.setVariable(parameterNames().get(p), theta[p]);
        }
        double[] m = new double[observations()];
        for (int t = 0; t < m.length; t++) {
            for (int j = 0; j < data.length; j++) {
                expression.setVariable(dataNames.get(j), data[j][t]);
            }
            m[t] = expression.evaluate();
        }
        return m;
    }



    @Override
    protected void sdf(double[] theta, double[] out) {
        double[] m = sdf(theta);
        System.arraycopy(m, 0, out, 0, m.length);
    }

    /** Central differences of m_t itself: e = m x - p is linear in m, so this is ∂e/∂θ divided by x. */
    @Override
    protected void sdfGradient(double[] theta, double[][] out) {
        CentralDifferences.derivatives(this::sdf, theta, observations(), out);
    }

    /** Always false: a formula is treated as non-linear even when it happens to be affine. */
    @Override
    public boolean isLinear() {
        return false;
    }
}
