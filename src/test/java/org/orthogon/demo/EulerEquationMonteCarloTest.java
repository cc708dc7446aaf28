package org.orthogon.demo;

import static org.assertj.core.api.Assertions.assertThat;

import org.junit.jupiter.api.Test;

/**
 * The simulator's construction claims that both SDFs price the portfolios exactly in population.
 * A long simulated sample must then give sample pricing errors within a few standard errors of zero;
 * a wrong sign or a missing term in the construction would show up as errors of many standard errors.
 */
class EulerEquationMonteCarloTest {

    @Test
    void bothSdfsPriceTheSimulatedPortfoliosInALongSample() {
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1, 4000, 424242L);
        double[] b = economy.linearSdfCoefficients();
        int months = sample.months().size();
        int assets = economy.portfolioNames().size();
        for (int i = 0; i < assets; i++) {
            double sum = 0.0;
            double sumSquares = 0.0;
            for (int m = 0; m < months; m++) {
                double excess = sample.portfolioReturns()[m][i] - sample.riskfree()[m];
                double sdf = 1.0;
                for (int k = 0; k < b.length; k++) {
                    sdf -= b[k] * sample.factors()[m][k];
                }
                double error = sdf * excess;
                sum += error;
                sumSquares += error * error;
            }
            double mean = sum / months;
            double se = Math.sqrt((sumSquares / months - mean * mean) / months);
            assertThat(Math.abs(mean / se)).as("linear SDF pricing error t-stat of %s", economy.portfolioNames().get(i))
                    .isLessThan(4.0);
        }
        int quarters = sample.quarters().size();
        for (int i = 0; i < assets; i++) {
            double sum = 0.0;
            double sumSquares = 0.0;
            for (int q = 0; q < quarters; q++) {
                double gross = 1.0;
                for (int m = 3 * q; m < 3 * q + 3; m++) {
                    gross *= 1.0 + sample.portfolioReturns()[m][i];
                }
                double error = economy.quarterlyBeta() * Math.pow(sample.consumptionGrowth()[q], -economy.gamma()) * gross - 1;
                sum += error;
                sumSquares += error * error;
            }
            double mean = sum / quarters;
            double se = Math.sqrt((sumSquares / quarters - mean * mean) / quarters);
            assertThat(Math.abs(mean / se)).as("Euler equation error t-stat of %s", economy.portfolioNames().get(i))
                    .isLessThan(4.0);
        }
    }
}
