package org.orthogon.moments;

import java.util.List;

/**
 * The errors of a family on a window of consecutive observations [from, to). Used for subsample
 * fits (known and unknown break dates, rolling windows), so every family gets them without knowing
 * about windows. The base family is evaluated on its full sample and the window's rows are copied
 * out: simpler than slicing each family's data, and the cost is linear in the full sample.
 */
final class RowWindow implements ObservationErrors {
    private final ObservationErrors base;
    private final int from;
    private final int to;
    private final int width;

    RowWindow(ObservationErrors base, int from, int to) {
        if (from < 0 || to > base.observations() || to - from < 1) {
            throw new IllegalArgumentException("window [" + from + ", " + to + ") is not inside the "
                    + base.observations() + " observations");
        }
        this.base = base;
        this.from = from;
        this.to = to;
        this.width = base.assetNames().size();
    }

    @Override
    public List<String> parameterNames() {
        return base.parameterNames();
    }

    @Override
    public List<String> assetNames() {
        return base.assetNames();
    }

    @Override
    public int observations() {
        return to - from;
    }

    @Override
    public int pricedAssets() {
        return base.pricedAssets();
    }

    @Override
    public boolean isLinear() {
        return base.isLinear();
    }

    @Override
    public void errors(double[] theta, double[] out) {
        double[] full = new double[base.observations() * width];
        base.errors(theta, full);
        System.arraycopy(full, from * width, out, 0, observations() * width);
    }

    @Override
    public void errorDerivatives(double[] theta, double[][] out) {
        double[][] full = new double[out.length][base.observations() * width];
        base.errorDerivatives(theta, full);
        for (int p = 0; p < out.length; p++) {
            System.arraycopy(full[p], from * width, out[p], 0, observations() * width);
        }
    }

    @Override
    public void payoffs(double[] out) {
        double[] full = new double[base.observations() * width];
        base.payoffs(full);
        System.arraycopy(full, from * width, out, 0, observations() * width);
    }

    @Override
    public void discountFactor(double[] theta, double[] out) {
        double[] full = new double[base.observations()];
        base.discountFactor(theta, full);
        System.arraycopy(full, from, out, 0, observations());
    }
}
