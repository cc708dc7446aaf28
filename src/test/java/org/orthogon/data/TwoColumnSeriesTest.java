package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.orthogon.data.Refusals.file;
import static org.orthogon.data.Refusals.refusal;
import static org.orthogon.data.Refusals.refusalAt;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Two-column series files (date,value) as statistical offices publish them, on invented Lumen series. */
class TwoColumnSeriesTest {

    @TempDir
    Path dir;

    static final String DEFLATOR = """
            observation_date,lumen_deflator
            1961Q3,
            1961Q4,.
            1962Q1,100.0
            1962Q2,100.41
            1962Q3,100.97
            1962Q4,.
            """;

    @Test
    void headedFileWithMissingEdgesEqualsTheWideCsv() {
        Path f = file(dir, "lumen-deflator.csv", DEFLATOR);
        TableWithNotes read = TwoColumnSeries.read(f, null);
        SeriesTable wide = CsvSeries.read(file(dir, "wide.csv", "date,lumen_deflator\n1962Q1,100.0\n1962Q2,100.41\n"
                + "1962Q3,100.97\n"));
        assertThat(read.table().dates()).isEqualTo(wide.dates());
        assertThat(read.table().columnNames()).isEqualTo(wide.columnNames());
        assertThat(read.table().columns()).isDeepEqualTo(wide.columns());
        assertThat(read.droppedRows()).containsExactly(Period.quarter(1961, 3), Period.quarter(1961, 4),
                Period.quarter(1962, 4));
        assertThat(read.notes()).hasSize(2);
        assertThat(read.notes().get(0)).contains("the 2 rows 1961Q3 to 1961Q4 at the start").contains("lines 2-3");
        assertThat(read.notes().get(1)).contains("the row 1962Q4 at the end").contains("line 7");
        assertThat(read.table().lineOf(0)).isEqualTo(4);
    }

    @Test
    void fileWithoutHeaderIsNamedByTheCallerOrTheFile() {
        Path f = file(dir, "lumen_population.csv", "1962,1.000\n1963,1.012\n");
        assertThat(TwoColumnSeries.read(f, null).table().columnNames()).containsExactly("lumen_population");
        assertThat(TwoColumnSeries.read(f, "pop").table().columnNames()).containsExactly("pop");
        assertThat(TwoColumnSeries.read(f, "pop").table().column("pop")).containsExactly(1.000, 1.012);
    }

    @Test
    void missingInsideIsRefusedAtItsCell() {
        Path f = file(dir, "hole.csv", DEFLATOR.replace("1962Q2,100.41", "1962Q2,."));
        InputException e = refusalAt(() -> TwoColumnSeries.read(f, null), f, 5, 2);
        assertThat(e.problem()).contains("1962Q2").contains("inside the sample");
    }

    @Test
    void otherMalformedVariantsAreRefusedWhereTheyAre() {
        Path three = file(dir, "three.csv", "date,a\n1962Q1,1.0,2.0\n");
        assertThat(refusalAt(() -> TwoColumnSeries.read(three, null), three, 2, 0).problem()).contains("exactly two");
        Path badDate = file(dir, "baddate.csv", "date,a\n1962Q1,1.0\n1962Q5,1.1\n");
        refusalAt(() -> TwoColumnSeries.read(badDate, null), badDate, 3, 1);
        Path text = file(dir, "text.csv", "date,a\n1962Q1,1.0\n1962Q2,n.a.\n");
        refusalAt(() -> TwoColumnSeries.read(text, null), text, 3, 2);
        Path gap = file(dir, "gap.csv", "date,a\n1962Q1,1.0\n1962Q3,1.1\n");
        assertThat(refusalAt(() -> TwoColumnSeries.read(gap, null), gap, 3, 1).problem()).contains("missing: 1962Q2");
        Path allMissing = file(dir, "none.csv", "date,a\n1962Q1,.\n1962Q2,\n");
        assertThat(refusal(() -> TwoColumnSeries.read(allMissing, null), allMissing).problem()).contains("no row");
        Path headerOnly = file(dir, "header.csv", "date,a\n");
        refusal(() -> TwoColumnSeries.read(headerOnly, null), headerOnly);
    }
}
