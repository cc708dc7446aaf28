package org.orthogon.demo;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.random.MersenneTwister;

/**
 * The series of the Isle of Lumen beyond the shipped sample's returns and consumption growth: a
 * wealth-return proxy, a price level, population and nominal aggregate consumption, from which the
 * demo's real per-capita consumption growth is recovered exactly (up to rounding). They let the
 * recursive-utility family and the data transforms (real returns, per-capita growth) run on demo data.
 *
 * <p>The wealth proxy is the market: its monthly real gross return is R_f + MKT, compounded over the
 * three months of each quarter. It is priced by the economy's SDF because MKT is (Stein's lemma, as
 * for the portfolios; see {@link LumenEconomy}). Inflation and population growth are drawn from their
 * own random stream, so the original files do not change: quarterly log inflation is
 * 0.007 + 0.004 ε and log population growth 0.0025 + 0.0005 ε, ε standard normal and independent of
 * everything else. Nominal returns are real returns times P_t/P_{t-1}.
 *
 * @param quarters       labels YYYYQn of the shipped sample
 * @param realWealth     quarterly real gross wealth-proxy returns
 * @param nominalWealth  quarterly nominal gross wealth-proxy returns
 * @param levelQuarters  labels of the level series: one quarter before the sample, then the sample
 * @param deflator       price level on {@code levelQuarters}, 100 in the first quarter
 * @param population     millions of people on {@code levelQuarters}
 * @param nominalConsumption aggregate nominal consumption on {@code levelQuarters}, millions of crowns
 */
public record LumenMacro(List<String> quarters, double[] realWealth, double[] nominalWealth,
        List<String> levelQuarters, double[] deflator, double[] population, double[] nominalConsumption) {

    /** Added to the sample's seed for the inflation and population stream. */
    public static final long SEED_OFFSET = 1L;

    private static final double MEAN_INFLATION = 0.007;
    private static final double INFLATION_VOLATILITY = 0.004;
    private static final double MEAN_POPULATION_GROWTH = 0.0025;
    private static final double POPULATION_GROWTH_VOLATILITY = 0.0005;
    private static final double FIRST_POPULATION = 0.8;
    private static final double FIRST_REAL_PER_CAPITA = 10_000.0;

    /** Builds the extra series for {@code sample}, drawing the nominal side with {@code seed + SEED_OFFSET}. */
    public static LumenMacro of(LumenSimulator.LumenSample sample, long seed) {
        int quarters = sample.quarters().size();
        double[] realWealth = new double[quarters];
        for (int q = 0; q < quarters; q++) {
            double gross = 1.0;
            for (int m = 3 * q; m < 3 * q + 3; m++) {
                gross *= 1.0 + sample.riskfree()[m] + sample.factors()[m][0];
            }
            realWealth[q] = gross;
        }
        MersenneTwister random = new MersenneTwister(seed + SEED_OFFSET);
        double[] deflator = new double[quarters + 1];
        double[] population = new double[quarters + 1];
        double[] consumption = new double[quarters + 1];
        double[] nominalWealth = new double[quarters];
        deflator[0] = 100.0;
        population[0] = FIRST_POPULATION;
        double realPerCapita = FIRST_REAL_PER_CAPITA;
        consumption[0] = realPerCapita * population[0] * deflator[0] / 100.0;
        for (int q = 0; q < quarters; q++) {
            deflator[q + 1] = deflator[q] * Math.exp(MEAN_INFLATION + INFLATION_VOLATILITY * random.nextGaussian());
            population[q + 1] = population[q]
                    * Math.exp(MEAN_POPULATION_GROWTH + POPULATION_GROWTH_VOLATILITY * random.nextGaussian());
            realPerCapita *= sample.consumptionGrowth()[q];
            consumption[q + 1] = realPerCapita * population[q + 1] * deflator[q + 1] / 100.0;
            nominalWealth[q] = realWealth[q] * deflator[q + 1] / deflator[q];
        }
        List<String> levelQuarters = new ArrayList<>();
        String first = sample.quarters().get(0);
        int year = Integer.parseInt(first.substring(0, 4));
        int quarter = first.charAt(5) - '0';
        levelQuarters.add(quarter == 1 ? (year - 1) + "Q4" : year + "Q" + (quarter - 1));
        levelQuarters.addAll(sample.quarters());
        return new LumenMacro(List.copyOf(sample.quarters()), realWealth, nominalWealth, List.copyOf(levelQuarters),
                deflator, population, consumption);
    }
}
