package org.orthogon.bootstrap;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.junit.jupiter.api.Test;

/**
 * The Politis-White (2004) block length with the Patton-Politis-White (2009) correction against
 * {@code src/test/resources/reference/bootstrap/block_length.R}, a script written from the published
 * formulas on R's own autocovariances (stats::acf), on four seeded series: white noise, AR(1) with 0.5
 * and 0.9, MA(2).
 */
class BlockLengthRuleTest {
    private static final Path FOLDER = Path.of("src/test/resources/reference/bootstrap");

    @Test
    void agreesWithTheReferenceScriptOnEverySeries() throws IOException {
        List<String> lines = Files.readAllLines(FOLDER.resolve("block_length_series.csv"));
        int columns = lines.get(0).split(",").length;
        double[][] series = new double[columns][lines.size() - 1];
        for (int t = 1; t < lines.size(); t++) {
            String[] cells = lines.get(t).split(",");
            for (int c = 0; c < columns; c++) {
                series[c][t - 1] = Double.parseDouble(cells[c].trim());
            }
        }
        List<String> values = Files.readAllLines(FOLDER.resolve("block_length_values.csv"));
        for (int c = 0; c < columns; c++) {
            double expected = Double.parseDouble(values.get(c + 1).split(",")[1]);
            assertThat(BlockLengthRule.circularBlockLength(series[c])).as(values.get(c + 1))
                    .isCloseTo(expected, within(1e-9 * expected));
        }
        // the run's length: the columns' mean, rounded up
        int t = series[0].length;
        DMatrixRMaj contributions = new DMatrixRMaj(t, columns);
        double mean = 0.0;
        for (int c = 0; c < columns; c++) {
            for (int r = 0; r < t; r++) {
                contributions.set(r, c, series[c][r]);
            }
            mean += Double.parseDouble(values.get(c + 1).split(",")[1]) / columns;
        }
        assertThat(BlockLengthRule.choose(contributions)).isEqualTo((int) Math.ceil(mean));
    }

    @Test
    void aConstantColumnIsSkippedAndNoVariationGivesBlocksOfOne() {
        assertThat(BlockLengthRule.circularBlockLength(new double[50])).isNaN();
        assertThat(BlockLengthRule.choose(new DMatrixRMaj(50, 3))).isEqualTo(1);
    }

    @Test
    void flatTopWindowIsOneThenFallsLinearly() {
        // Politis and Romano (1995): λ(s) = 1 on |s| < 1/2, 2(1 - |s|) on 1/2 ≤ |s| ≤ 1, 0 beyond
        assertThat(BlockLengthRule.flatTop(0.3)).isEqualTo(1.0);
        assertThat(BlockLengthRule.flatTop(-0.75)).isCloseTo(0.5, within(1e-15));
        assertThat(BlockLengthRule.flatTop(1.2)).isEqualTo(0.0);
    }
}
