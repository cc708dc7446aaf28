package org.orthogon.twopass;

import java.util.List;

/**
 * Excess returns of N test assets and K factors over the same T periods, the input of every two-pass
 * computation.
 *
 * @param assets        the N test-asset names
 * @param factors       the K factor names
 * @param excessReturns T x N, row t the excess returns of period t
 * @param factorValues  T x K, row t the factors of period t
 */
public record FactorSample(List<String> assets, List<String> factors, double[][] excessReturns,
        double[][] factorValues) {

    public FactorSample {
        assets = List.copyOf(assets);
        factors = List.copyOf(factors);
        excessReturns = copy(excessReturns, assets.size(), "excess return");
        factorValues = copy(factorValues, factors.size(), "factor");
        if (excessReturns.length != factorValues.length) {
            throw new IllegalArgumentException(excessReturns.length + " rows of returns but " + factorValues.length
                    + " rows of factors");
        }
        if (assets.isEmpty() || factors.isEmpty()) {
            throw new IllegalArgumentException("need at least one test asset and one factor");
        }
    }

    /** T, the number of periods. */
    public int periods() {
        return excessReturns.length;
    }

    /** N, the number of test assets. */
    public int assetCount() {
        return assets.size();
    }

    /** K, the number of factors. */
    public int factorCount() {
        return factors.size();
    }

    /** The same sample restricted to the named factors, in the order given (for nested model comparisons). */
    public FactorSample withFactors(List<String> names) {
        double[][] values = new double[periods()][names.size()];
        for (int k = 0; k < names.size(); k++) {
            int column = factors.indexOf(names.get(k));
            if (column < 0) {
                throw new IllegalArgumentException("no factor \"" + names.get(k) + "\" in " + factors);
            }
            for (int t = 0; t < values.length; t++) {
                values[t][k] = factorValues[t][column];
            }
        }
        return new FactorSample(assets, names, excessReturns, values);
    }

    @Override
    public double[][] excessReturns() {
        return copy(excessReturns, assets.size(), "excess return");
    }

    @Override
    public double[][] factorValues() {
        return copy(factorValues, factors.size(), "factor");
    }

    private static double[][] copy(double[][] rows, int width, String what) {
        double[][] out = new double[rows.length][];
        for (int t = 0; t < rows.length; t++) {
            if (rows[t].length != width) {
                throw new IllegalArgumentException(what + " row " + t + " has " + rows[t].length + " values, expected "
                        + width);
            }
            out[t] = rows[t].clone();
        }
        return out;
    }
}
