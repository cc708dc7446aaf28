package org.orthogon.moments;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;
import static org.assertj.core.api.Assertions.within;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

class ExpressionSdfErrorsTest {
    private static final List<String> ASSETS = List.of("S1T1", "S2T2", "S3T3", "S3T4");

    private static ExpressionSdfErrors powerFormula(FamilyFixtures data, String formula) {
        Map<String, double[]> columns = new LinkedHashMap<>();
        columns.put("cons_growth", data.growth);
        columns.put("RF", data.riskfree);
        return new ExpressionSdfErrors(formula, List.of("beta", "gamma"), columns, data.gross, ASSETS,
                Payoff.GROSS);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1L, 2L, 3L})
    void powerUtilityWrittenAsAFormulaEqualsTheBuiltInFamily(long seed) {
        // Same SDF β g^{-γ} (Hansen and Singleton 1982): the two must agree to 1e-10 (issue 5).
        FamilyFixtures data = new FamilyFixtures(seed, 80, 4, 1);
        ExpressionSdfErrors formula = powerFormula(data, "beta * cons_growth^(-gamma)");
        PowerUtilityErrors builtIn = new PowerUtilityErrors(data.gross, data.growth, ASSETS);
        double[] theta = {0.97 + 0.01 * seed, 2.0 + 3 * seed};
        assertThat(FamilyFixtures.maxDifference(FamilyFixtures.errors(formula, theta),
                FamilyFixtures.errors(builtIn, theta))).isLessThan(1e-10);
        // Numerical derivatives of the formula against the analytic ones of the built-in family.
        double[][] numeric = FamilyFixtures.derivatives(formula, theta);
        double[][] analytic = FamilyFixtures.derivatives(builtIn, theta);
        for (int p = 0; p < 2; p++) {
            for (int j = 0; j < numeric[p].length; j++) {
                assertThat(numeric[p][j]).isCloseTo(analytic[p][j], within(1e-6 * Math.max(1, Math.abs(analytic[p][j]))));
            }
        }
        DataCheck.sameMoments(ScaledMoments.unscaled(formula), ScaledMoments.unscaled(builtIn), theta);
        assertThat(formula.dataColumnsUsed()).containsExactly("cons_growth");
        assertThat(formula.isLinear()).isFalse();
    }

    @Test
    void excessPayoffsHavePriceZeroAndMatchTheLinearFamily() {
        FamilyFixtures data = new FamilyFixtures(9L, 50, 4, 2);
        double[] mkt = new double[50];
        double[] size = new double[50];
        for (int t = 0; t < 50; t++) {
            mkt[t] = data.factors[t][0];
            size[t] = data.factors[t][1];
        }
        Map<String, double[]> columns = new LinkedHashMap<>();
        columns.put("MKT", mkt);
        columns.put("SIZE", size);
        ExpressionSdfErrors formula = new ExpressionSdfErrors("1 - b_MKT*MKT - b_SIZE*SIZE", List.of("b_MKT", "b_SIZE"),
                columns, data.excess, ASSETS, Payoff.EXCESS);
        double[] b = {2.2, 1.7};
        double[] expected = FamilyFixtures.errors(new LinearFactorErrors(data.excess, data.factors, ASSETS,
                List.of("MKT", "SIZE")), b);
        assertThat(FamilyFixtures.maxDifference(FamilyFixtures.errors(formula, b), expected)).isLessThan(1e-15);
    }

    @Test
    void unknownNamesAreReportedWithTheirPosition() {
        FamilyFixtures data = new FamilyFixtures(10L, 5, 4, 1);
        ExpressionSdfErrors.ExpressionException e = catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> powerFormula(data, "beta * cons_grwth^(-gamma)"));
        assertThat(e.name()).isEqualTo("cons_grwth");
        // "beta * " is 7 characters, so the name starts at character 8.
        assertThat(e.position()).isEqualTo(8);
        assertThat(e.getMessage()).contains("unknown name \"cons_grwth\" at character 8")
                .contains("cons_growth").contains("beta, gamma");
    }

    @Test
    void unknownFunctionsAreToldApartFromUnknownNames() {
        FamilyFixtures data = new FamilyFixtures(13L, 5, 4, 1);
        ExpressionSdfErrors.ExpressionException e = catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> powerFormula(data, "beta * exp(-gamma * ln(cons_growth))"));
        assertThat(e.name()).isEqualTo("ln");
        assertThat(e.position()).isEqualTo(21);
        assertThat(e.getMessage()).contains("unknown function \"ln\" at character 21").contains("logarithm is log");
        // With log it is the power-utility SDF again (Hansen and Singleton 1982).
        ExpressionSdfErrors fixed = powerFormula(data, "beta * exp(-gamma * log(cons_growth))");
        double[] theta = {0.99, 4.0};
        assertThat(FamilyFixtures.maxDifference(FamilyFixtures.errors(fixed, theta),
                FamilyFixtures.errors(new PowerUtilityErrors(data.gross, data.growth, ASSETS), theta))).isLessThan(1e-12);
    }

    @Test
    void nothingButArithmeticCanRun() {
        FamilyFixtures data = new FamilyFixtures(11L, 5, 4, 1);
        ExpressionSdfErrors.ExpressionException e = catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> powerFormula(data, "beta * java.lang.System.exit(1) + gamma"));
        assertThat(e).isNotNull();
        assertThat(e.getMessage()).contains("beta * java.lang.System.exit(1) + gamma");
    }

    @Test
    void malformedOrAmbiguousFormulasAreRefused() {
        FamilyFixtures data = new FamilyFixtures(12L, 5, 4, 1);
        assertThat(catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> powerFormula(data, "beta * (cons_growth^(-gamma)")).getMessage()).contains("cannot be");
        assertThat(catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> powerFormula(data, "beta * cons_growth^(-2)")).getMessage())
                .contains("\"gamma\" does not occur");
        assertThat(catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> powerFormula(data, "beta cons_growth^(-gamma)"))).isNotNull();
        assertThat(catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> powerFormula(data, "  ")).getMessage()).contains("empty");
        Map<String, double[]> clash = Map.of("beta", data.growth);
        assertThat(catchThrowableOfType(ExpressionSdfErrors.ExpressionException.class,
                () -> new ExpressionSdfErrors("beta * gamma", List.of("beta", "gamma"), clash, data.gross, ASSETS,
                        Payoff.GROSS)).getMessage()).contains("both a parameter and a data column");
    }

    /** Comparison of two moment models' contributions. */
    static final class DataCheck {
        static void sameMoments(MomentModel a, MomentModel b, double[] theta) {
            assertThat(a.momentNames()).isEqualTo(b.momentNames());
            double[] x = a.contributions(theta).data;
            double[] y = b.contributions(theta).data;
            assertThat(FamilyFixtures.maxDifference(x, y)).isLessThan(1e-10);
        }
    }
}
