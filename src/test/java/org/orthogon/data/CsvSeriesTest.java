package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.orthogon.data.Refusals.file;
import static org.orthogon.data.Refusals.refusal;
import static org.orthogon.data.Refusals.refusalAt;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

class CsvSeriesTest {

    @TempDir
    Path dir;

    @Test
    void readsMonthlyPortfolioReturns() {
        Path f = file(dir, "lumen_returns.csv", "date,P01,P02,MKT\n"
                + "1962-01,0.0123,-0.004,0.01\n"
                + "1962-02,0.02,1.5e-3,-0.0051\n"
                + "1962-03,-0.031,0.0,0.002\n");
        SeriesTable t = CsvSeries.read(f);
        assertThat(t.source()).isEqualTo(f);
        assertThat(t.frequency()).isEqualTo(Frequency.MONTHLY);
        assertThat(t.dates()).containsExactly(Period.month(1962, 1), Period.month(1962, 2), Period.month(1962, 3));
        assertThat(t.columnNames()).containsExactly("P01", "P02", "MKT");
        assertThat(t.rows()).isEqualTo(3);
        assertThat(t.column("P02")).containsExactly(-0.004, 0.0015, 0.0);
        assertThat(t.column("MKT")).containsExactly(0.01, -0.0051, 0.002);
        assertThat(t.lineNumbers()).containsExactly(2, 3, 4);
    }

    @Test
    void acceptsByteOrderMarkWindowsLineEndingsSpacesAndTrailingBlankLines() {
        Path f = file(dir, "excel.csv", "\uFEFFdate, TIDE ,SIZE\r\n1970Q1, 0.5 ,1\r\n1970Q2,0.25,2\r\n\r\n,,\r\n\r\n");
        SeriesTable t = CsvSeries.read(f);
        assertThat(t.frequency()).isEqualTo(Frequency.QUARTERLY);
        assertThat(t.columnNames()).containsExactly("TIDE", "SIZE");
        assertThat(t.column("TIDE")).containsExactly(0.5, 0.25);
        assertThat(t.dates()).containsExactly(Period.quarter(1970, 1), Period.quarter(1970, 2));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
            "1970-01|1970-02|MONTHLY|1970-01|1970-02",
            "197011|197012|MONTHLY|1970-11|1970-12",
            "1970Q4|1971Q1|QUARTERLY|1970Q4|1971Q1",
            "1970q4|1971q1|QUARTERLY|1970Q4|1971Q1",
            "1970|1971|ANNUAL|1970|1971",
            "1970-01-31|1970-02-28|MONTHLY|1970-01|1970-02",
            "1970-01-01|1970-02-01|MONTHLY|1970-01|1970-02",
            "1970-03-31|1970-06-30|QUARTERLY|1970Q1|1970Q2",
            "1970-01-01|1970-04-01|QUARTERLY|1970Q1|1970Q2",
            "1970-12-31|1971-12-31|ANNUAL|1970|1971"
    })
    void detectsFrequencyFromEveryDateNotation(String d1, String d2, Frequency expected, String l1, String l2) {
        Path f = file(dir, "dates.csv", "date,cons_growth\n" + d1 + ",1.01\n" + d2 + ",1.02\n");
        SeriesTable t = CsvSeries.read(f);
        assertThat(t.frequency()).isEqualTo(expected);
        assertThat(t.dates()).extracting(Period::label).containsExactly(l1, l2);
    }

    @Test
    void endOfMonthDaysOverSeveralYearsAreMonthly() {
        StringBuilder csv = new StringBuilder("date,MKT\n");
        java.time.LocalDate day = java.time.LocalDate.of(1999, 1, 31);
        for (int i = 0; i < 30; i++) {
            csv.append(day).append(',').append(i / 1000.0).append('\n');
            day = day.plusMonths(1).withDayOfMonth(day.plusMonths(1).lengthOfMonth());
        }
        SeriesTable t = CsvSeries.read(file(dir, "eom.csv", csv.toString()));
        assertThat(t.frequency()).isEqualTo(Frequency.MONTHLY);
        assertThat(t.rows()).isEqualTo(30);
        assertThat(t.dates().get(0)).isEqualTo(Period.month(1999, 1));
        assertThat(t.dates().get(13)).isEqualTo(Period.month(2000, 2));
        assertThat(t.dates().get(29)).isEqualTo(Period.month(2001, 6));
    }

    @Test
    void quarterEndDaysAreQuarterly() {
        Path f = file(dir, "q.csv", "date,cons_growth\n1990-03-31,1.01\n1990-06-30,1.0\n1990-09-30,0.99\n1990-12-31,1.02\n1991-03-31,1.0\n");
        SeriesTable t = CsvSeries.read(f);
        assertThat(t.frequency()).isEqualTo(Frequency.QUARTERLY);
        assertThat(t.dates()).extracting(Period::label).containsExactly("1990Q1", "1990Q2", "1990Q3", "1990Q4", "1991Q1");
    }

    @Test
    void roundTripGivesTheSameTableAndByteIdenticalFiles() throws IOException {
        Path in = file(dir, "in.csv", "date,P01,P02,weird name\n"
                + "2000-01-31,0.1,-0.30000000000000004,1e-9\n"
                + "2000-02-29,123456789.125,0.007,-2\n"
                + "2000-03-31,0.3333333333333333,1.0E22,2.5E-7\n");
        SeriesTable original = CsvSeries.read(in);
        Path out1 = dir.resolve("out/one.csv");
        Path out2 = dir.resolve("out/two.csv");
        CsvSeries.write(original, out1);
        CsvSeries.write(original, out2);
        assertThat(Files.readAllBytes(out1)).isEqualTo(Files.readAllBytes(out2));
        assertThat(Files.readString(out1)).isEqualTo("date,P01,P02,weird name\n"
                + "2000-01,0.1,-0.30000000000000004,1E-9\n"
                + "2000-02,123456789.125,0.007,-2\n"
                + "2000-03,0.3333333333333333,10000000000000000000000,2.5E-7\n");
        SeriesTable back = CsvSeries.read(out1);
        assertThat(back.frequency()).isEqualTo(original.frequency());
        assertThat(back.dates()).isEqualTo(original.dates());
        assertThat(back.columnNames()).isEqualTo(original.columnNames());
        assertThat(back.columns()).isDeepEqualTo(original.columns());
        assertThat(back.lineNumbers()).isEqualTo(original.lineNumbers());
        Path out3 = dir.resolve("out/three.csv");
        CsvSeries.write(back, out3);
        assertThat(Files.readAllBytes(out3)).isEqualTo(Files.readAllBytes(out1));
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
            "1970Q3|1970Q4|1971Q1",
            "1990-03-31|1990-06-30|1990-09-30",
            "1962|1963|1964",
            "196201|196202|196203"})
    void roundTripKeepsTheDatesOfEveryFrequency(String d1, String d2, String d3) {
        Path in = file(dir, "in.csv", "date,cons_growth,deflator\n" + d1 + ",1.004,1.01\n" + d2 + ",0.998,1.02\n"
                + d3 + ",1.012,1.005\n");
        SeriesTable original = CsvSeries.read(in);
        Path out = dir.resolve("out.csv");
        CsvSeries.write(original, out);
        SeriesTable back = CsvSeries.read(out);
        assertThat(back.frequency()).isEqualTo(original.frequency());
        assertThat(back.dates()).isEqualTo(original.dates());
        assertThat(back.column("cons_growth")).containsExactly(1.004, 0.998, 1.012);
        assertThat(back.column("deflator")).containsExactly(1.01, 1.02, 1.005);
    }

    @Test
    void refusesToWriteWhereNoFileCanBe() {
        Path blocker = file(dir, "blocker", "a plain file where a folder is expected");
        Path target = blocker.resolve("out.csv");
        SeriesTable t = CsvSeries.read(file(dir, "in.csv", "date,MKT\n1970-01,0.01\n"));
        InputException e = refusal(() -> CsvSeries.write(t, target), target);
        assertThat(e.problem()).startsWith("the file could not be written");
        assertThat(e.fix()).contains("folder exists and is writable");
    }

    @ParameterizedTest
    @ValueSource(doubles = {0.1, 0.2, 1.0 / 3, -2.5e-300, 1.7976931348623157e308, 4.9e-324, 0.012345678901234567, 100, 1e21})
    void formattedNumbersReadBackExactly(double value) {
        String text = CsvSeries.formatNumber(value);
        assertThat(Double.parseDouble(text)).isEqualTo(value);
        assertThat(text).doesNotContain("+");
    }

    @Test
    void formatsWithFewestDigitsThatRoundTrip() {
        assertThat(CsvSeries.formatNumber(0.1)).isEqualTo("0.1");
        assertThat(CsvSeries.formatNumber(1.0)).isEqualTo("1");
        assertThat(CsvSeries.formatNumber(100.0)).isEqualTo("100");
        assertThat(CsvSeries.formatNumber(-0.0)).isEqualTo("0");
        assertThat(CsvSeries.formatNumber(0.1 + 0.2)).isEqualTo("0.30000000000000004");
        assertThat(CsvSeries.formatNumber(1.0 / 3)).isEqualTo("0.3333333333333333");
    }

    // ---- refusals -------------------------------------------------------------------------------

    @Test
    void refusesMissingFile() {
        Path f = dir.resolve("nowhere.csv");
        InputException e = refusal(() -> CsvSeries.read(f), f);
        assertThat(e.problem()).contains("does not exist");
        assertThat(e.fix()).contains("spelling");
    }

    @Test
    void refusesFolder() throws IOException {
        Path folder = Files.createDirectory(dir.resolve("returns"));
        file(folder, "lumen_returns.csv", "date,P01\n1970-01,0.01\n");
        InputException e = refusal(() -> CsvSeries.read(folder), folder);
        assertThat(e.problem()).contains("folder");
        assertThat(e.fix()).contains("lumen_returns.csv");
    }

    @Test
    void refusesBytesThatAreNotUtf8() throws IOException {
        Path f = dir.resolve("latin1.csv");
        byte[] header = "date,P01\n1970-01,0.01\n1970-02,0.02 caf".getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        byte[] bytes = java.util.Arrays.copyOf(header, header.length + 2);
        bytes[header.length] = (byte) 0xE9;
        bytes[header.length + 1] = '\n';
        Files.write(f, bytes);
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 0);
        assertThat(e.problem()).contains("not UTF-8");
        assertThat(e.fix()).contains("UTF-8");
    }

    @Test
    void refusesUnreadableFile() throws IOException {
        Path f = file(dir, "locked.csv", "date,P01\n1970-01,0.01\n");
        boolean locked = f.toFile().setReadable(false, false) && !Files.isReadable(f);
        org.junit.jupiter.api.Assumptions.assumeTrue(locked, "the test runs as a user who can read any file");
        InputException e = refusal(() -> CsvSeries.read(f), f);
        assertThat(e.problem()).contains("cannot be read");
        assertThat(e.fix()).contains("permission");
    }

    @ParameterizedTest
    @ValueSource(strings = {"", "\uFEFF", "\n\n\r\n", ",,,\n"})
    void refusesEmptyFile(String content) {
        Path f = file(dir, "empty.csv", content);
        InputException e = refusal(() -> CsvSeries.read(f), f);
        assertThat(e.problem()).isEqualTo("the file is empty");
        assertThat(e.fix()).contains("header row");
    }

    @Test
    void refusesHeaderOnly() {
        Path f = file(dir, "head.csv", "date,P01,P02\n\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 2, 0);
        assertThat(e.problem()).contains("header but no data rows");
        assertThat(e.fix()).contains("below the header");
    }

    @Test
    void refusesSemicolonSeparatedFileWithTheReason() {
        Path f = file(dir, "semi.csv", "date;P01\n1970-01;0.01\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 1, 0);
        assertThat(e.fix()).contains("commas, not semicolons");
    }

    @Test
    void refusesFileWithoutHeader() {
        Path f = file(dir, "noheader.csv", "1970-01,0.01,0.02\n1970-02,0.03,0.04\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 1, 0);
        assertThat(e.problem()).isEqualTo("the first line looks like data (a date and numbers), not a header");
        assertThat(e.fix()).contains("add a header line");
    }

    @Test
    void refusesBlankColumnName() {
        Path f = file(dir, "blank.csv", "date,P01,,P03\n1970-01,1,2,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 1, 3);
        assertThat(e.problem()).contains("column 3 has no name");
        assertThat(e.fix()).contains("give every column a name");
    }

    @Test
    void refusesDuplicateColumnName() {
        Path f = file(dir, "dup.csv", "date,MKT,SIZE,MKT\n1970-01,1,2,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 1, 4);
        assertThat(e.getMessage()).contains("(\"MKT\")");
        assertThat(e.problem()).contains("appears twice, in columns 2 and 4");
        assertThat(e.fix()).contains("rename");
    }

    @ParameterizedTest
    @CsvSource({"1970/02", "02/1970", "1970-13", "1970-02-30", "1970Q5", "70", "Feb 1970", "''"})
    void refusesUnparseableDate(String bad) {
        Path f = file(dir, "dates.csv", "month,P01\n1970-01,0.01\n" + bad + ",0.02\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 1);
        assertThat(e.columnName()).contains("month");
        assertThat(e.problem()).containsAnyOf("is not a date", "date cell is empty");
        assertThat(e.fix()).contains("YYYY-MM-DD, YYYY-MM, YYYYMM, YYYYQn or YYYY");
    }

    @Test
    void suggestsDashesForEightDigitDays() {
        Path f = file(dir, "days.csv", "date,P01\n19700131,0.01\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 2, 1);
        assertThat(e.fix()).contains("1970-01-31");
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
            "abc|write a plain number",
            "1.2.3|write a plain number",
            "0x1p3|write a plain number",
            "1d|write a plain number",
            "1.5%|remove the % sign",
            "'\"1,5\"'|use a point as the decimal separator (1.5)"})
    void refusesNonNumericCell(String bad, String fix) {
        Path f = file(dir, "cells.csv", "date,P01,P02\n1970-01,0.01,0.02\n1970-02,0.01," + bad + "\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 3);
        assertThat(e.columnName()).contains("P02");
        assertThat(e.problem()).contains("is not a number");
        assertThat(e.fix()).contains(fix);
    }

    @ParameterizedTest
    @ValueSource(strings = {"", "NaN", "nan", "NA", "N/A", "."})
    void refusesMissingValues(String missing) {
        Path f = file(dir, "gaps.csv", "date,P01,P02\n1970-01,0.01,0.02\n1970-02," + missing + ",0.03\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 2);
        assertThat(e.columnName()).contains("P01");
        assertThat(e.problem()).contains("missing value");
        assertThat(e.fix()).contains("missing values are not supported yet");
    }

    @ParameterizedTest
    @ValueSource(strings = {"Inf", "-Infinity", "1e999"})
    void refusesInfiniteValues(String inf) {
        Path f = file(dir, "inf.csv", "date,P01\n1970-01," + inf + "\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 2, 2);
        assertThat(e.problem()).containsAnyOf("not a finite number", "too large");
    }

    @Test
    void refusesDuplicateDates() {
        Path f = file(dir, "dupdate.csv", "date,P01\n1970-01,1\n1970-02,2\n1970-02,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 4, 1);
        assertThat(e.problem()).isEqualTo("the date 1970-02 appears twice, on lines 3 and 4");
        assertThat(e.fix()).contains("one row per month");
    }

    @Test
    void refusesTwoDaysInTheSameMonth() {
        Path f = file(dir, "days.csv", "date,P01\n1970-01-31,1\n1970-02-27,2\n1970-02-28,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 4, 1);
        assertThat(e.problem()).contains("1970-02-27 (line 3) and 1970-02-28 fall in the same month 1970-02");
    }

    @Test
    void refusesDailyData() {
        Path f = file(dir, "daily.csv", "date,P01\n1970-01-01,1\n1970-01-02,2\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 1);
        assertThat(e.problem()).contains("same month").contains("daily or weekly data are not supported");
    }

    @Test
    void refusesIrregularDaySpacing() {
        Path f = file(dir, "odd.csv", "date,P01\n1970-01-31,1\n1970-03-31,2\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 1);
        assertThat(e.problem()).contains("2 months apart");
    }

    @Test
    void refusesUnsortedDates() {
        Path f = file(dir, "unsorted.csv", "date,P01\n1970-01,1\n1970-03,2\n1970-02,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 4, 1);
        assertThat(e.problem()).isEqualTo("the dates are not sorted: 1970-02 comes after 1970-03 (line 3)");
        assertThat(e.fix()).contains("sort the rows by date");
    }

    @Test
    void refusesNewestFirstOrder() {
        Path f = file(dir, "desc.csv", "date,P01\n1970-03,1\n1970-02,2\n1970-01,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 1);
        assertThat(e.problem()).isEqualTo("the dates are not sorted: 1970-02 comes after 1970-03 (line 2)");
    }

    @Test
    void refusesGapInTheIndex() {
        Path f = file(dir, "gap.csv", "date,P01\n1970Q1,1\n1970Q2,2\n1971Q1,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 4, 1);
        assertThat(e.problem()).isEqualTo("the dates jump from 1970Q2 (line 3) to 1971Q1; missing: 1970Q3 to 1970Q4 (2 quarters)");
        assertThat(e.fix()).contains("add the missing rows");
    }

    @Test
    void refusesGapInEndOfMonthDays() {
        Path f = file(dir, "gap.csv", "date,P01\n1970-01-31,1\n1970-02-28,2\n1970-04-30,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 4, 1);
        assertThat(e.problem()).contains("missing: 1970-03");
    }

    @Test
    void refusesMixedFrequencies() {
        Path f = file(dir, "mixed.csv", "date,P01\n1970-01,1\n1970-02,2\n1970Q2,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 4, 1);
        assertThat(e.problem()).isEqualTo("mixed frequencies: the date 1970Q2 is quarterly, but the first date (line 2) is monthly");
        assertThat(e.fix()).contains("one frequency per file");
    }

    @Test
    void refusesMixedNotationsOfOneFrequency() {
        Path f = file(dir, "mixed.csv", "date,P01\n1970-01,1\n197002,2\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 1);
        assertThat(e.problem()).contains("written as YYYYMM").contains("written as YYYY-MM");
    }

    @Test
    void refusesRowWithWrongNumberOfCells() {
        Path f = file(dir, "short.csv", "date,P01,P02\n1970-01,1,2\n1970-02,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 0);
        assertThat(e.problem()).isEqualTo("this row has 2 cells but the header has 3");
        assertThat(e.fix()).contains("missing or extra comma");
    }

    @Test
    void refusesBlankLineInsideTheData() {
        Path f = file(dir, "hole.csv", "date,P01\n1970-01,1\n\n1970-02,3\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 3, 0);
        assertThat(e.problem()).contains("blank line");
    }

    @Test
    void refusesUnclosedQuote() {
        Path f = file(dir, "quote.csv", "date,P01\n1970-01,\"0.1\n1970-02,3\n");
        // The quote opens on line 2, so that is where the reader points.
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 2, 0);
        assertThat(e.fix()).contains("quotes");
    }

    @Test
    void linesOfRowsAfterAQuotedLineBreakStayCorrect() {
        Path f = file(dir, "multi.csv", "date,\"P\n01\"\n1970-01,1\n1970-02,x\n");
        InputException e = refusalAt(() -> CsvSeries.read(f), f, 4, 2);
        assertThat(e.columnName()).contains("P\n01");
        assertThat(List.of(e.line())).containsExactly(4);
    }
}
