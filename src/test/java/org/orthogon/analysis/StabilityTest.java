package org.orthogon.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.util.List;
import java.util.Random;
import java.util.stream.IntStream;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.orthogon.TestLog;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.ScaledMoments;

class StabilityTest {
    private static final GmmOptions TWO_STEP = new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.bartlettLags(2));

    @ParameterizedTest(name = "p = {0}: published 5% value {1}")
    @CsvSource({"1, 8.68", "1, 8.85", "2, 11.79"})
    void simulatedCriticalValuesReproduceAndrews1993(int parameters, double published) {
        // Andrews (1993), Econometrica 61, Table 1 (sup tests, pi0 = 0.15, 5% level), and its corrected version in
        // Andrews (2003), Econometrica 71, 395-397. Values recalled from memory: for p = 1 the original table is
        // remembered as 8.85 and the corrected one as 8.68, so both are checked; p = 2: 11.79.
        SupWaldDistribution distribution = SupWaldDistribution.simulate(parameters, 0.15, 11L, 20_000);
        double simulated = distribution.criticalValue(0.05);
        TestLog.printf(StabilityTest.class,
                "sup-Wald 5%% critical value, p = %d: simulated %.3f, published %.2f%n", parameters, simulated,
                published);
        assertThat(simulated).isCloseTo(published, within(0.03 * published));
        assertThat(distribution.pValue(simulated)).isCloseTo(0.05, within(0.001));
    }

    @Test
    void simulationIsReproducibleForASeed() {
        assertThat(SupWaldDistribution.simulate(3, 0.15, 5L, 500).sorted())
                .isEqualTo(SupWaldDistribution.simulate(3, 0.15, 5L, 500).sorted());
    }

    private static ScaledMoments model(Random random, int months) {
        double[][] factors = new double[months][1];
        double[][] excess = new double[months][4];
        for (int t = 0; t < months; t++) {
            factors[t][0] = 0.006 + 0.045 * random.nextGaussian();
            for (int i = 0; i < 4; i++) {
                excess[t][i] = (0.8 + 0.15 * i) * factors[t][0] + 0.02 * random.nextGaussian();
            }
        }
        return ScaledMoments.unscaled(new LinearFactorErrors(excess, factors, List.of("a", "b", "c", "d"), List.of("F")));
    }

    @Test
    void equalityTestEqualsADirectComputation() {
        ScaledMoments moments = model(new Random(4), 360);
        List<String> dates = IntStream.range(0, 360).mapToObj(i -> "m" + i).toList();
        List<Stability.PeriodFit> periods = Stability.periods(moments, new double[1], dates, List.of(120, 250), TWO_STEP);
        assertThat(periods).hasSize(3);
        assertThat(periods.get(1).start()).isEqualTo("m120");
        assertThat(periods.get(1).end()).isEqualTo("m249");

        // Each period equals an independent fit on just its rows.
        GmmFit middle = GmmEstimator.estimate(moments.rows(120, 250), new double[1], TWO_STEP);
        assertThat(periods.get(1).fit().estimates()[0]).isEqualTo(middle.estimates()[0]);

        // Direct: differences d1 = θ2 - θ1, d2 = θ3 - θ2 with Cov [[V1+V2, -V2], [-V2, V2+V3]]
        // (Andrews and Fair 1988, the Wald statistic for equal parameters across regimes).
        double[] theta = periods.stream().mapToDouble(p -> p.fit().estimates()[0]).toArray();
        double[] v = periods.stream().mapToDouble(p -> p.fit().covariance().get(0, 0)).toArray();
        DMatrixRMaj cov = new DMatrixRMaj(new double[][] {{v[0] + v[1], -v[1]}, {-v[1], v[1] + v[2]}});
        DMatrixRMaj d = new DMatrixRMaj(new double[][] {{theta[1] - theta[0]}, {theta[2] - theta[1]}});
        DMatrixRMaj inverse = new DMatrixRMaj(2, 2);
        CommonOps_DDRM.invert(cov, inverse);
        DMatrixRMaj tmp = new DMatrixRMaj(2, 1);
        CommonOps_DDRM.mult(inverse, d, tmp);
        double direct = CommonOps_DDRM.dot(d, tmp);
        ChiSquareTest test = Stability.equalityTest(periods);
        assertThat(test.statistic()).isCloseTo(direct, within(1e-10 * direct));
        assertThat(test.df()).isEqualTo(2);

        // Two periods: (θ1 - θ2)'(V1 + V2)^{-1}(θ1 - θ2) as in Andrews and Fair (1988), eq. 3.6.
        List<Stability.PeriodFit> two = Stability.periods(moments, new double[1], dates, List.of(180), TWO_STEP);
        double diff = two.get(0).fit().estimates()[0] - two.get(1).fit().estimates()[0];
        double sum = two.get(0).fit().covariance().get(0, 0) + two.get(1).fit().covariance().get(0, 0);
        assertThat(Stability.equalityTest(two).statistic()).isCloseTo(diff * diff / sum, within(1e-10 * diff * diff / sum));
    }

    @Test
    void supWaldIsTheLargestWaldOverTheTrimmedDates() {
        ScaledMoments moments = model(new Random(6), 200);
        List<String> dates = IntStream.range(0, 200).mapToObj(i -> "m" + i).toList();
        Stability.SupWald sup = Stability.supWald(moments, new double[1], dates, TWO_STEP, 0.15, 3L, 500, i -> { });
        // Candidates i = 30..170 leave at least 15% (30 observations) on each side.
        assertThat(sup.sequence()).hasSize(141);
        assertThat(sup.sequence().get(0).date()).isEqualTo("m30");
        assertThat(sup.sequence().get(140).date()).isEqualTo("m170");
        double max = sup.sequence().stream().mapToDouble(Stability.BreakPoint::statistic).max().orElseThrow();
        assertThat(sup.statistic()).isEqualTo(max);
        int at = dates.indexOf(sup.breakDate());
        double atBreak = Stability.equalityTest(Stability.periods(moments, new double[1], dates, List.of(at), TWO_STEP))
                .statistic();
        // the sup-Wald sides come from running sums, the periods from their own rows: equal up to rounding
        assertThat(atBreak).isCloseTo(max, within(1e-10 * max));
    }

    @Test
    void rollingAndExpandingWindowsCoverTheSample() {
        ScaledMoments moments = model(new Random(7), 150);
        List<String> dates = IntStream.range(0, 150).mapToObj(i -> "m" + i).toList();
        List<Stability.PeriodFit> rolling = Stability.windows(moments, new double[1], dates, TWO_STEP, 60, 30, false, i -> { });
        assertThat(rolling).extracting(Stability.PeriodFit::start).containsExactly("m0", "m30", "m60", "m90");
        assertThat(rolling).extracting(Stability.PeriodFit::end).containsExactly("m59", "m89", "m119", "m149");
        List<Stability.PeriodFit> expanding = Stability.windows(moments, new double[1], dates, TWO_STEP, 60, 45, true, i -> { });
        assertThat(expanding).extracting(Stability.PeriodFit::start).containsOnly("m0");
        assertThat(expanding.get(expanding.size() - 1).fit().observations()).isEqualTo(150);
    }
}
