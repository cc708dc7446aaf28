package org.orthogon.demo;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.data.CsvSeries;
import org.orthogon.data.Period;
import org.orthogon.data.SectionedTables;
import org.orthogon.data.SeriesTable;
import org.orthogon.data.SeriesTransforms;
import org.orthogon.data.TableWithNotes;
import org.orthogon.data.TwoColumnSeries;

/**
 * The extension files of demo-data/ equal the simulator's output, and the importers and transforms
 * turn them back into the series of the original files: the multi-section file into the wide
 * portfolio file, nominal levels into real per-capita growth, nominal into real wealth returns.
 * Tolerances come from the six-decimal rounding of every written value (DemoData).
 */
class DemoExtensionsTest {
    private static final Path DEMO = Paths.get("demo-data");

    @Test
    void shippedExtensionFilesEqualTheSimulatorOutput(@TempDir Path folder) throws IOException {
        DemoData.writeExtensions(LumenEconomy.standard(), LumenSimulator.demo(), LumenSimulator.DEMO_SEED, folder);
        for (String name : DemoData.EXTENSION_FILES) {
            assertThat(Files.readString(folder.resolve(name)))
                    .as("demo-data/%s must equal DemoData.writeExtensions output", name)
                    .isEqualTo(Files.readString(DEMO.resolve(name)));
        }
    }

    @Test
    void sectionedFileHoldsThePortfolioReturnsInPercent() {
        SeriesTable wide = CsvSeries.read(DEMO.resolve(DemoData.PORTFOLIOS));
        TableWithNotes monthly = SectionedTables.read(DEMO.resolve(DemoData.PORTFOLIO_SECTIONS),
                "Lumen size/tide portfolios, value-weighted monthly returns");
        assertThat(monthly.droppedRows()).isEmpty();
        assertThat(monthly.table().dates()).isEqualTo(wide.dates());
        assertThat(monthly.table().columnNames()).isEqualTo(wide.columnNames());
        double[][] percent = monthly.table().columns();
        double[][] decimal = wide.columns();
        for (int j = 0; j < decimal.length; j++) {
            for (int t = 0; t < decimal[j].length; t++) {
                assertThat(percent[j][t] / 100).isCloseTo(decimal[j][t], within(1e-15));
            }
        }
        SeriesTable annual = SectionedTables.read(DEMO.resolve(DemoData.PORTFOLIO_SECTIONS), "2").table();
        assertThat(annual.rows()).isEqualTo(63);
        // The annual return is the product of the year's monthly gross returns (common practice, no source).
        double gross = 1.0;
        for (int t = 0; t < 12; t++) {
            gross *= 1 + decimal[0][t];
        }
        assertThat(annual.column("S1T1")[0] / 100).isCloseTo(gross - 1, within(1e-5));
    }

    @Test
    void levelsGiveBackTheRealPerCapitaConsumptionGrowth() {
        SeriesTable levels = CsvSeries.read(DEMO.resolve(DemoData.MACRO_LEVELS));
        TableWithNotes growth = SeriesTransforms.perCapitaGrowth(levels, "cons_nominal", "population", "deflator",
                "cons_growth");
        SeriesTable shipped = CsvSeries.read(DEMO.resolve(DemoData.CONSUMPTION));
        assertThat(growth.table().dates()).isEqualTo(shipped.dates());
        double[] rebuilt = growth.table().column("cons_growth");
        double[] original = shipped.column("cons_growth");
        for (int t = 0; t < original.length; t++) {
            // Three rounded levels at each end: a few parts in 1e6 at most.
            assertThat(rebuilt[t]).isCloseTo(original[t], within(5e-6));
        }
    }

    @Test
    void nominalWealthReturnsDeflateToTheRealOnes() {
        SeriesTable wealth = CsvSeries.read(DEMO.resolve(DemoData.WEALTH));
        TableWithNotes deflator = TwoColumnSeries.read(DEMO.resolve(DemoData.DEFLATOR_SERIES), null);
        assertThat(deflator.droppedRows()).containsExactly(Period.quarter(2025, 1));
        TableWithNotes real = SeriesTransforms.realReturns(wealth.select(List.of("wealth_nominal")), deflator.table(),
                "deflator");
        assertThat(real.droppedRows()).isEmpty();
        double[] rebuilt = real.table().column("wealth_nominal");
        double[] original = wealth.column("wealth_return");
        for (int t = 0; t < original.length; t++) {
            assertThat(rebuilt[t]).isCloseTo(original[t], within(5e-6));
        }
    }
}
