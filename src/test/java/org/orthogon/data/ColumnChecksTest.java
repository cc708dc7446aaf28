package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatCode;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** The independence check names the first column that is a combination of the ones before it. */
class ColumnChecksTest {

    private static SeriesTable table(double[][] columns) {
        int rows = columns[0].length;
        List<Period> dates = new ArrayList<>();
        int[] lines = new int[rows];
        Period first = Period.parse("1962-01");
        for (int t = 0; t < rows; t++) {
            dates.add(first.plus(t));
            lines[t] = t + 2;
        }
        List<String> names = new ArrayList<>();
        for (int j = 0; j < columns.length; j++) {
            names.add("P" + (j + 1));
        }
        return new SeriesTable(Path.of("returns.csv"), Frequency.MONTHLY, dates, names, columns, lines);
    }

    private static double[][] independent(int count, int rows, long seed) {
        Random random = new Random(seed);
        double[][] columns = new double[count][rows];
        for (double[] column : columns) {
            for (int t = 0; t < rows; t++) {
                column[t] = 0.01 + 0.05 * random.nextGaussian();
            }
        }
        return columns;
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 7, 18, 29})
    void namesTheFirstDependentColumnWhereverItIs(int dependent) {
        // column `dependent` (0-based) = column 0 - 2 * column 1 (a long-short portfolio of two others),
        // and the last column repeats column 3; the first of the two must be named
        double[][] columns = independent(30, 120, 7L + dependent);
        for (int t = 0; t < 120; t++) {
            if (dependent > 1) {
                columns[dependent][t] = columns[0][t] - 2 * columns[1][t];
            } else {
                columns[dependent][t] = 3 * columns[0][t];
            }
            columns[29][t] = columns[dependent == 29 ? 4 : 3][t];
        }
        if (dependent == 29) {
            for (int t = 0; t < 120; t++) {
                columns[29][t] = columns[0][t] - 2 * columns[1][t];
            }
        }
        InputException e = catchThrowableOfType(() -> ColumnChecks.requireIndependent(table(columns), "test-asset"),
                InputException.class);
        assertThat(e).isNotNull();
        assertThat(e.getMessage()).contains("\"P" + (dependent + 1) + "\" is (up to rounding) a linear combination");
    }

    @ParameterizedTest
    @ValueSource(ints = {2, 30, 100})
    void independentColumnsPass(int count) {
        assertThatCode(() -> ColumnChecks.requireIndependent(table(independent(count, 240, count)), "test-asset"))
                .doesNotThrowAnyException();
    }

    @ParameterizedTest
    @ValueSource(ints = {5})
    void moreColumnsThanRowsNameTheFirstColumnBeyondTheRows(int rows) {
        InputException e = catchThrowableOfType(() -> ColumnChecks.requireIndependent(table(independent(8, rows, 3L)),
                "test-asset"), InputException.class);
        assertThat(e.getMessage()).contains("\"P6\"");
    }
}
