package org.orthogon.demo;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DemoDataTest {

    @Test
    void shippedDemoDataEqualsTheSimulatorOutput(@TempDir Path folder) throws IOException {
        DemoData.write(LumenEconomy.standard(), LumenSimulator.demo(), folder);
        for (String name : DemoData.FILES) {
            Path shipped = Paths.get("demo-data").resolve(name);
            assertThat(shipped).as("demo-data/%s is committed", name).exists();
            assertThat(Files.readString(folder.resolve(name)))
                    .as("demo-data/%s must equal `simulate --out demo-data --overwrite`; regenerate it with that command", name)
                    .isEqualTo(Files.readString(shipped));
        }
    }

    @Test
    void theSameSeedGivesTheSameSampleAndAnotherSeedDoesNot() {
        LumenEconomy economy = LumenEconomy.standard();
        var first = LumenSimulator.simulate(economy, 1962, 2, 7L);
        var again = LumenSimulator.simulate(economy, 1962, 2, 7L);
        var other = LumenSimulator.simulate(economy, 1962, 2, 8L);
        assertThat(again.portfolioReturns()).isDeepEqualTo(first.portfolioReturns());
        assertThat(other.portfolioReturns()[0][0]).isNotEqualTo(first.portfolioReturns()[0][0]);
        assertThat(first.months()).hasSize(24).startsWith("1962-01").endsWith("1963-12");
        assertThat(first.quarters()).hasSize(8).startsWith("1962Q1").endsWith("1963Q4");
    }

    @Test
    void derivedTruthsSatisfyTheirDefiningEquations() {
        LumenEconomy economy = LumenEconomy.standard();
        double[] mu = economy.factorMeans();
        double[] b = economy.linearSdfCoefficients();
        var sigma = economy.factorCovariance();
        // E[(1 - b'F) F] = 0 for the factors themselves, which are excess returns:
        // mu - (Sigma + mu mu') b = 0 (Cochrane 2005, "Asset Pricing", section 6.3).
        for (int k = 0; k < mu.length; k++) {
            double value = mu[k];
            for (int j = 0; j < mu.length; j++) {
                value -= (sigma.get(k, j) + mu[k] * mu[j]) * b[j];
            }
            assertThat(value).as("pricing error of factor %d", k).isCloseTo(0.0, org.assertj.core.data.Offset.offset(1e-15));
        }
        // Lognormal SDF: 1/Rf = E[M] = beta^(1/3) exp(-gamma mu/3 + gamma^2 var / 2) (common practice, no source).
        double logM = Math.log(economy.quarterlyBeta()) / 3 - economy.gamma() * economy.quarterlyMeanLogGrowth() / 3
                + 0.5 * economy.gamma() * economy.gamma() * economy.monthlyLogGrowthVariance();
        assertThat(economy.monthlyRiskfreeGross() * Math.exp(logM)).isCloseTo(1.0, org.assertj.core.data.Offset.offset(1e-15));
    }
}
