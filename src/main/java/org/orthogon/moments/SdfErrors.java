package org.orthogon.moments;

import java.util.List;

/**
 * The pricing errors of a stochastic discount factor, written once for every SDF family: with m_t(θ)
 * the family's SDF, x_{t,i} the payoff of asset i in period t and p_i its price,
 * <pre>
 *   e_{t,i}(θ) = m_t(θ) x_{t,i} - p_i,        ∂e_{t,i}/∂θ_p = ∂m_t/∂θ_p · x_{t,i},
 * </pre>
 * the basic pricing equation E[m x] = p (Cochrane 2005, "Asset Pricing", revised edition, chapter 1).
 * A family supplies m_t(θ), its gradient, and its data on a subset of rows; the errors, their
 * derivatives, the payoffs and the row selections are derived here. Prices are 1 for gross returns
 * and 0 for excess returns ({@link Payoff}).
 *
 * <p>A family may stack auxiliary moments after the pricing errors (the factor means of the demeaned
 * linear SDF); they are not of the form m x - p, so the family writes them itself through the
 * {@code auxiliary...} hooks, and {@link #pricedAssets()} counts only the pricing errors.
 *
 * <p>Rows are stored row-major, T x N, and a selection copies only the rows it keeps, so a window of
 * W rows costs O(W N) whatever the full sample's length.
 */
public abstract class SdfErrors implements ObservationErrors {
    private final List<String> parameterNames;
    private final List<String> pricedNames;
    private final List<String> assetNames;
    private final double[] payoffs; // T x N, row-major
    private final int observations;
    private final double price;

    /**
     * @param parameterNames θ's names, in order
     * @param pricedNames    the N priced assets, in column order
     * @param payoffs        T x N payoffs x_t (copied)
     * @param payoff         gross (p = 1) or excess (p = 0) payoffs
     * @param auxiliaryNames names of the auxiliary moments stacked after the N pricing errors (often none)
     */
    protected SdfErrors(List<String> parameterNames, List<String> pricedNames, double[][] payoffs, Payoff payoff,
            List<String> auxiliaryNames) {
        this(parameterNames, pricedNames, flat(MomentAlgebra.copyRows(payoffs, pricedNames.size(), "payoff")),
                payoffs.length, payoff.price(), auxiliaryNames);
    }

    /** For selections: the payoffs are already a private row-major copy. */
    private SdfErrors(List<String> parameterNames, List<String> pricedNames, double[] payoffs, int observations,
            double price, List<String> auxiliaryNames) {
        this.parameterNames = List.copyOf(parameterNames);
        this.pricedNames = List.copyOf(pricedNames);
        this.assetNames = MomentAlgebra.concat(pricedNames, auxiliaryNames);
        this.payoffs = payoffs;
        this.observations = observations;
        this.price = price;
    }

    /** The rows {@code rows} of {@code source}, in that order: the base state of a selection. */
    protected SdfErrors(SdfErrors source, int[] rows) {
        this(source.parameterNames, source.pricedNames, pickRows(source.payoffs, source.pricedNames.size(), rows),
                rows.length, source.price, source.assetNames.subList(source.pricedNames.size(),
                        source.assetNames.size()));
    }

    /** Fills {@code out} (length T) with m_t(θ). */
    protected abstract void sdf(double[] theta, double[] out);

    /** Fills {@code out[p]} (each length T) with ∂m_t/∂θ_p. */
    protected abstract void sdfGradient(double[] theta, double[][] out);

    /**
     * The same family on {@code rows} of this one, in the given order, repeats allowed; built with
     * {@link #SdfErrors(SdfErrors, int[])} and the family's own data picked by {@link #pick}.
     */
    protected abstract SdfErrors onRows(int[] rows);

    /** Fills {@code out} (T x A, row-major) with the auxiliary moments; none by default. */
    protected void auxiliaryErrors(double[] theta, double[] out) {
    }

    /** Fills {@code out[p]} (each T x A) with the auxiliary moments' derivatives; none by default. */
    protected void auxiliaryDerivatives(double[] theta, double[][] out) {
    }

    /** Fills {@code out} (T x A) with the payoffs reported for the auxiliary moments; none by default. */
    protected void auxiliaryPayoffs(double[] out) {
    }

    @Override
    public final List<String> parameterNames() {
        return parameterNames;
    }

    @Override
    public final List<String> assetNames() {
        return assetNames;
    }

    @Override
    public final int pricedAssets() {
        return pricedNames.size();
    }

    @Override
    public final int observations() {
        return observations;
    }

    @Override
    public final void discountFactor(double[] theta, double[] out) {
        sdf(theta, out);
    }

    @Override
    public final void errors(double[] theta, double[] out) {
        int n = pricedNames.size();
        int width = assetNames.size();
        double[] m = new double[observations];
        sdf(theta, m);
        for (int t = 0; t < observations; t++) {
            int in = t * n;
            int row = t * width;
            for (int i = 0; i < n; i++) {
                out[row + i] = m[t] * payoffs[in + i] - price;
            }
        }
        interleaveAuxiliary(out, width, n, a -> auxiliaryErrors(theta, a));
    }

    @Override
    public final void errorDerivatives(double[] theta, double[][] out) {
        int n = pricedNames.size();
        int width = assetNames.size();
        double[][] gradient = new double[parameterNames.size()][observations];
        sdfGradient(theta, gradient);
        for (int p = 0; p < gradient.length; p++) {
            double[] g = gradient[p];
            double[] column = out[p];
            for (int t = 0; t < observations; t++) {
                int in = t * n;
                int row = t * width;
                for (int i = 0; i < n; i++) {
                    column[row + i] = g[t] * payoffs[in + i];
                }
            }
        }
        int auxiliary = width - n;
        if (auxiliary > 0) {
            double[][] aux = new double[out.length][observations * auxiliary];
            auxiliaryDerivatives(theta, aux);
            for (int p = 0; p < out.length; p++) {
                scatter(aux[p], out[p], width, n);
            }
        }
    }

    @Override
    public final void payoffs(double[] out) {
        int n = pricedNames.size();
        int width = assetNames.size();
        for (int t = 0; t < observations; t++) {
            System.arraycopy(payoffs, t * n, out, t * width, n);
        }
        interleaveAuxiliary(out, width, n, this::auxiliaryPayoffs);
    }

    @Override
    public final SdfErrors select(int[] rows) {
        for (int row : rows) {
            if (row < 0 || row >= observations) {
                throw new IllegalArgumentException("row " + row + " is not one of the " + observations + " observations");
            }
        }
        if (rows.length < 1) {
            throw new IllegalArgumentException("a selection needs at least one row");
        }
        return onRows(rows.clone());
    }

    /** The price p of every pricing error: 1 for gross payoffs, 0 for excess ones. */
    protected final double price() {
        return price;
    }

    /** The payoff x_{t,i} (tests and subclasses that need the data they price). */
    protected final double payoff(int t, int i) {
        return payoffs[t * pricedNames.size() + i];
    }

    /** A copy of the priced payoffs x_t as rows, [t][i] (for a family that builds related errors from them). */
    protected final double[][] pricedPayoffRows() {
        int n = pricedNames.size();
        double[][] rows = new double[observations][];
        for (int t = 0; t < observations; t++) {
            rows[t] = java.util.Arrays.copyOfRange(payoffs, t * n, (t + 1) * n);
        }
        return rows;
    }

    /** The entries {@code rows} of a per-observation array. */
    protected static double[] pick(double[] values, int[] rows) {
        double[] out = new double[rows.length];
        for (int r = 0; r < rows.length; r++) {
            out[r] = values[rows[r]];
        }
        return out;
    }

    /** The rows {@code rows} of a [t][...] array (rows are shared, not copied: they are never written). */
    protected static double[][] pick(double[][] values, int[] rows) {
        double[][] out = new double[rows.length][];
        for (int r = 0; r < rows.length; r++) {
            out[r] = values[rows[r]];
        }
        return out;
    }

    private static double[] pickRows(double[] flat, int width, int[] rows) {
        double[] out = new double[rows.length * width];
        for (int r = 0; r < rows.length; r++) {
            System.arraycopy(flat, rows[r] * width, out, r * width, width);
        }
        return out;
    }

    private static double[] flat(double[][] rows) {
        int width = rows.length == 0 ? 0 : rows[0].length;
        double[] out = new double[rows.length * width];
        MomentAlgebra.flatten(rows, out);
        return out;
    }

    /** Lets a hook fill the T x A auxiliary block, then places it after the N pricing columns of each row. */
    private void interleaveAuxiliary(double[] out, int width, int n, java.util.function.Consumer<double[]> fill) {
        int auxiliary = width - n;
        if (auxiliary == 0) {
            return;
        }
        double[] block = new double[observations * auxiliary];
        fill.accept(block);
        scatter(block, out, width, n);
    }

    private void scatter(double[] block, double[] out, int width, int n) {
        int auxiliary = width - n;
        for (int t = 0; t < observations; t++) {
            System.arraycopy(block, t * auxiliary, out, t * width + n, auxiliary);
        }
    }
}
