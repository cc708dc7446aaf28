package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.orthogon.data.Refusals.file;
import static org.orthogon.data.Refusals.refusal;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AlignmentTest {

    @TempDir
    Path dir;

    Path returnsFile;
    Path riskfreeFile;
    Path factorsFile;

    /** Monthly series from {@code first} for {@code n} months, values 1, 2, 3, ... for easy checking. */
    private Path monthly(String name, String column, Period first, int n, double offset) {
        StringBuilder csv = new StringBuilder("date," + column + "\n");
        for (int t = 0; t < n; t++) {
            csv.append(first.plus(t).label()).append(',').append(offset + t).append('\n');
        }
        return file(dir, name, csv.toString());
    }

    @BeforeEach
    void files() {
        returnsFile = monthly("lumen_portfolios.csv", "P01", Period.month(1970, 1), 12, 100);
        riskfreeFile = monthly("lumen_riskfree.csv", "rf", Period.month(1969, 6), 20, 200);
        factorsFile = monthly("lumen_factors.csv", "MKT", Period.month(1970, 3), 16, 300);
    }

    private List<SeriesTable> tables() {
        return List.of(CsvSeries.read(returnsFile), CsvSeries.read(riskfreeFile), CsvSeries.read(factorsFile));
    }

    @Test
    void commonSampleIsTheOverlapAndNamesTheLimitingFiles() {
        AlignedSample sample = Alignment.align(tables(), null, null);
        assertThat(sample.dates()).hasSize(10);
        assertThat(sample.dates().get(0)).isEqualTo(Period.month(1970, 3));
        assertThat(sample.dates().get(9)).isEqualTo(Period.month(1970, 12));
        assertThat(sample.rows()).isEqualTo(10);
        // returns start 1970-01 (value 100), so 1970-03 is 102; rf starts 1969-06 (200), 1970-03 is 209
        assertThat(sample.tables().get(0).column("P01")).startsWith(102.0, 103.0).endsWith(111.0);
        assertThat(sample.tables().get(1).column("rf")).startsWith(209.0).endsWith(218.0);
        assertThat(sample.tables().get(2).column("MKT")).startsWith(300.0).endsWith(309.0);
        assertThat(sample.tables().get(1).lineNumbers()[0]).isEqualTo(11);
        assertThat(sample.notes()).containsExactly(
                "the files share dates from 1970-03, the first date of " + factorsFile.getFileName() + " (the latest-starting file)",
                "the files share dates to 1970-12, the last date of " + returnsFile.getFileName() + " (the earliest-ending file)");
    }

    @Test
    void boundsNarrowTheSampleAndMayBeWrittenAtAnotherFrequency() {
        AlignedSample sample = Alignment.align(tables(), Period.parse("1970Q2"), Period.parse("1970-08"));
        assertThat(sample.dates()).extracting(Period::label).containsExactly("1970-04", "1970-05", "1970-06", "1970-07", "1970-08");
        assertThat(sample.tables().get(0).column("P01")).containsExactly(103.0, 104.0, 105.0, 106.0, 107.0);
        assertThat(sample.notes()).containsExactly("sample starts 1970-04, as requested", "sample ends 1970-08, as requested");
    }

    @Test
    void refusesABoundOutsideAFile() {
        InputException e = refusal(() -> Alignment.align(tables(), Period.month(1970, 1), null), factorsFile);
        assertThat(e.problem()).isEqualTo("the requested sample start 1970-01 lies outside this file's dates, which run"
                + " from 1970-03 to 1971-06");
        assertThat(e.fix()).contains("between 1970-03 and 1971-06");
        InputException end = refusal(() -> Alignment.align(tables(), null, Period.month(1971, 3)), returnsFile);
        assertThat(end.problem()).contains("end 1971-03").contains("from 1970-01 to 1970-12");
    }

    @Test
    void refusesMixedFrequenciesNamingBothFilesAndSuggestingCompounding() {
        Path quarterly = file(dir, "lumen_consumption.csv", "date,cons_growth\n1970Q1,1.01\n1970Q2,1.0\n");
        List<SeriesTable> mixed = List.of(CsvSeries.read(returnsFile), CsvSeries.read(quarterly));
        InputException e = refusal(() -> Alignment.align(mixed, null, null), quarterly);
        assertThat(e.problem()).isEqualTo("this file is quarterly but " + returnsFile + " is monthly; files of different"
                + " frequencies are not aligned silently");
        assertThat(e.fix()).contains("bring " + returnsFile + " to quarterly first: compound its gross returns")
                .contains("never averaged");
    }

    @Test
    void refusesAnEmptyOverlap() {
        Path late = monthly("late.csv", "TIDE", Period.month(1975, 1), 3, 0);
        List<SeriesTable> apart = List.of(CsvSeries.read(returnsFile), CsvSeries.read(late));
        InputException e = refusal(() -> Alignment.align(apart, null, null), late);
        assertThat(e.problem()).isEqualTo("the files have no date in common: this file starts at 1975-01, after "
                + returnsFile + " ends at 1970-12");
    }

    @Test
    void refusesReversedBounds() {
        InputException e = org.assertj.core.api.Assertions.catchThrowableOfType(InputException.class,
                () -> Alignment.align(tables(), Period.month(1970, 8), Period.month(1970, 4)));
        assertThat(e.problem()).isEqualTo("the sample start 1970-08 is after the sample end 1970-04");
        assertThat(e.fix()).isNotBlank();
    }
}
