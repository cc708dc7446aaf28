package org.orthogon.demo;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.random.MersenneTwister;
import org.ejml.data.DMatrixRMaj;

/**
 * Draws a sample of the Isle of Lumen economy ({@link LumenEconomy}): monthly portfolio returns,
 * the risk-free rate and the factors, and quarterly consumption growth built from the same months.
 * The same economy, sample length and seed always give the same numbers (Mersenne Twister,
 * Matsumoto and Nishimura 1998).
 */
public final class LumenSimulator {
    /** Seed of the shipped demo data. */
    public static final long DEMO_SEED = 19620101L;
    /** First year of the shipped demo sample (January). */
    public static final int FIRST_YEAR = 1962;
    /** Last year of the shipped demo sample (December). */
    public static final int LAST_YEAR = 2024;

    private LumenSimulator() {
    }

    /**
     * Simulates {@code years} full years starting in January of {@code firstYear}.
     */
    public static LumenSample simulate(LumenEconomy economy, int firstYear, int years, long seed) {
        if (years < 1) {
            throw new IllegalArgumentException("years must be at least 1, got " + years);
        }
        MersenneTwister random = new MersenneTwister(seed);
        int months = years * 12;
        int factorsCount = economy.factorMeans().length;
        int portfolios = economy.loadings().length;
        DMatrixRMaj chol = economy.factorCholesky();
        double[] kappa = economy.consumptionLoadings();
        double riskfree = economy.monthlyRiskfreeGross();
        double monthlyMeanLog = economy.quarterlyMeanLogGrowth() / 3.0;

        double[][] factors = new double[months][factorsCount];
        double[][] netReturns = new double[months][portfolios];
        double[] riskfreeNet = new double[months];
        double[] monthlyLogGrowth = new double[months];
        double[] shocks = new double[factorsCount];
        for (int m = 0; m < months; m++) {
            for (int k = 0; k < factorsCount; k++) {
                shocks[k] = random.nextGaussian();
            }
            double logGrowth = monthlyMeanLog + economy.consumptionNoise() * random.nextGaussian();
            for (int k = 0; k < factorsCount; k++) {
                double innovation = 0.0;
                for (int j = 0; j <= k; j++) {
                    innovation += chol.get(k, j) * shocks[j];
                }
                factors[m][k] = economy.factorMeans()[k] + innovation;
                logGrowth += kappa[k] * innovation;
            }
            monthlyLogGrowth[m] = logGrowth;
            for (int i = 0; i < portfolios; i++) {
                double excess = economy.idiosyncraticVolatilities()[i] * random.nextGaussian();
                for (int k = 0; k < factorsCount; k++) {
                    excess += economy.loadings()[i][k] * factors[m][k];
                }
                netReturns[m][i] = riskfree - 1.0 + excess;
            }
            riskfreeNet[m] = riskfree - 1.0;
        }
        int quarters = months / 3;
        double[] consumptionGrowth = new double[quarters];
        for (int q = 0; q < quarters; q++) {
            consumptionGrowth[q] = Math.exp(monthlyLogGrowth[3 * q] + monthlyLogGrowth[3 * q + 1]
                    + monthlyLogGrowth[3 * q + 2]);
        }
        List<String> monthLabels = new ArrayList<>(months);
        for (int m = 0; m < months; m++) {
            monthLabels.add(String.format("%04d-%02d", firstYear + m / 12, m % 12 + 1));
        }
        List<String> quarterLabels = new ArrayList<>(quarters);
        for (int q = 0; q < quarters; q++) {
            quarterLabels.add(String.format("%04dQ%d", firstYear + q / 4, q % 4 + 1));
        }
        return new LumenSample(monthLabels, quarterLabels, netReturns, riskfreeNet, factors, consumptionGrowth);
    }

    /** The shipped demo sample: 1962-01 to 2024-12 with {@link #DEMO_SEED}. */
    public static LumenSample demo() {
        return simulate(LumenEconomy.standard(), FIRST_YEAR, LAST_YEAR - FIRST_YEAR + 1, DEMO_SEED);
    }

    /**
     * A drawn sample; arrays are [period][column] and owned by the record.
     *
     * @param months            labels YYYY-MM
     * @param quarters          labels YYYYQn
     * @param portfolioReturns  monthly net returns of the 12 portfolios, decimals
     * @param riskfree          monthly net risk-free rate, decimals
     * @param factors           monthly MKT, SIZE, TIDE, decimals
     * @param consumptionGrowth quarterly gross growth of real per-capita consumption C_t/C_{t-1}
     */
    public record LumenSample(List<String> months, List<String> quarters, double[][] portfolioReturns,
            double[] riskfree, double[][] factors, double[] consumptionGrowth) {
    }
}
