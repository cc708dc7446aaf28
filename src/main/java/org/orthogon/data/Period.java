package org.orthogon.data;

import java.time.DateTimeException;
import java.time.LocalDate;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * One period of a time index: a month, a quarter or a year.
 *
 * <p>{@code ordinal} counts periods from year 0, so consecutive periods differ by one and gaps are a
 * subtraction: a month is {@code year * 12 + month - 1}, a quarter {@code year * 4 + quarter - 1},
 * a year is the year itself.
 *
 * <p>Periods of different frequencies are ordered by the first month they cover, then by their last
 * month, so the order agrees with the calendar and with {@link #equals}.
 *
 * @param frequency how long the period is
 * @param ordinal   the period count since year 0 at that frequency
 */
public record Period(Frequency frequency, int ordinal) implements Comparable<Period> {

    private static final Pattern DAY = Pattern.compile("(\\d{4})-(\\d{2})-(\\d{2})");
    private static final Pattern MONTH_DASH = Pattern.compile("(\\d{4})-(\\d{2})");
    private static final Pattern MONTH_COMPACT = Pattern.compile("(\\d{4})(\\d{2})");
    private static final Pattern QUARTER = Pattern.compile("(\\d{4})[Qq]([1-4])");
    private static final Pattern YEAR = Pattern.compile("(\\d{4})");

    /** The date notations a file may use in its first column. */
    public static final String ACCEPTED_FORMATS = "YYYY-MM-DD, YYYY-MM, YYYYMM, YYYYQn or YYYY";

    /** Rejects a null frequency, which would make every later comparison meaningless. */
    public Period {
        if (frequency == null) {
            throw new IllegalArgumentException("frequency is null");
        }
    }

    /** The month {@code month} (1..12) of {@code year}. */
    public static Period month(int year, int month) {
        if (month < 1 || month > 12) {
            throw new IllegalArgumentException("month " + month + " is not in 1..12");
        }
        return new Period(Frequency.MONTHLY, year * 12 + month - 1);
    }

    /** The quarter {@code quarter} (1..4) of {@code year}. */
    public static Period quarter(int year, int quarter) {
        if (quarter < 1 || quarter > 4) {
            throw new IllegalArgumentException("quarter " + quarter + " is not in 1..4");
        }
        return new Period(Frequency.QUARTERLY, year * 4 + quarter - 1);
    }

    /** The calendar year {@code year}. */
    public static Period year(int year) {
        return new Period(Frequency.ANNUAL, year);
    }

    /**
     * Reads a period written in one of {@value #ACCEPTED_FORMATS}. The notation decides the
     * frequency: YYYY-MM and YYYYMM are months, YYYYQn quarters, YYYY years. A full day
     * (YYYY-MM-DD) gives the month that contains it; whether a file of days is monthly or quarterly
     * is decided by {@link CsvSeries#read}, which sees all rows.
     *
     * @throws InputException if the text is none of those notations or names no real date
     */
    public static Period parse(String text) {
        Parsed parsed = parseNotation(text);
        if (parsed == null) {
            throw InputException.general().problem(
                    "\"" + text + "\" is not a date",
                    "write it as " + ACCEPTED_FORMATS + ", e.g. 1970-01 or 1970Q1");
        }
        return parsed.period();
    }

    /**
     * Reads an inclusive sample start such as {@code "1970-01"} and expresses it at
     * {@code frequency}; see {@link #asStart(Frequency)} for the rule.
     *
     * @throws InputException if the text is not a date or does not begin a period of that frequency
     */
    public static Period parseStart(String text, Frequency frequency) {
        return parse(text).asStart(frequency);
    }

    /**
     * Reads an inclusive sample end such as {@code "2019-12"} and expresses it at
     * {@code frequency}; see {@link #asEnd(Frequency)} for the rule.
     *
     * @throws InputException if the text is not a date or does not end a period of that frequency
     */
    public static Period parseEnd(String text, Frequency frequency) {
        return parse(text).asEnd(frequency);
    }

    /**
     * This period as the first period of a sample at {@code target} frequency. Going to a finer
     * frequency takes the first sub-period (1970 becomes 1970-01). Going to a coarser one requires
     * this period to be the first part of the coarser one (1970-01 becomes 1970Q1) and refuses
     * otherwise, because a start of 1970-02 on quarterly data would either drop January's quarter or
     * quietly include January.
     *
     * @throws InputException if the period starts in the middle of a {@code target} period
     */
    public Period asStart(Frequency target) {
        Period converted = containing(firstMonth(), target);
        if (converted.firstMonth().ordinal != firstMonth().ordinal) {
            throw InputException.general().problem(
                    "the sample start " + label() + " falls inside the " + target.id() + " period "
                            + converted.label(),
                    "start at " + converted.firstMonth().label() + " to include " + converted.label()
                            + ", or at " + converted.plus(1).firstMonth().label() + " to begin with "
                            + converted.plus(1).label());
        }
        return converted;
    }

    /**
     * This period as the last period of a sample at {@code target} frequency: the last sub-period
     * when going finer (2019 becomes 2019-12), and only a period that closes a coarser one when going
     * coarser (2019-12 becomes 2019Q4), for the same reason as {@link #asStart}.
     *
     * @throws InputException if the period ends in the middle of a {@code target} period
     */
    public Period asEnd(Frequency target) {
        Period converted = containing(lastMonth(), target);
        if (converted.lastMonth().ordinal != lastMonth().ordinal) {
            throw InputException.general().problem(
                    "the sample end " + label() + " falls inside the " + target.id() + " period "
                            + converted.label(),
                    "end at " + converted.lastMonth().label() + " to include " + converted.label()
                            + ", or at " + converted.plus(-1).lastMonth().label() + " to stop after "
                            + converted.plus(-1).label());
        }
        return converted;
    }

    /** The period of {@code target} frequency that contains this period's first month. */
    public Period containingPeriod(Frequency target) {
        return containing(firstMonth(), target);
    }

    /** The calendar year the period lies in. */
    public int year() {
        return Math.floorDiv(ordinal, frequency.periodsPerYear());
    }

    /** The position inside the year, starting at 1: the month, the quarter, or 1 for a year. */
    public int subPeriod() {
        return Math.floorMod(ordinal, frequency.periodsPerYear()) + 1;
    }

    /** The period {@code n} steps later (earlier for negative {@code n}) at the same frequency. */
    public Period plus(int n) {
        return new Period(frequency, Math.addExact(ordinal, n));
    }

    /** How many periods {@code later} lies after this one; both must share a frequency. */
    public int until(Period later) {
        requireSameFrequency(later);
        return later.ordinal - ordinal;
    }

    /** The first month the period covers. */
    public Period firstMonth() {
        return new Period(Frequency.MONTHLY, ordinal * frequency.monthsPerPeriod());
    }

    /** The last month the period covers. */
    public Period lastMonth() {
        return new Period(Frequency.MONTHLY, ordinal * frequency.monthsPerPeriod() + frequency.monthsPerPeriod() - 1);
    }

    /** The canonical text: "1970-01", "1970Q1" or "1970"; {@link #parse} reads it back. */
    public String label() {
        // String.format would do, but labels are made for every row of every file read
        String year = fourDigits(year());
        return switch (frequency) {
            case MONTHLY -> year + (subPeriod() < 10 ? "-0" : "-") + subPeriod();
            case QUARTERLY -> year + "Q" + subPeriod();
            case ANNUAL -> year;
        };
    }

    /** The year as %04d prints it: at least four characters, zeros after a minus sign. */
    private static String fourDigits(int year) {
        String digits = Integer.toString(Math.abs(year));
        int width = year < 0 ? 3 : 4;
        String padded = digits.length() >= width ? digits : "000".substring(0, width - digits.length()) + digits;
        return year < 0 ? "-" + padded : padded;
    }

    @Override
    public int compareTo(Period other) {
        int byStart = Integer.compare(firstMonth().ordinal, other.firstMonth().ordinal);
        if (byStart != 0) {
            return byStart;
        }
        int byEnd = Integer.compare(lastMonth().ordinal, other.lastMonth().ordinal);
        return byEnd != 0 ? byEnd : frequency.compareTo(other.frequency);
    }

    /** Same as {@link #label()}, so periods print readably in messages. */
    @Override
    public String toString() {
        return label();
    }

    private void requireSameFrequency(Period other) {
        if (other.frequency != frequency) {
            throw new IllegalArgumentException(label() + " and " + other.label() + " have different frequencies");
        }
    }

    private static Period containing(Period month, Frequency target) {
        return new Period(target, Math.floorDiv(month.ordinal, target.monthsPerPeriod()));
    }

    /** Which notation a date cell used; files must stick to one. */
    enum Notation {
        DAY("YYYY-MM-DD"), MONTH_DASH("YYYY-MM"), MONTH_COMPACT("YYYYMM"), QUARTER("YYYYQn"), YEAR("YYYY");

        final String shape;

        Notation(String shape) {
            this.shape = shape;
        }
    }

    /** A date cell as read: its text, the notation, the period it names and, for full days, the day. */
    record Parsed(String text, Notation notation, Period period, LocalDate day) {
    }

    /** Reads one date cell, or returns null if it is no accepted notation or no real date. */
    static Parsed parseNotation(String raw) {
        if (raw == null) {
            return null;
        }
        String text = raw.strip();
        Matcher m;
        try {
            if ((m = DAY.matcher(text)).matches()) {
                LocalDate day = LocalDate.of(Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2)),
                        Integer.parseInt(m.group(3)));
                return new Parsed(text, Notation.DAY, month(day.getYear(), day.getMonthValue()), day);
            }
        } catch (DateTimeException notARealDay) {
            return null;
        }
        if ((m = MONTH_DASH.matcher(text)).matches()) {
            return monthOrNull(text, Notation.MONTH_DASH, m);
        }
        if ((m = MONTH_COMPACT.matcher(text)).matches()) {
            return monthOrNull(text, Notation.MONTH_COMPACT, m);
        }
        if ((m = QUARTER.matcher(text)).matches()) {
            return new Parsed(text, Notation.QUARTER, quarter(Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2))), null);
        }
        if ((m = YEAR.matcher(text)).matches()) {
            return new Parsed(text, Notation.YEAR, year(Integer.parseInt(m.group(1))), null);
        }
        return null;
    }

    private static Parsed monthOrNull(String text, Notation notation, Matcher m) {
        int month = Integer.parseInt(m.group(2));
        if (month < 1 || month > 12) {
            return null;
        }
        return new Parsed(text, notation, month(Integer.parseInt(m.group(1)), month), null);
    }
}
