package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;
import static org.orthogon.data.Refusals.file;
import static org.orthogon.data.Refusals.refusal;
import static org.orthogon.data.Refusals.refusalAt;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SeriesTransformsTest {

    @TempDir
    Path dir;

    @Test
    void realReturnsDeflateByThePriceLevelChange() {
        // Fisher (1930), from memory: 1 + r_real = (1 + r_nominal) P_{t-1} / P_t.
        Path returns = file(dir, "nominal.csv", "date,WEALTH,S1T1\n1962Q1,1.02,1.05\n1962Q2,0.99,1.01\n1962Q3,1.03,1.00\n");
        Path prices = file(dir, "deflator.csv", "date,P\n1962Q1,100\n1962Q2,101\n1962Q3,100.5\n");
        TableWithNotes real = SeriesTransforms.realReturns(CsvSeries.read(returns), CsvSeries.read(prices), "P");
        // 1962Q1 has no deflator for 1961Q4: dropped at the start.
        assertThat(real.droppedRows()).containsExactly(Period.quarter(1962, 1));
        assertThat(real.notes()).singleElement().asString().contains("1962Q1").contains("start");
        assertThat(real.table().dates()).containsExactly(Period.quarter(1962, 2), Period.quarter(1962, 3));
        assertThat(real.table().column("WEALTH")[0]).isCloseTo(0.99 * 100 / 101, within(1e-15));
        assertThat(real.table().column("S1T1")[1]).isCloseTo(1.00 * 101 / 100.5, within(1e-15));
        assertThat(real.table().lineOf(0)).isEqualTo(3);
    }

    @Test
    void realReturnsRefuseNetReturnsMismatchedFrequencyAndBadDeflators() {
        Path net = file(dir, "net.csv", "date,A\n1962Q1,0.02\n1962Q2,0.01\n");
        Path prices = file(dir, "p.csv", "date,P\n1962Q1,100\n1962Q2,0\n");
        Path monthly = file(dir, "m.csv", "date,P\n1962-01,100\n1962-02,101\n");
        Path gross = file(dir, "g.csv", "date,A\n1962Q1,1.02\n1962Q2,1.01\n");
        assertThat(refusal(() -> SeriesTransforms.realReturns(CsvSeries.read(net), CsvSeries.read(prices), "P"), net)
                .problem()).contains("gross return");
        assertThat(refusal(() -> SeriesTransforms.realReturns(CsvSeries.read(gross), CsvSeries.read(monthly), "P"),
                monthly).problem()).contains("monthly");
        assertThat(refusalAt(() -> SeriesTransforms.realReturns(CsvSeries.read(gross), CsvSeries.read(prices), "P"),
                prices, 3, 0).problem()).contains("not positive");
    }

    @Test
    void perCapitaRealGrowthFromLevels() {
        // g_t = (C_t/(N_t P_t)) / (C_{t-1}/(N_{t-1} P_{t-1})), common practice, no source; numbers by hand.
        Path levels = file(dir, "levels.csv", "date,cons,pop,P\n1962Q1,1000,10,100\n1962Q2,1030,10.1,101\n"
                + "1962Q3,1050,10.2,101\n");
        SeriesTable table = CsvSeries.read(levels);
        TableWithNotes real = SeriesTransforms.perCapitaGrowth(table, "cons", "pop", "P", "cons_growth");
        assertThat(real.table().columnNames()).containsExactly("cons_growth");
        assertThat(real.table().dates()).containsExactly(Period.quarter(1962, 2), Period.quarter(1962, 3));
        assertThat(real.table().column("cons_growth")[0]).isCloseTo((1030 / 10.1 / 101) / (1000 / 10.0 / 100),
                within(1e-15));
        assertThat(real.table().column("cons_growth")[1]).isCloseTo((1050 / 10.2) / (1030 / 10.1), within(1e-15));
        assertThat(real.droppedRows()).containsExactly(Period.quarter(1962, 1));
        TableWithNotes aggregate = SeriesTransforms.perCapitaGrowth(table, "cons", null, null, "g");
        assertThat(aggregate.table().column("g")[0]).isCloseTo(1.03, within(1e-15));
        Path zero = file(dir, "zero.csv", "date,cons\n1962Q1,1000\n1962Q2,0\n");
        refusal(() -> SeriesTransforms.perCapitaGrowth(CsvSeries.read(zero), "cons", null, null, "g"), zero);
        refusal(() -> SeriesTransforms.perCapitaGrowth(table, "consumption", null, null, "g"), levels);
    }

    @Test
    void lagsAndLeadsDropTheRowsThatFallOffAndKeepTheSourceLines() {
        Path f = file(dir, "z.csv", "date,z_growth\n1970-01,0.1\n1970-02,0.2\n1970-03,0.3\n1970-04,0.4\n");
        SeriesTable z = CsvSeries.read(f);
        TableWithNotes lag = SeriesTransforms.shift(z, 1);
        assertThat(lag.table().dates()).containsExactly(Period.month(1970, 2), Period.month(1970, 3),
                Period.month(1970, 4));
        assertThat(lag.table().column("z_growth")).containsExactly(0.1, 0.2, 0.3);
        assertThat(lag.table().lineOf(0)).isEqualTo(2);
        assertThat(lag.droppedRows()).containsExactly(Period.month(1970, 1));
        assertThat(lag.notes()).singleElement().asString().contains("lag of 1 period").contains("start");
        TableWithNotes lead = SeriesTransforms.shift(z, -2);
        assertThat(lead.table().dates()).containsExactly(Period.month(1970, 1), Period.month(1970, 2));
        assertThat(lead.table().column("z_growth")).containsExactly(0.3, 0.4);
        assertThat(lead.droppedRows()).containsExactly(Period.month(1970, 3), Period.month(1970, 4));
        assertThat(lead.notes()).singleElement().asString().contains("1970-03 to 1970-04 (2 rows) at the end");
        assertThat(SeriesTransforms.shift(z, 0).table()).isEqualTo(z);
        refusal(() -> SeriesTransforms.shift(z, 4), f);
    }
}
