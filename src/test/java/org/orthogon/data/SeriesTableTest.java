package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;
import static org.orthogon.data.Refusals.file;
import static org.orthogon.data.Refusals.refusal;

import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SeriesTableTest {

    @TempDir
    Path dir;

    Path factorsFile;
    SeriesTable factors;

    @BeforeEach
    void read() {
        factorsFile = file(dir, "lumen_factors.csv", "date,MKT,SIZE,TIDE\n"
                + "1970-01,0.011,0.002,-0.003\n"
                + "1970-02,-0.021,0.004,0.001\n"
                + "1970-03,0.031,-0.001,0.002\n"
                + "1970-04,0.004,0.003,0.005\n");
        factors = CsvSeries.read(factorsFile);
    }

    @Test
    void suggestsTheClosestColumnName() {
        InputException e = refusal(() -> factors.column("TIDES"), factorsFile);
        assertThat(e.columnName()).contains("TIDES");
        assertThat(e.problem()).isEqualTo("there is no column named \"TIDES\"");
        assertThat(e.fix()).isEqualTo("did you mean \"TIDE\"? the columns are: MKT, SIZE, TIDE");
        assertThat(refusal(() -> factors.column("mkt"), factorsFile).fix()).startsWith("did you mean \"MKT\"?");
    }

    @Test
    void listsTheColumnsWhenNothingIsClose() {
        InputException e = refusal(() -> factors.column("cons_growth"), factorsFile);
        assertThat(e.fix()).isEqualTo("the columns are: MKT, SIZE, TIDE");
    }

    @Test
    void selectKeepsTheAskedOrderAndLineNumbers() {
        SeriesTable picked = factors.select(List.of("TIDE", "MKT"));
        assertThat(picked.columnNames()).containsExactly("TIDE", "MKT");
        assertThat(picked.column("TIDE")).containsExactly(-0.003, 0.001, 0.002, 0.005);
        assertThat(picked.column("MKT")).containsExactly(0.011, -0.021, 0.031, 0.004);
        assertThat(picked.lineNumbers()).containsExactly(2, 3, 4, 5);
        assertThat(refusal(() -> factors.select(List.of("MKT", "SIZ")), factorsFile).fix())
                .startsWith("did you mean \"SIZE\"?");
        assertThat(refusal(() -> factors.select(List.of("MKT", "MKT")), factorsFile).problem())
                .contains("asked for twice");
    }

    @Test
    void betweenCutsInclusively() {
        SeriesTable cut = factors.between(Period.month(1970, 2), Period.month(1970, 3));
        assertThat(cut.dates()).containsExactly(Period.month(1970, 2), Period.month(1970, 3));
        assertThat(cut.column("SIZE")).containsExactly(0.004, -0.001);
        assertThat(cut.lineNumbers()).containsExactly(3, 4);
        assertThat(cut.rows()).isEqualTo(2);
    }

    @Test
    void betweenRefusesBoundsOutsideTheFile() {
        InputException e = refusal(() -> factors.between(Period.month(1969, 12), Period.month(1970, 3)), factorsFile);
        assertThat(e.problem()).isEqualTo(
                "the requested sample start 1969-12 lies outside the file's dates, which run from 1970-01 to 1970-04");
        assertThat(e.fix()).contains("between 1970-01 and 1970-04");
        InputException reversed = refusal(() -> factors.between(Period.month(1970, 3), Period.month(1970, 2)), factorsFile);
        assertThat(reversed.problem()).contains("after the sample end");
    }

    @Test
    void isImmutable() {
        double[][] columns = factors.columns();
        columns[0][0] = 99;
        assertThat(factors.column("MKT")[0]).isEqualTo(0.011);
        double[] mkt = factors.column("MKT");
        mkt[1] = 99;
        assertThat(factors.columns()[0][1]).isEqualTo(-0.021);
    }

    @Test
    void equalityComparesValues() {
        SeriesTable again = CsvSeries.read(factorsFile);
        assertThat(again).isEqualTo(factors).hasSameHashCodeAs(factors);
        assertThat(again.select(List.of("MKT"))).isNotEqualTo(factors);
    }

    @Test
    void suggestionsAreTypoSized() {
        assertThat(Suggestions.levenshtein("kitten", "sitting")).isEqualTo(3);
        assertThat(Suggestions.closest("retuns_kind", List.of("returns", "returns_kind", "riskfree")))
                .contains("returns_kind");
        assertThat(Suggestions.closest("gamma", List.of("P01", "P02"))).isEmpty();
    }

    @Test
    void kindAndUnitsFromModelFileWords() {
        assertThat(ReturnKind.fromId("gross")).isEqualTo(ReturnKind.GROSS);
        assertThat(ReturnKind.fromId(" Excess ")).isEqualTo(ReturnKind.EXCESS);
        assertThat(Units.fromId("percent")).isEqualTo(Units.PERCENT);
        assertThat(Units.fromId("decimal")).isEqualTo(Units.DECIMAL);
        InputException e = catchThrowableOfType(InputException.class, () -> ReturnKind.fromId("grss"));
        assertThat(e.problem()).isEqualTo("\"grss\" is not a known value for returns_kind");
        assertThat(e.fix()).isEqualTo("did you mean \"gross\"? write one of: gross, net, excess");
        assertThat(catchThrowableOfType(InputException.class, () -> Units.fromId("percentage")).fix())
                .startsWith("did you mean \"percent\"?");
    }
}
