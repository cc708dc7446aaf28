package org.orthogon.demo;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.orthogon.moments.DemeanedFactorErrors;
import org.orthogon.moments.GrossFactorErrors;
import org.orthogon.moments.ObservationErrors;
import org.orthogon.moments.RecursiveUtilityErrors;

/**
 * The documented truths of the recursive-utility, demeaned and gross linear-factor families: in a long
 * simulated sample every moment of each family, evaluated at its truth, must be within a few standard
 * errors of zero (draws are independent across periods, so the i.i.d. standard error applies). A wrong
 * truth gives t-statistics far above 4.
 */
class ExtendedTruthMonteCarloTest {
    private static final LumenEconomy ECONOMY = LumenEconomy.standard();
    private static final long SEED = 515151L;
    private static final LumenSimulator.LumenSample SAMPLE = LumenSimulator.simulate(ECONOMY, 1, 3000, SEED);

    @Test
    void recursiveUtilityPricesThePortfoliosAndItsWealthProxyAtItsTruth() {
        LumenMacro macro = LumenMacro.of(SAMPLE, SEED);
        int quarters = SAMPLE.quarters().size();
        int n = ECONOMY.portfolioNames().size();
        double[][] gross = new double[quarters][n];
        for (int q = 0; q < quarters; q++) {
            for (int i = 0; i < n; i++) {
                double g = 1.0;
                for (int m = 3 * q; m < 3 * q + 3; m++) {
                    g *= 1.0 + SAMPLE.portfolioReturns()[m][i];
                }
                gross[q][i] = g;
            }
        }
        assertMomentsNearZero(new RecursiveUtilityErrors(gross, SAMPLE.consumptionGrowth(), macro.realWealth(),
                ECONOMY.portfolioNames(), "wealth_return"), ECONOMY.recursiveUtilityParameters());
    }

    @Test
    void demeanedAndGrossLinearSdfsPriceThePortfoliosAtTheirTruths() {
        int months = SAMPLE.months().size();
        int n = ECONOMY.portfolioNames().size();
        double[][] excess = new double[months][n];
        double[][] gross = new double[months][n];
        double[] riskfree = new double[months];
        for (int m = 0; m < months; m++) {
            riskfree[m] = 1.0 + SAMPLE.riskfree()[m];
            for (int i = 0; i < n; i++) {
                excess[m][i] = SAMPLE.portfolioReturns()[m][i] - SAMPLE.riskfree()[m];
                gross[m][i] = 1.0 + SAMPLE.portfolioReturns()[m][i];
            }
        }
        double[] b = ECONOMY.demeanedSdfCoefficients();
        double[] mu = ECONOMY.factorMeans();
        assertMomentsNearZero(new DemeanedFactorErrors(excess, SAMPLE.factors(), ECONOMY.portfolioNames(),
                ECONOMY.factorNames()), new double[] {b[0], b[1], b[2], mu[0], mu[1], mu[2]});
        assertMomentsNearZero(new GrossFactorErrors(gross, riskfree, SAMPLE.factors(), ECONOMY.portfolioNames(), "RF",
                ECONOMY.factorNames()), ECONOMY.grossSdfParameters());
    }

    private static void assertMomentsNearZero(ObservationErrors family, double[] truth) {
        int t = family.observations();
        List<String> names = family.assetNames();
        double[] e = new double[t * names.size()];
        family.errors(truth, e);
        for (int i = 0; i < names.size(); i++) {
            double sum = 0;
            double squares = 0;
            for (int s = 0; s < t; s++) {
                double x = e[s * names.size() + i];
                sum += x;
                squares += x * x;
            }
            double mean = sum / t;
            double se = Math.sqrt((squares / t - mean * mean) / t);
            assertThat(Math.abs(mean / se)).as("t-stat of the %s moment at the truth", names.get(i)).isLessThan(4.0);
        }
    }
}
