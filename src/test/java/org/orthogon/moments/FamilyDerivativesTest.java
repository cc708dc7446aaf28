package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Every built-in family's analytic derivatives against the shared central-difference helper, at seeded
 * random parameter points, observation by observation (common practice, no source; the 1e-6 relative
 * tolerance is the acceptance bound of issue 5, and central differences with ε^{1/3} steps are accurate
 * to about 1e-10 relative here, Nocedal and Wright 2006, section 8.1, from memory).
 */
class FamilyDerivativesTest {
    private static final List<String> ASSETS = List.of("S1T1", "S1T2", "S2T3", "S3T4");
    private static final List<String> FACTORS = List.of("MKT", "SIZE");

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {11L, 12L, 13L, 14L})
    void recursiveUtility(long seed) {
        FamilyFixtures data = new FamilyFixtures(seed, 60, 4, 2);
        Random random = new Random(seed);
        double gamma = 2 + 10 * random.nextDouble();
        // Both sides of the unit-EIS singularity.
        double psi = random.nextBoolean() ? 0.1 + 0.8 * random.nextDouble() : 1.2 + 1.5 * random.nextDouble();
        double[] theta = {0.95 + 0.04 * random.nextDouble(), gamma, psi};
        assertMatches(new RecursiveUtilityErrors(data.gross, data.growth, data.wealth, ASSETS, "R_w"), theta);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {21L, 22L, 23L})
    void powerUtility(long seed) {
        FamilyFixtures data = new FamilyFixtures(seed, 60, 4, 2);
        Random random = new Random(seed);
        assertMatches(new PowerUtilityErrors(data.gross, data.growth, ASSETS),
                new double[] {0.95 + 0.04 * random.nextDouble(), 1 + 10 * random.nextDouble()});
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {31L, 32L, 33L})
    void demeanedLinearFactor(long seed) {
        FamilyFixtures data = new FamilyFixtures(seed, 60, 4, 2);
        Random random = new Random(seed);
        double[] theta = {3 * random.nextGaussian(), 3 * random.nextGaussian(), 0.01 * random.nextGaussian(),
                0.01 * random.nextGaussian()};
        assertMatches(new DemeanedFactorErrors(data.excess, data.factors, ASSETS, FACTORS), theta);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {41L, 42L, 43L})
    void grossLinearFactor(long seed) {
        FamilyFixtures data = new FamilyFixtures(seed, 60, 4, 2);
        Random random = new Random(seed);
        double[] theta = {1 + 0.1 * random.nextGaussian(), 3 * random.nextGaussian(), 3 * random.nextGaussian()};
        assertMatches(new GrossFactorErrors(data.gross, data.riskfree, data.factors, ASSETS, "RF", FACTORS), theta);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {51L, 52L})
    void excessLinearFactor(long seed) {
        FamilyFixtures data = new FamilyFixtures(seed, 60, 4, 2);
        Random random = new Random(seed);
        assertMatches(new LinearFactorErrors(data.excess, data.factors, ASSETS, FACTORS),
                new double[] {3 * random.nextGaussian(), 3 * random.nextGaussian()});
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {61L, 62L, 63L, 64L})
    void betaPricingSystem(long seed) {
        FamilyFixtures data = new FamilyFixtures(seed, 60, 4, 2);
        Random random = new Random(seed);
        boolean intercept = seed % 2 == 0;
        BetaPricingErrors errors = new BetaPricingErrors(data.excess, data.factors, ASSETS, FACTORS,
                seed < 63 ? BetaPricingErrors.CrossSection.OLS : BetaPricingErrors.CrossSection.GLS, intercept);
        double[] theta = new double[errors.parameterNames().size()];
        for (int p = 0; p < theta.length; p++) {
            theta[p] = p < errors.crossSectionCoefficients() ? 0.01 * random.nextGaussian() : random.nextGaussian();
        }
        assertMatches(errors, theta);
    }

    private static void assertMatches(ObservationErrors family, double[] theta) {
        double[][] analytic = FamilyFixtures.derivatives(family, theta);
        double[][] numeric = CentralDifferences.derivatives(family, theta);
        for (int p = 0; p < theta.length; p++) {
            for (int j = 0; j < analytic[p].length; j++) {
                double scale = Math.max(1.0, Math.abs(numeric[p][j]));
                assertThat(Math.abs(analytic[p][j] - numeric[p][j]) / scale)
                        .as("d e_%d / d %s", j, family.parameterNames().get(p)).isLessThan(1e-6);
            }
        }
    }
}
