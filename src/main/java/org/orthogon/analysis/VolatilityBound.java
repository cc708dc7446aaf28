package org.orthogon.analysis;

import java.util.ArrayList;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.moments.MomentAlgebra;
import org.orthogon.moments.MomentModel;

/**
 * The Hansen and Jagannathan (1991, "Implications of security market data for models of dynamic
 * economies", Journal of Political Economy 99, 225-262) bound on the volatility of any SDF that prices the
 * test payoffs: an SDF with mean v satisfies E[m x] = p, so Cov(m, x) = p - v μ_x and
 * <pre>
 *   σ(m) ≥ σ_min(v) = sqrt((p - v μ_x)' Σ_x^{-1} (p - v μ_x)),
 * </pre>
 * μ_x and Σ_x the mean and covariance (divisor T) of the payoffs, p their prices (1 for gross returns, 0 for
 * excess returns, where the bound is the cone σ(m) ≥ v × the largest Sharpe ratio). A model's SDF is placed
 * at (E_T[m], σ_T(m)): below the curve it cannot price the assets, whatever its parameters' standard errors.
 *
 * @param means      the grid of v
 * @param bound      σ_min(v) on the grid
 * @param sdfs       each model's SDF: its mean and volatility at the estimate
 */
public record VolatilityBound(double[] means, double[] bound, List<SdfPoint> sdfs) {

    public VolatilityBound {
        means = means.clone();
        bound = bound.clone();
        sdfs = List.copyOf(sdfs);
    }

    /** A model's SDF in the mean-volatility plane. */
    public record SdfPoint(String title, double mean, double volatility) {
    }

    /**
     * The bound for the payoffs of {@code model} (their prices read off the moments at {@code theta}: p =
     * E_T[m x] - g_T) on a grid around the SDFs' means, with each named SDF series placed on it.
     */
    public static VolatilityBound of(MomentModel model, double[] theta, List<String> titles, List<double[]> sdfs) {
        int k = model.pricingMomentCount();
        DMatrixRMaj x = model.payoffs();
        int t = x.numRows;
        double[] m = model.discountFactors(theta);
        DMatrixRMaj g = model.meanMoments(theta);
        DMatrixRMaj mean = MomentAlgebra.columnMeans(x);
        double[] price = new double[k];
        for (int i = 0; i < k; i++) {
            double sum = 0.0;
            for (int s = 0; s < t; s++) {
                sum += m[s] * x.get(s, i);
            }
            price[i] = sum / t - g.get(i);
        }
        DMatrixRMaj covariance = new DMatrixRMaj(k, k);
        for (int s = 0; s < t; s++) {
            for (int i = 0; i < k; i++) {
                for (int j = 0; j < k; j++) {
                    covariance.add(i, j, (x.get(s, i) - mean.get(i)) * (x.get(s, j) - mean.get(j)) / t);
                }
            }
        }
        DMatrixRMaj inverse = covariance.copy();
        if (!CommonOps_DDRM.invert(inverse)) {
            throw new IllegalArgumentException("the payoffs' covariance matrix is singular");
        }
        List<SdfPoint> points = new ArrayList<>();
        double low = Double.POSITIVE_INFINITY;
        double high = Double.NEGATIVE_INFINITY;
        for (int j = 0; j < sdfs.size(); j++) {
            double[] series = sdfs.get(j);
            double average = 0.0;
            for (double value : series) {
                average += value / series.length;
            }
            double variance = 0.0;
            for (double value : series) {
                variance += (value - average) * (value - average) / series.length;
            }
            points.add(new SdfPoint(titles.get(j), average, Math.sqrt(variance)));
            low = Math.min(low, average);
            high = Math.max(high, average);
        }
        double half = Math.max(0.05 * Math.abs(0.5 * (low + high)), high - low);
        int steps = 101;
        double[] grid = new double[steps];
        double[] bound = new double[steps];
        for (int s = 0; s < steps; s++) {
            double v = low - half + (high - low + 2 * half) * s / (steps - 1);
            grid[s] = v;
            DMatrixRMaj gap = new DMatrixRMaj(k, 1);
            for (int i = 0; i < k; i++) {
                gap.set(i, price[i] - v * mean.get(i));
            }
            DMatrixRMaj temp = new DMatrixRMaj(k, 1);
            CommonOps_DDRM.mult(inverse, gap, temp);
            bound[s] = Math.sqrt(Math.max(CommonOps_DDRM.dot(gap, temp), 0.0));
        }
        return new VolatilityBound(grid, bound, points);
    }

    @Override
    public double[] means() {
        return means.clone();
    }

    @Override
    public double[] bound() {
        return bound.clone();
    }
}
