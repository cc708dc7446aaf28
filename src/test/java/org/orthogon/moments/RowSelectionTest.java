package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.stream.IntStream;
import java.util.stream.Stream;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Subsample and resample views of every family, with and without instruments: a selection of all
 * rows is the model itself, a selection of a range is the window of {@link ScaledMoments#rows}, a row
 * chosen twice counts twice, and a window's Jacobian is the mean of the full sample's per-row
 * derivatives over the window (identities of the sample mean; common practice, no source). Errors
 * and payoffs are per row, so those comparisons are exact.
 */
class RowSelectionTest {
    private static final int T = 48;
    private static final List<String> ASSETS = List.of("S1T1", "S1T2", "S2T3");
    private static final List<String> FACTORS = List.of("MKT", "SIZE");

    record Case(String name, ObservationErrors family, double[] theta) {
        @Override
        public String toString() {
            return name;
        }
    }

    static Stream<Arguments> families() {
        FamilyFixtures data = new FamilyFixtures(5, T, ASSETS.size(), FACTORS.size());
        Map<String, double[]> columns = new LinkedHashMap<>();
        columns.put("cons_growth", data.growth);
        List<Case> cases = List.of(
                new Case("power utility", new PowerUtilityErrors(data.gross, data.growth, ASSETS), new double[] {0.97, 4}),
                new Case("recursive utility", new RecursiveUtilityErrors(data.gross, data.growth, data.wealth, ASSETS, "W"),
                        new double[] {0.96, 5, 0.6}),
                new Case("linear factor", new LinearFactorErrors(data.excess, data.factors, ASSETS, FACTORS),
                        new double[] {1.5, -0.7}),
                new Case("gross linear factor", new GrossFactorErrors(data.gross, data.riskfree, data.factors, ASSETS,
                        "RF", FACTORS), new double[] {1.01, 1.5, -0.7}),
                new Case("demeaned linear factor", new DemeanedFactorErrors(data.excess, data.factors, ASSETS, FACTORS),
                        new double[] {1.5, -0.7, 0.004, 0.006}),
                new Case("expression", new ExpressionSdfErrors("beta * cons_growth^(-gamma)", List.of("beta", "gamma"),
                        columns, data.gross, ASSETS, Payoff.GROSS), new double[] {0.97, 4}));
        double[][] instruments = instruments(T);
        // The beta-pricing system takes no instruments (its selection is written for the unscaled moments).
        BetaPricingErrors beta = new BetaPricingErrors(data.excess, data.factors, ASSETS, FACTORS,
                BetaPricingErrors.CrossSection.GLS, true);
        double[] betaTheta = beta.fixedSelection().orElseThrow().solve();
        return Stream.concat(cases.stream().flatMap(c -> Stream.of(
                Arguments.of(c, ScaledMoments.unscaled(c.family())),
                Arguments.of(c, ScaledMoments.scaled(c.family(), instruments, List.of("const", "z"))))),
                Stream.of(Arguments.of(new Case("beta pricing", beta, betaTheta), ScaledMoments.unscaled(beta))));
    }

    /** The payoffs, or an empty matrix for moments that price none (the beta-pricing system). */
    private static DMatrixRMaj payoffs(ScaledMoments model) {
        return model.fixedSelection().isPresent() ? new DMatrixRMaj(model.observations(), model.momentCount())
                : model.payoffs();
    }

    @org.junit.jupiter.api.Test
    void aWindowOfTheBetaPricingSystemIsSolvedOnItsOwnRows() {
        FamilyFixtures data = new FamilyFixtures(5, T, ASSETS.size(), FACTORS.size());
        for (BetaPricingErrors.CrossSection weighting : BetaPricingErrors.CrossSection.values()) {
            ScaledMoments model = ScaledMoments.unscaled(new BetaPricingErrors(data.excess, data.factors, ASSETS,
                    FACTORS, weighting, false));
            ScaledMoments window = model.rows(7, 31);
            FixedSelection selection = window.fixedSelection().orElseThrow();
            double[] theta = selection.solve();
            DMatrixRMaj selected = new DMatrixRMaj(theta.length, 1);
            org.ejml.dense.row.CommonOps_DDRM.mult(selection.matrix(theta), window.meanMoments(theta), selected);
            for (double value : selected.data) {
                assertThat(value).isCloseTo(0.0, within(1e-15));
            }
            double[] full = model.fixedSelection().orElseThrow().solve();
            assertThat(theta).isNotEqualTo(full);
            assertThat(window.select(IntStream.range(0, 24).toArray()).fixedSelection().orElseThrow().solve())
                    .isEqualTo(theta);
            assertThatThrownBy(model::payoffs).isInstanceOf(UnsupportedOperationException.class);
            assertThatThrownBy(() -> model.meanDiscountFactor(theta)).isInstanceOf(UnsupportedOperationException.class);
            assertThat(model.distanceMoments()).isEmpty();
            assertThatThrownBy(() -> ScaledMoments.scaled(new BetaPricingErrors(data.excess, data.factors, ASSETS,
                    FACTORS, weighting, false), instruments(T), List.of("const", "z")))
                    .isInstanceOf(IllegalArgumentException.class);
        }
    }

    private static double[][] instruments(int rows) {
        Random random = new Random(9);
        double[][] z = new double[rows][];
        for (int t = 0; t < rows; t++) {
            z[t] = new double[] {1.0, 1.0 + 0.3 * random.nextGaussian()};
        }
        return z;
    }

    @ParameterizedTest(name = "{0}, {1}")
    @MethodSource("families")
    void selectingEveryRowGivesTheModel(Case c, ScaledMoments model) {
        ScaledMoments all = model.select(IntStream.range(0, T).toArray());
        assertThat(all.observations()).isEqualTo(T);
        assertThat(all.momentNames()).isEqualTo(model.momentNames());
        assertThat(all.pricingMomentCount()).isEqualTo(model.pricingMomentCount());
        assertThat(all.contributions(c.theta()).data).isEqualTo(model.contributions(c.theta()).data);
        assertThat(payoffs(all).data).isEqualTo(payoffs(model).data);
        assertThat(all.meanJacobian(c.theta()).data).isEqualTo(model.meanJacobian(c.theta()).data);
        if (model.fixedSelection().isEmpty()) {
            assertThat(all.meanDiscountFactor(c.theta())).isEqualTo(model.meanDiscountFactor(c.theta()));
        }
    }

    @ParameterizedTest(name = "{0}, {1}")
    @MethodSource("families")
    void aWindowIsTheSelectionOfItsRangeAndTheRowsOfTheFullSample(Case c, ScaledMoments model) {
        int from = 7;
        int to = 31;
        ScaledMoments window = model.rows(from, to);
        ScaledMoments selected = model.select(IntStream.range(from, to).toArray());
        assertThat(window.observations()).isEqualTo(to - from);
        assertThat(window.contributions(c.theta()).data).isEqualTo(selected.contributions(c.theta()).data);
        assertThat(window.meanJacobian(c.theta()).data).isEqualTo(selected.meanJacobian(c.theta()).data);
        DMatrixRMaj full = model.contributions(c.theta());
        DMatrixRMaj part = window.contributions(c.theta());
        DMatrixRMaj fullPayoffs = payoffs(model);
        DMatrixRMaj partPayoffs = payoffs(window);
        for (int t = 0; t < to - from; t++) {
            for (int k = 0; k < model.momentCount(); k++) {
                assertThat(part.get(t, k)).isEqualTo(full.get(from + t, k));
                assertThat(partPayoffs.get(t, k)).isEqualTo(fullPayoffs.get(from + t, k));
            }
        }
        // The window's mean Jacobian is the mean over its rows of the full sample's per-row derivatives.
        double[][] rowDerivatives = FamilyFixtures.derivatives(c.family(), c.theta());
        if (model.momentCount() == c.family().assetNames().size()) {
            DMatrixRMaj jacobian = window.meanJacobian(c.theta());
            int width = c.family().assetNames().size();
            for (int p = 0; p < c.theta().length; p++) {
                for (int i = 0; i < width; i++) {
                    double sum = 0;
                    for (int t = from; t < to; t++) {
                        sum += rowDerivatives[p][t * width + i];
                    }
                    assertThat(jacobian.get(i, p)).isCloseTo(sum / (to - from), within(1e-15 * Math.max(1, Math.abs(sum))));
                }
            }
        }
    }

    @ParameterizedTest(name = "{0}, {1}")
    @MethodSource("families")
    void aRowChosenTwiceCountsTwice(Case c, ScaledMoments model) {
        int[] rows = {12, 3, 12, 40, 3, 12};
        ScaledMoments resample = model.select(rows);
        DMatrixRMaj full = model.contributions(c.theta());
        DMatrixRMaj drawn = resample.contributions(c.theta());
        DMatrixRMaj mean = resample.meanMoments(c.theta());
        for (int k = 0; k < model.momentCount(); k++) {
            for (int r = 0; r < rows.length; r++) {
                assertThat(drawn.get(r, k)).isEqualTo(full.get(rows[r], k));
            }
            double expected = (3 * full.get(12, k) + 2 * full.get(3, k) + full.get(40, k)) / 6;
            assertThat(mean.get(k)).isCloseTo(expected, within(1e-15 * Math.max(1, Math.abs(expected))));
        }
        // A resample of a resample picks rows of the resample.
        ScaledMoments twice = resample.select(new int[] {5, 0});
        assertThat(twice.contributions(c.theta()).data).isEqualTo(model.select(new int[] {12, 12})
                .contributions(c.theta()).data);
    }

    @org.junit.jupiter.api.Test
    void theDistanceMomentsOfAWindowAreTheWindowOfTheDistanceMoments() {
        // The demeaned form's distance moments fix μ at the sample factor means f̄ (Kan and Robotti 2009), so
        // a window takes its own f̄: cutting then taking the distance moments, or the other way round, agree.
        FamilyFixtures data = new FamilyFixtures(5, T, ASSETS.size(), FACTORS.size());
        ScaledMoments model = ScaledMoments.unscaled(new DemeanedFactorErrors(data.excess, data.factors, ASSETS,
                FACTORS));
        double[] b = {1.5, -0.7};
        MomentModel cutFirst = model.rows(7, 31).distanceMoments().orElseThrow();
        MomentModel cutLast = model.distanceMoments().orElseThrow().rows(7, 31);
        assertThat(cutFirst.contributions(b).data).isEqualTo(cutLast.contributions(b).data);
        assertThat(cutFirst.meanJacobian(b).data).isEqualTo(cutLast.meanJacobian(b).data);
        MomentModel all = model.distanceMoments().orElseThrow();
        assertThat(all.select(IntStream.range(0, T).toArray()).contributions(b).data).isEqualTo(all.contributions(b).data);
    }

    @ParameterizedTest(name = "{0}, {1}")
    @MethodSource("families")
    void rowsOutsideTheSampleAreRefused(Case c, ScaledMoments model) {
        assertThatThrownBy(() -> model.select(new int[] {0, T})).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> model.select(new int[] {-1})).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> model.select(new int[0])).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> model.rows(10, 10)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> model.rows(0, T + 1)).isInstanceOf(IllegalArgumentException.class);
    }
}
