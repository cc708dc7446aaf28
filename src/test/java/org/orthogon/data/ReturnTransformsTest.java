package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatCode;
import static org.assertj.core.api.Assertions.within;
import static org.orthogon.data.Refusals.file;
import static org.orthogon.data.Refusals.refusal;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ReturnTransformsTest {

    @TempDir
    Path dir;

    /** Checks a plausibility refusal points at a cell: file, line and the column's name. */
    private static InputException refusalAtCell(org.assertj.core.api.ThrowableAssert.ThrowingCallable call, Path file,
                                                int line, String column) {
        InputException e = refusal(call, file);
        assertThat(e.line()).as("line").isEqualTo(line);
        assertThat(e.columnName()).contains(column);
        assertThat(e.getMessage()).contains("line " + line).contains("column \"" + column + "\"");
        return e;
    }

    /**
     * Twelve Lumen portfolios over 50 years of months, with volatilities from 4% to 9% a month and
     * the fat tails of a real market: a crash month of -35% and a small-firm rebound of +160%.
     */
    private SeriesTable lumenMonthlyNet(Path file, double scale) {
        Random random = new Random(19620131L);
        int rows = 600;
        List<Period> dates = new ArrayList<>();
        int[] lines = new int[rows];
        double[][] columns = new double[12][rows];
        List<String> names = new ArrayList<>();
        for (int j = 0; j < 12; j++) {
            names.add(String.format("P%02d", j + 1));
        }
        for (int t = 0; t < rows; t++) {
            dates.add(Period.month(1970, 1).plus(t));
            lines[t] = t + 2;
            for (int j = 0; j < 12; j++) {
                columns[j][t] = 0.008 + (0.04 + 0.005 * j) * random.nextGaussian();
            }
        }
        columns[0][200] = -0.35;
        columns[0][201] = 1.6;
        columns[3][201] = 0.9;
        for (double[] c : columns) {
            for (int t = 0; t < rows; t++) {
                c[t] *= scale;
            }
        }
        SeriesTable table = new SeriesTable(file, Frequency.MONTHLY, dates, names, columns, lines);
        CsvSeries.write(table, file);
        return CsvSeries.read(file);
    }

    @Test
    void realisticMonthlyAndQuarterlyReturnsPass() {
        Path f = dir.resolve("lumen_portfolios.csv");
        SeriesTable net = lumenMonthlyNet(f, 1.0);
        assertThatCode(() -> ReturnTransforms.checkPlausible(net, ReturnKind.NET, Units.DECIMAL)).doesNotThrowAnyException();
        assertThatCode(() -> ReturnTransforms.checkPlausible(net, ReturnKind.EXCESS, Units.DECIMAL)).doesNotThrowAnyException();
        SeriesTable gross = ReturnTransforms.toGross(net, ReturnKind.NET, null);
        assertThatCode(() -> ReturnTransforms.checkPlausible(gross, ReturnKind.GROSS, Units.DECIMAL)).doesNotThrowAnyException();
        SeriesTable quarterlyGross = ReturnTransforms.compound(gross, Frequency.QUARTERLY).table();
        assertThatCode(() -> ReturnTransforms.checkPlausible(quarterlyGross, ReturnKind.GROSS, Units.DECIMAL))
                .doesNotThrowAnyException();
        double[][] q = quarterlyGross.columns();
        for (double[] c : q) {
            for (int t = 0; t < c.length; t++) {
                c[t] -= 1;
            }
        }
        SeriesTable quarterlyNet = new SeriesTable(f, Frequency.QUARTERLY, quarterlyGross.dates(),
                quarterlyGross.columnNames(), q, quarterlyGross.lineNumbers());
        assertThatCode(() -> ReturnTransforms.checkPlausible(quarterlyNet, ReturnKind.NET, Units.DECIMAL))
                .doesNotThrowAnyException();
        SeriesTable percent = lumenMonthlyNet(dir.resolve("lumen_percent.csv"), 100.0);
        assertThatCode(() -> ReturnTransforms.checkPlausible(percent, ReturnKind.NET, Units.PERCENT)).doesNotThrowAnyException();
    }

    /**
     * Real monthly index returns (DAX, SMI, CAC, FTSE, 1991-08 to 1998-07), made from R's
     * EuStockMarkets data set by src/test/resources/reference/eustockmarkets_monthly.R.
     */
    private static Path realMonthly() throws Exception {
        return Path.of(ReturnTransformsTest.class.getResource("/reference/eustockmarkets_monthly.csv").toURI());
    }

    @Test
    void realIndexReturnsPassMonthlyAndQuarterlyAndTheirPercentFormIsCaught() throws Exception {
        Path f = realMonthly();
        SeriesTable net = CsvSeries.read(f);
        assertThat(net.rows()).isEqualTo(84);
        assertThat(net.columnNames()).containsExactly("DAX", "SMI", "CAC", "FTSE");
        assertThatCode(() -> ReturnTransforms.checkPlausible(net, ReturnKind.NET, Units.DECIMAL)).doesNotThrowAnyException();
        SeriesTable gross = ReturnTransforms.toGross(net, ReturnKind.NET, null);
        CompoundedSeries quarterly = ReturnTransforms.compound(gross, Frequency.QUARTERLY);
        assertThat(quarterly.droppedPartialPeriods()).containsExactly(Period.quarter(1991, 3), Period.quarter(1998, 3));
        assertThat(quarterly.table().rows()).isEqualTo(27);
        assertThatCode(() -> ReturnTransforms.checkPlausible(quarterly.table(), ReturnKind.GROSS, Units.DECIMAL))
                .doesNotThrowAnyException();
        double[][] percent = net.columns();
        for (double[] c : percent) {
            for (int t = 0; t < c.length; t++) {
                c[t] *= 100;
            }
        }
        SeriesTable inPercent = new SeriesTable(f, Frequency.MONTHLY, net.dates(), net.columnNames(), percent,
                net.lineNumbers());
        assertThatCode(() -> ReturnTransforms.checkPlausible(inPercent, ReturnKind.NET, Units.PERCENT))
                .doesNotThrowAnyException();
        InputException asDecimal = refusal(() -> ReturnTransforms.checkPlausible(inPercent, ReturnKind.NET, Units.DECIMAL), f);
        assertThat(asDecimal.columnName()).contains("DAX");
        assertThat(asDecimal.problem()).contains("looks like percent");
        InputException asPercent = refusal(() -> ReturnTransforms.checkPlausible(net, ReturnKind.NET, Units.PERCENT), f);
        assertThat(asPercent.line()).isEqualTo(2);
        assertThat(asPercent.problem()).contains("look like decimals");
    }

    @Test
    void refusesPercentDeclaredDecimal() {
        Path f = dir.resolve("lumen_percent.csv");
        SeriesTable percent = lumenMonthlyNet(f, 100.0);
        double[] p01 = percent.column("P01");
        int first = 0;
        while (Math.abs(p01[first]) < 1.5) {
            first++;
        }
        InputException e = refusalAtCell(() -> ReturnTransforms.checkPlausible(percent, ReturnKind.NET, Units.DECIMAL),
                f, first + 2, "P01");
        assertThat(e.problem()).startsWith("the net return " + p01[first] + " looks like percent");
        assertThat(e.fix()).isEqualTo("declare units = \"percent\", or divide the column by 100");
    }

    @Test
    void refusesRiskfreeInPercentDeclaredDecimalByItsMedian() {
        Path f = file(dir, "lumen_riskfree.csv", "date,rf\n1980-01,0.9\n1980-02,0.85\n1980-03,0.19\n1980-04,0.8\n");
        SeriesTable rf = CsvSeries.read(f);
        InputException e = refusalAtCell(() -> ReturnTransforms.checkPlausibleRiskfree(rf, ReturnKind.NET, Units.DECIMAL),
                f, 2, "rf");
        assertThat(e.problem()).contains("looks like percent").contains("more than 0.2");
    }

    @Test
    void refusesDecimalDeclaredPercentButNotForANearZeroRiskfree() {
        Path f = file(dir, "lumen_riskfree.csv", "date,rf\n2010-01,0.01\n2010-02,0.012\n2010-03,0.009\n");
        SeriesTable rf = CsvSeries.read(f);
        InputException e = refusalAtCell(() -> ReturnTransforms.checkPlausible(rf, ReturnKind.NET, Units.PERCENT),
                f, 2, "rf");
        assertThat(e.problem()).contains("look like decimals");
        assertThat(e.fix()).isEqualTo("declare units = \"decimal\"");
        assertThatCode(() -> ReturnTransforms.checkPlausibleRiskfree(rf, ReturnKind.NET, Units.PERCENT))
                .doesNotThrowAnyException();
    }

    @Test
    void refusesGrossAroundOneHundredDeclaredDecimal() {
        Path f = file(dir, "g.csv", "date,P01,P02\n1970-01,1.01,0.99\n1970-02,1.02,101.2\n1970-03,0.97,99.1\n");
        SeriesTable t = CsvSeries.read(f);
        InputException e = refusalAtCell(() -> ReturnTransforms.checkPlausible(t, ReturnKind.GROSS, Units.DECIMAL),
                f, 3, "P02");
        assertThat(e.problem()).contains("101.2 looks like percent");
        assertThat(e.fix()).isEqualTo("declare units = \"percent\"");
    }

    @Test
    void refusesGrossDeclaredNet() {
        Path g = file(dir, "g2.csv", "date,P01\n1970-01,1.01\n1970-02,1.02\n1970-03,0.97\n1970-04,1.05\n");
        SeriesTable t2 = CsvSeries.read(g);
        InputException e = refusalAtCell(() -> ReturnTransforms.checkPlausible(t2, ReturnKind.NET, Units.DECIMAL),
                g, 2, "P01");
        assertThat(e.problem()).contains("looks like a gross return");
        assertThat(e.fix()).isEqualTo("declare returns_kind = \"gross\" and units = \"decimal\"");
        Path h = file(dir, "g3.csv", "date,P01\n1970-01,101\n1970-02,102\n1970-03,97\n");
        SeriesTable t3 = CsvSeries.read(h);
        assertThat(refusalAtCell(() -> ReturnTransforms.checkPlausible(t3, ReturnKind.EXCESS, Units.PERCENT),
                h, 2, "P01").fix()).isEqualTo("declare returns_kind = \"gross\" and units = \"percent\"");
    }

    @Test
    void refusesNegativeGrossAndImpossibleNetReturns() {
        Path f = file(dir, "neg.csv", "date,P01\n1970-01,1.01\n1970-02,1.02\n1970-03,-0.03\n");
        SeriesTable t = CsvSeries.read(f);
        InputException e = refusalAtCell(() -> ReturnTransforms.checkPlausible(t, ReturnKind.GROSS, Units.DECIMAL),
                f, 4, "P01");
        assertThat(e.problem()).isEqualTo("the gross return -0.03 is negative");
        assertThat(e.fix()).contains("returns_kind = \"net\"");
        Path g = file(dir, "loss.csv", "date,P01\n1970-01,0.01\n1970-02,-1.2\n1970-03,-0.03\n");
        SeriesTable n = CsvSeries.read(g);
        assertThat(refusalAtCell(() -> ReturnTransforms.checkPlausible(n, ReturnKind.NET, Units.DECIMAL), g, 3, "P01")
                .problem()).isEqualTo("the net return -1.2 is a loss of more than 100%");
    }

    @Test
    void refusesNetDeclaredGross() {
        Path f = file(dir, "n.csv", "date,P01\n1970-01,0.01\n1970-02,0.02\n1970-03,-0.03\n");
        SeriesTable t = CsvSeries.read(f);
        InputException e = refusalAtCell(() -> ReturnTransforms.checkPlausible(t, ReturnKind.GROSS, Units.DECIMAL),
                f, 2, "P01");
        assertThat(e.problem()).contains("not a plausible gross return");
        assertThat(e.fix()).contains("returns_kind = \"net\" or \"excess\"");
    }

    @Test
    void convertsPercentAndKinds() {
        Path f = file(dir, "r.csv", "date,P01,P02\n1970-01,1.5,-2\n1970-02,0.25,4\n");
        SeriesTable decimal = ReturnTransforms.toDecimal(CsvSeries.read(f), Units.PERCENT);
        assertThat(decimal.column("P01")).containsExactly(0.015, 0.0025);
        assertThat(decimal.column("P02")).containsExactly(-0.02, 0.04);
        SeriesTable gross = ReturnTransforms.toGross(decimal, ReturnKind.NET, null);
        assertThat(gross.column("P01")).containsExactly(1.015, 1.0025);
        SeriesTable fromExcess = ReturnTransforms.toGross(decimal, ReturnKind.EXCESS, new double[] {1.004, 1.005});
        assertThat(fromExcess.column("P02")[0]).isCloseTo(0.984, within(1e-15));
        assertThat(fromExcess.column("P02")[1]).isCloseTo(1.045, within(1e-15));
        SeriesTable excess = ReturnTransforms.excess(gross, new double[] {1.004, 1.005});
        assertThat(excess.column("P01")[0]).isCloseTo(0.011, within(1e-15));
        assertThat(excess.column("P01")[1]).isCloseTo(-0.0025, within(1e-15));
        assertThat(ReturnTransforms.toDecimal(decimal, Units.DECIMAL)).isSameAs(decimal);
    }

    @Test
    void refusesExcessWithoutRiskfreeOrInMixedConventions() {
        Path f = file(dir, "r.csv", "date,P01\n1970-01,0.01\n1970-02,0.02\n");
        SeriesTable t = CsvSeries.read(f);
        InputException noRf = refusal(() -> ReturnTransforms.toGross(t, ReturnKind.EXCESS, null), f);
        assertThat(noRf.fix()).contains("riskfree");
        InputException length = refusal(() -> ReturnTransforms.excess(t, new double[] {0.004}), f);
        assertThat(length.problem()).isEqualTo("the risk-free rate has 1 values but the file has 2 rows");
        SeriesTable gross = ReturnTransforms.toGross(t, ReturnKind.NET, null);
        InputException mixed = refusal(() -> ReturnTransforms.excess(gross, new double[] {0.004, 0.004}), f);
        assertThat(mixed.columnName()).contains("P01");
        assertThat(mixed.problem()).contains("not both gross or both net");
    }

    @Test
    void compoundsMonthsToQuartersAndDropsPartialEdges() {
        Path f = file(dir, "lumen_monthly_gross.csv", "date,P01,TIDE\n"
                + "1970-02,1.10,1.0\n"
                + "1970-03,0.90,1.0\n"
                + "1970-04,1.01,1.02\n"
                + "1970-05,0.98,1.00\n"
                + "1970-06,1.03,0.97\n"
                + "1970-07,1.02,1.01\n"
                + "1970-08,1.00,1.01\n"
                + "1970-09,0.95,1.01\n"
                + "1970-10,1.20,1.0\n");
        CompoundedSeries result = ReturnTransforms.compound(CsvSeries.read(f), Frequency.QUARTERLY);
        SeriesTable q = result.table();
        assertThat(q.frequency()).isEqualTo(Frequency.QUARTERLY);
        assertThat(q.dates()).containsExactly(Period.quarter(1970, 2), Period.quarter(1970, 3));
        // Hand calculation (common practice, no source): the quarter's gross return is the product
        // of its three monthly gross returns.
        // 1970Q2: 1.01 * 0.98 * 1.03 = 0.9898 * 1.03 = 1.019494; 1970Q3: 1.02 * 1.00 * 0.95 = 0.969
        assertThat(q.column("P01")[0]).isCloseTo(1.019494, within(1e-12));
        assertThat(q.column("P01")[1]).isCloseTo(0.969, within(1e-12));
        // TIDE 1970Q2: 1.02 * 1.00 * 0.97 = 0.9894; 1970Q3: 1.01^3 = 1.030301
        assertThat(q.column("TIDE")[0]).isCloseTo(0.9894, within(1e-12));
        assertThat(q.column("TIDE")[1]).isCloseTo(1.030301, within(1e-12));
        assertThat(q.lineNumbers()).containsExactly(4, 7);
        assertThat(result.droppedPartialPeriods()).containsExactly(Period.quarter(1970, 1), Period.quarter(1970, 4));
        assertThat(result.notes()).hasSize(2);
        assertThat(result.notes().get(0)).contains("dropped the partial quarterly period 1970Q1 at the start")
                .contains("2 of 3 monthly returns (1970-02 to 1970-03)");
        assertThat(result.notes().get(1)).contains("1970Q4 at the end").contains("1 of 3 monthly returns (1970-10)");
    }

    @Test
    void compoundsQuartersToYears() {
        Path f = file(dir, "q.csv", "date,cons_growth\n1990Q1,1.01\n1990Q2,1.02\n1990Q3,0.99\n1990Q4,1.00\n");
        CompoundedSeries result = ReturnTransforms.compound(CsvSeries.read(f), Frequency.ANNUAL);
        // 1.01 * 1.02 * 0.99 * 1.00 = 1.0302 * 0.99 = 1.019898 (common practice, no source)
        assertThat(result.table().column("cons_growth")[0]).isCloseTo(1.019898, within(1e-12));
        assertThat(result.table().dates()).containsExactly(Period.year(1990));
        assertThat(result.droppedPartialPeriods()).isEmpty();
        assertThat(result.notes()).isEmpty();
    }

    @Test
    void refusesIncompleteInteriorPeriod() {
        Path f = dir.resolve("holes.csv");
        List<Period> dates = List.of(Period.month(1970, 1), Period.month(1970, 2), Period.month(1970, 3),
                Period.month(1970, 4), Period.month(1970, 6), Period.month(1970, 7), Period.month(1970, 8),
                Period.month(1970, 9));
        double[][] values = {{1.01, 1.01, 1.01, 1.01, 1.01, 1.01, 1.01, 1.01}};
        SeriesTable gappy = new SeriesTable(f, Frequency.MONTHLY, dates, List.of("P01"), values,
                new int[] {2, 3, 4, 5, 6, 7, 8, 9});
        InputException e = refusal(() -> ReturnTransforms.compound(gappy, Frequency.QUARTERLY), f);
        assertThat(e.line()).isEqualTo(5);
        assertThat(e.problem()).isEqualTo("the quarterly period 1970Q2 inside the sample is incomplete: only 2 of 3"
                + " monthly returns (1970-04 to 1970-06)");
        assertThat(e.fix()).contains("add the missing rows");
    }

    @Test
    void refusesToCompoundNetReturnsOrGoFiner() {
        Path f = file(dir, "net.csv", "date,P01\n1970-01,0.01\n1970-02,0.02\n1970-03,-0.01\n");
        SeriesTable net = CsvSeries.read(f);
        InputException e = refusalAtCell(() -> ReturnTransforms.compound(net, Frequency.QUARTERLY), f, 2, "P01");
        assertThat(e.fix()).contains("convert net returns to gross first").contains("averaging");
        Path g = file(dir, "q.csv", "date,P01\n1970Q1,1.01\n1970Q2,1.02\n");
        InputException finer = refusal(() -> ReturnTransforms.compound(CsvSeries.read(g), Frequency.MONTHLY), g);
        assertThat(finer.problem()).isEqualTo("the file is quarterly and cannot be turned into monthly returns");
        Path h = file(dir, "two.csv", "date,P01\n1970-02,1.01\n1970-03,1.02\n");
        InputException none = refusal(() -> ReturnTransforms.compound(CsvSeries.read(h), Frequency.QUARTERLY), h);
        assertThat(none.problem()).isEqualTo("the file holds no complete quarterly period to compound");
    }
}
