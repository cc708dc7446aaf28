package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class PeriodTest {

    @ParameterizedTest
    @CsvSource({
            "1970-01, MONTHLY, 23640, 1970-01",
            "1970-12, MONTHLY, 23651, 1970-12",
            "197012, MONTHLY, 23651, 1970-12",
            "1970-12-31, MONTHLY, 23651, 1970-12",
            "1970Q1, QUARTERLY, 7880, 1970Q1",
            "2024q4, QUARTERLY, 8099, 2024Q4",
            "1962, ANNUAL, 1962, 1962"})
    void parsesEveryNotation(String text, Frequency frequency, int ordinal, String label) {
        Period p = Period.parse(text);
        assertThat(p.frequency()).isEqualTo(frequency);
        assertThat(p.ordinal()).isEqualTo(ordinal);
        assertThat(p.label()).isEqualTo(label);
        assertThat(Period.parse(p.label())).isEqualTo(p);
    }

    @Test
    void yearSubPeriodAndArithmetic() {
        Period dec = Period.month(1969, 12);
        assertThat(dec.year()).isEqualTo(1969);
        assertThat(dec.subPeriod()).isEqualTo(12);
        assertThat(dec.plus(1)).isEqualTo(Period.month(1970, 1));
        assertThat(dec.plus(-12).label()).isEqualTo("1968-12");
        assertThat(Period.quarter(1970, 4).plus(1).label()).isEqualTo("1971Q1");
        assertThat(Period.quarter(1970, 1).until(Period.quarter(1972, 3))).isEqualTo(10);
        assertThat(Period.year(2000).plus(24).label()).isEqualTo("2024");
        assertThat(Period.quarter(1970, 2).firstMonth()).isEqualTo(Period.month(1970, 4));
        assertThat(Period.quarter(1970, 2).lastMonth()).isEqualTo(Period.month(1970, 6));
        assertThat(Period.month(1970, 8).containingPeriod(Frequency.QUARTERLY)).isEqualTo(Period.quarter(1970, 3));
    }

    @Test
    void ordersByCalendar() {
        assertThat(Period.month(1970, 1)).isLessThan(Period.month(1970, 2));
        assertThat(Period.month(1969, 12)).isLessThan(Period.quarter(1970, 1));
        assertThat(Period.month(1970, 1).compareTo(Period.quarter(1970, 1))).isNegative();
        assertThat(Period.quarter(1970, 4)).isLessThan(Period.month(1971, 1));
    }

    @Test
    void boundsConvertToAnyFrequency() {
        assertThat(Period.parseStart("1970-01", Frequency.QUARTERLY)).isEqualTo(Period.quarter(1970, 1));
        assertThat(Period.parseEnd("2019-12", Frequency.QUARTERLY)).isEqualTo(Period.quarter(2019, 4));
        assertThat(Period.parseStart("1970-01", Frequency.ANNUAL)).isEqualTo(Period.year(1970));
        assertThat(Period.parseEnd("2019-12", Frequency.ANNUAL)).isEqualTo(Period.year(2019));
        assertThat(Period.parseStart("1970", Frequency.MONTHLY)).isEqualTo(Period.month(1970, 1));
        assertThat(Period.parseEnd("1970", Frequency.MONTHLY)).isEqualTo(Period.month(1970, 12));
        assertThat(Period.parseEnd("1970Q2", Frequency.MONTHLY)).isEqualTo(Period.month(1970, 6));
        assertThat(Period.parseStart("1970-04-01", Frequency.QUARTERLY)).isEqualTo(Period.quarter(1970, 2));
        assertThat(Period.parseStart("1970-02", Frequency.MONTHLY)).isEqualTo(Period.month(1970, 2));
    }

    @Test
    void refusesBoundsThatSplitAPeriod() {
        InputException start = catchThrowableOfType(InputException.class,
                () -> Period.parseStart("1970-02", Frequency.QUARTERLY));
        assertThat(start.problem()).isEqualTo("the sample start 1970-02 falls inside the quarterly period 1970Q1");
        assertThat(start.fix()).isEqualTo("start at 1970-01 to include 1970Q1, or at 1970-04 to begin with 1970Q2");
        InputException end = catchThrowableOfType(InputException.class,
                () -> Period.parseEnd("2019-11", Frequency.ANNUAL));
        assertThat(end.problem()).isEqualTo("the sample end 2019-11 falls inside the annual period 2019");
        assertThat(end.fix()).isEqualTo("end at 2019-12 to include 2019, or at 2018-12 to stop after 2018");
    }

    @Test
    void refusesTextThatIsNoDate() {
        for (String bad : new String[] {"1970-13", "19700", "1970Q0", "", "Jan 1970", "1970-02-29"}) {
            InputException e = catchThrowableOfType(InputException.class, () -> Period.parse(bad));
            assertThat(e).as(bad).isNotNull();
            assertThat(e.problem()).isEqualTo("\"" + bad + "\" is not a date");
            assertThat(e.fix()).contains("YYYY-MM-DD, YYYY-MM, YYYYMM, YYYYQn or YYYY");
        }
        assertThat(Period.parse("1972-02-29")).isEqualTo(Period.month(1972, 2));
    }
}
