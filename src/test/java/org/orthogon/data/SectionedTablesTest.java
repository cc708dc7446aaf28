package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.orthogon.data.Refusals.file;
import static org.orthogon.data.Refusals.refusal;
import static org.orthogon.data.Refusals.refusalAt;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The multi-section layout of research data libraries, on invented Lumen Exchange files. Each layout
 * variant must load to the same dates, names and numbers as the plain wide CSV with the same values
 * (issue 5 acceptance); each malformed variant is refused naming file, line and column.
 */
class SectionedTablesTest {

    @TempDir
    Path dir;

    /** Whitespace-separated, two tables, a preamble, a missing code at the start of the first table. */
    static final String SPACED = """
            This file was created by the Lumen Exchange research desk from its 2025 tape.
            Returns are in percent. Missing values are written -99.99 or -999.
              Portfolios: 3 size groups x 4 tide groups (2 shown here).

            Lumen size/tide portfolios, value-weighted monthly returns
                    S1T1    S1T2    S2T1
            196112  -99.99    0.50    0.40
            196201    1.23   -0.45    0.80
            196202    0.87    2.10   -1.10
            196203   -2.50    0.05    0.33

            Lumen size/tide portfolios, value-weighted annual returns
                    S1T1    S1T2    S2T1
            1962     10.52    8.31    6.02
            1963     -4.10   12.00    3.25
              Copyright 2025 Lumen Exchange
            """;

    /** The same numbers as a comma-separated export: date label in the header, padded title. */
    static final String COMMA = """
            Lumen Exchange research desk, 2025 tape
            Returns in percent, -99.99 = missing

            "Lumen size/tide portfolios, value-weighted monthly returns",,,
            date,S1T1,S1T2,S2T1
            196112,-99.99,0.50,0.40
            196201,1.23,-0.45,0.80
            196202,0.87,2.10,-1.10
            196203,-2.50,0.05,0.33

            Lumen size/tide portfolios, value-weighted annual returns,,,
            ,S1T1,S1T2,S2T1
            1962,10.52,8.31,6.02
            1963,-4.10,12.00,3.25
            """;

    static final String WIDE_MONTHLY = """
            date,S1T1,S1T2,S2T1
            1962-01,1.23,-0.45,0.80
            1962-02,0.87,2.10,-1.10
            1962-03,-2.50,0.05,0.33
            """;

    @Test
    void whitespaceLayoutByTitleEqualsTheWideCsv() {
        Path f = file(dir, "lumen-portfolios.txt", SPACED);
        TableWithNotes read = SectionedTables.read(f, "lumen size/tide portfolios,  value-weighted MONTHLY returns");
        assertSameValues(read.table(), CsvSeries.read(file(dir, "wide.csv", WIDE_MONTHLY)));
        assertThat(read.table().frequency()).isEqualTo(Frequency.MONTHLY);
        // The row 196112 has a missing code in S1T1 at the start: dropped and reported.
        assertThat(read.droppedRows()).containsExactly(Period.month(1961, 12));
        assertThat(read.notes()).singleElement().asString().contains("196112").contains("start").contains("line 7");
        assertThat(read.table().lineOf(0)).isEqualTo(8);
    }

    @Test
    void commaLayoutEqualsTheWhitespaceLayoutTableByTable() {
        Path spaced = file(dir, "spaced.txt", SPACED);
        Path comma = file(dir, "comma.csv", COMMA);
        for (String which : List.of("1", "2")) {
            assertSameValues(SectionedTables.read(comma, which).table(), SectionedTables.read(spaced, which).table());
        }
        SeriesTable annual = SectionedTables.read(comma, "Lumen size/tide portfolios, value-weighted annual returns").table();
        assertThat(annual.frequency()).isEqualTo(Frequency.ANNUAL);
        assertThat(annual.dates()).containsExactly(Period.year(1962), Period.year(1963));
        assertThat(annual.column("S1T2")).containsExactly(8.31, 12.00);
        assertThat(SectionedTables.tables(comma)).extracting(SectionedTables.TableInfo::title).containsExactly(
                "Lumen size/tide portfolios, value-weighted monthly returns",
                "Lumen size/tide portfolios, value-weighted annual returns");
        assertThat(SectionedTables.tables(spaced).get(1)).isEqualTo(new SectionedTables.TableInfo(2,
                "Lumen size/tide portfolios, value-weighted annual returns", 12, 13, 14, 15));
    }

    @Test
    void missingCodeAtTheEndIsDroppedAndMinus999IsACodeToo() {
        Path f = file(dir, "end.txt", """
                Lumen tide portfolios, annual
                     T1      T2
                1990   5.0     6.0
                1991   4.0     3.0
                1992   -999    2.0
                """);
        TableWithNotes read = SectionedTables.read(f, "1");
        assertThat(read.table().dates()).containsExactly(Period.year(1990), Period.year(1991));
        assertThat(read.droppedRows()).containsExactly(Period.year(1992));
        assertThat(read.notes()).singleElement().asString().contains("end");
    }

    @Test
    void unknownTitleSuggestsTheClosestAndListsTheTables() {
        Path f = file(dir, "lumen.txt", SPACED);
        InputException e = refusal(() -> SectionedTables.read(f, "Lumen size/tide portfolios, value-weighted monthly return"), f);
        assertThat(e.fix()).contains("did you mean \"Lumen size/tide portfolios, value-weighted monthly returns\"")
                .contains("2 = \"Lumen size/tide portfolios, value-weighted annual returns\" (line 12)");
        assertThat(refusal(() -> SectionedTables.read(f, "3"), f).problem()).contains("no table 3");
    }

    @Test
    void missingCodeInsideATableIsRefusedAtItsCell() {
        Path f = file(dir, "hole.txt", SPACED.replace("196202    0.87    2.10", "196202    0.87  -99.99"));
        InputException e = refusalAt(() -> SectionedTables.read(f, "1"), f, 9, 3);
        assertThat(e.problem()).contains("missing value").contains("inside the sample");
    }

    @Test
    void raggedRowIsRefused() {
        Path f = file(dir, "ragged.txt", SPACED.replace("196202    0.87    2.10   -1.10", "196202    0.87    2.10"));
        InputException e = refusal(() -> SectionedTables.read(f, "1"), f);
        assertThat(e.line()).isEqualTo(9);
        assertThat(e.column()).isEqualTo(4);
        assertThat(e.problem()).contains("3 cells").contains("needs 4");
    }

    @Test
    void truncatedDownloadIsRefused() {
        // The file ends in the middle of a row of the second table.
        String cut = SPACED.substring(0, SPACED.indexOf("1963     -4.10") + "1963     -4.10".length());
        Path f = file(dir, "cut.txt", cut);
        InputException e = refusal(() -> SectionedTables.read(f, "2"), f);
        assertThat(e.line()).isEqualTo(15);
        assertThat(e.fix()).contains("truncated");
        // A title whose table is gone entirely.
        Path g = file(dir, "gone.txt", SPACED.substring(0, SPACED.indexOf("        S1T1    S1T2    S2T1\n1962")));
        InputException gone = refusal(() -> SectionedTables.read(g, "Lumen size/tide portfolios, value-weighted annual returns"), g);
        assertThat(gone.line()).isEqualTo(12);
        assertThat(gone.problem()).contains("no table");
    }

    @Test
    void badDatesAreRefusedAtTheDateCell() {
        Path f = file(dir, "baddate.txt", SPACED.replace("196202 ", "196213 "));
        refusalAt(() -> SectionedTables.read(f, "1"), f, 9, 1);
        Path g = file(dir, "dashdate.txt", COMMA.replace("196202,", "1962-02,"));
        InputException e = refusalAt(() -> SectionedTables.read(g, "1"), g, 8, 1);
        assertThat(e.getMessage()).contains("YYYY-MM");
        Path h = file(dir, "gap.txt", SPACED.replace("196202 ", "196205 "));
        assertThat(refusal(() -> SectionedTables.read(h, "1"), h).problem()).contains("not sorted");
    }

    @Test
    void duplicateTitlesAreRefusedNamingBothLines() {
        Path f = file(dir, "dup.txt", SPACED.replace("value-weighted annual", "value-weighted monthly"));
        InputException e = refusalAt(() -> SectionedTables.read(f, "1"), f, 12, 0);
        assertThat(e.problem()).contains("lines 5 and 12");
    }

    @Test
    void dataWithoutHeaderOrTitleIsRefused() {
        Path noHeader = file(dir, "noheader.txt", "Lumen returns\n\n196201 1.0 2.0\n196202 1.5 2.5\n");
        refusalAt(() -> SectionedTables.tables(noHeader), noHeader, 3, 0);
        Path noTitle = file(dir, "notitle.txt", "   S1T1 S1T2\n196201 1.0 2.0\n");
        refusalAt(() -> SectionedTables.tables(noTitle), noTitle, 1, 0);
        Path nothing = file(dir, "prose.txt", "Just a description of the Lumen Exchange.\n");
        refusal(() -> SectionedTables.tables(nothing), nothing);
    }

    @Test
    void nonNumericCellIsRefusedAtItsColumn() {
        Path f = file(dir, "text.txt", SPACED.replace("0.87    2.10", "0.87    2.1O"));
        refusalAt(() -> SectionedTables.read(f, "1"), f, 9, 3);
    }

    static void assertSameValues(SeriesTable actual, SeriesTable expected) {
        assertThat(actual.dates()).isEqualTo(expected.dates());
        assertThat(actual.columnNames()).isEqualTo(expected.columnNames());
        assertThat(actual.columns()).isDeepEqualTo(expected.columns());
    }
}
