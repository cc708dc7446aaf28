package org.orthogon.data;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * Reads one table from a text file that holds several: the layout in which research data libraries
 * publish portfolio returns. The file opens with free text (a description, a copyright line), then
 * holds tables one after another. Each table is
 * <ol>
 * <li>a title line, e.g. {@code Lumen size/tide portfolios, value-weighted monthly returns};</li>
 * <li>a header row naming the series, with or without a label for the date column;</li>
 * <li>data rows: a date written YYYYMM (monthly) or YYYY (annual), then one value per series;</li>
 * </ol>
 * separated from the next title by blank lines or further text. Cells are separated by commas (split
 * with Commons CSV, so quoted cells work) or by runs of spaces or tabs; the separator is decided per
 * table by its first data row. Values are read as written, in percent in such files: declare
 * {@code units = "percent"} for them. The missing codes -99.99 and -999 are allowed only at the start
 * or end of a table (those rows are dropped and reported) and refused inside.
 *
 * <pre>
 * Lumen Exchange research files. Returns in percent; -99.99 marks a missing value.
 *
 * Lumen size/tide portfolios, value-weighted monthly returns
 *         S1T1   S1T2
 * 196201  1.23  -0.45
 * 196202  0.87   2.10
 *
 * Lumen size/tide portfolios, value-weighted annual returns
 *         S1T1   S1T2
 * 1962   10.52   8.31
 * </pre>
 *
 * <p>How lines are told apart: a <em>data line</em> has at least two cells, its first cell starts with
 * a digit, and at least one further cell is a number; every other non-blank line is text. A table
 * begins where a text line (its header) sits directly above a data line; its title is the nearest
 * text line above the header. Preamble lines that happen to look like data lines (a year followed by
 * a number) would be taken for a table and are best avoided.
 */
public final class SectionedTables {

    /** The missing-value codes of this layout, compared as numbers. */
    public static final double[] MISSING_CODES = {-99.99, -999};

    private static final Set<Period.Notation> NOTATIONS = Set.of(Period.Notation.MONTH_COMPACT, Period.Notation.YEAR);
    private static final Pattern STARTS_WITH_DIGIT = Pattern.compile("\\d.*");
    private static final Pattern WHITESPACE = Pattern.compile("\\s+");
    private static final CSVFormat CELLS = CSVFormat.DEFAULT.builder().setTrim(true).get();
    private static final Pattern PLAIN_NUMBER = CsvSeries.NUMBER;

    private SectionedTables() {
    }

    /**
     * One table found in a file.
     *
     * @param position   1-based position in the file
     * @param title      the title line as written (trailing separators removed)
     * @param titleLine  the 1-based line of the title
     * @param headerLine the line of the header row
     * @param firstLine  the line of the first data row
     * @param lastLine   the line of the last data row
     */
    public record TableInfo(int position, String title, int titleLine, int headerLine, int firstLine, int lastLine) {
    }

    /**
     * Lists the tables of a file, in file order.
     *
     * @throws InputException for an unreadable file, a file without tables, a table whose header has no
     *                        title line above it, data rows without a header row, or two tables with
     *                        the same title (which would make a title ambiguous)
     */
    public static List<TableInfo> tables(Path file) {
        return scan(file, lines(file)).stream().map(Section::info).toList();
    }

    /**
     * Reads the table named {@code titleOrPosition}: its title (compared ignoring case and runs of
     * spaces) or its 1-based position in the file ("2").
     *
     * @return the table, values as written (percent for these files), with rows dropped at the edges
     *         for missing codes
     * @throws InputException naming the file, line and column for: no such title (with the closest
     *                        title and the list of tables) or position; a ragged row; a date that is
     *                        not YYYYMM or YYYY, or mixes the two; a non-numeric cell; a missing code
     *                        inside the table; duplicate, unsorted or missing dates; and every refusal
     *                        of {@link #tables}
     */
    public static TableWithNotes read(Path file, String titleOrPosition) {
        List<String> lines = lines(file);
        List<Section> sections = scan(file, lines);
        Section section = choose(file, sections, titleOrPosition, lines);
        return section.read(file, lines);
    }

    private record Line(int number, String text, List<String> cells, boolean comma) {
        boolean blank() {
            return cells.stream().allMatch(String::isEmpty);
        }

        boolean data() {
            if (cells.size() < 2 || !STARTS_WITH_DIGIT.matcher(cells.get(0)).matches()) {
                return false;
            }
            for (int c = 1; c < cells.size(); c++) {
                if (PLAIN_NUMBER.matcher(cells.get(c)).matches()) {
                    return true;
                }
            }
            return false;
        }
    }

    private record Section(int position, Line title, Line header, int first, int last) {
        TableInfo info() {
            return new TableInfo(position, titleText(title), title.number, header.number, first + 1, last + 1);
        }

        TableWithNotes read(Path file, List<String> lines) {
            boolean comma = split(file, first + 1, lines.get(first)).comma;
            Line head = split(file, header.number, lines.get(header.number - 1), comma);
            Line firstRow = split(file, first + 1, lines.get(first), comma);
            List<String> headerCells = head.cells;
            int values = firstRow.cells.size() - 1;
            List<String> names;
            if (headerCells.size() == values) {
                names = headerCells;
            } else if (headerCells.size() == values + 1) {
                names = headerCells.subList(1, headerCells.size());
            } else {
                throw InputException.in(file).line(head.number).problem(
                        "the header of table " + position + " (\"" + titleText(title) + "\") names " + headerCells.size()
                                + " columns but its first data row (line " + firstRow.number + ") has " + values
                                + " values after the date",
                        "give the header one name per value column (a label for the date column is optional)");
            }
            names = CsvSeries.checkedNames(file, head.number, names, 2);
            List<CsvSeries.RawRow> rows = new ArrayList<>();
            for (int i = first; i <= last; i++) {
                Line row = split(file, i + 1, lines.get(i), comma);
                rows.add(new CsvSeries.RawRow(row.number, row.cells));
            }
            return ImportedRows.toTable(file, rows, names, "date", SectionedTables::isMissingCode,
                    "-99.99 or -999", NOTATIONS);
        }
    }

    static boolean isMissingCode(String cell) {
        if (!PLAIN_NUMBER.matcher(cell).matches()) {
            return false;
        }
        double value = Double.parseDouble(cell);
        for (double code : MISSING_CODES) {
            if (value == code) {
                return true;
            }
        }
        return false;
    }

    private static List<String> lines(Path file) {
        String text = CsvSeries.readText(file);
        return List.of(text.split("\\R", -1));
    }

    private static List<Section> scan(Path file, List<String> raw) {
        List<Line> lines = new ArrayList<>(raw.size());
        for (int i = 0; i < raw.size(); i++) {
            lines.add(split(file, i + 1, raw.get(i)));
        }
        List<Section> sections = new ArrayList<>();
        int i = 0;
        while (i < lines.size()) {
            Line line = lines.get(i);
            if (!line.data()) {
                i++;
                continue;
            }
            Line header = i > 0 ? lines.get(i - 1) : null;
            if (header == null || header.blank()) {
                throw InputException.in(file).line(line.number).problem(
                        "data rows start here without a header row directly above them",
                        "put the table's title line and then its header row (the series names) right above its"
                                + " first data row");
            }
            int end = i;
            while (end + 1 < lines.size() && lines.get(end + 1).data()) {
                end++;
            }
            Line title = null;
            for (int j = i - 2; j >= 0; j--) {
                if (!lines.get(j).blank()) {
                    title = lines.get(j);
                    break;
                }
            }
            if (title == null || title.data()) {
                throw InputException.in(file).line(header.number).problem(
                        "the table whose header is on this line has no title line above it",
                        "write a title line (e.g. \"Lumen size/tide portfolios, monthly returns\") above the header,"
                                + " separated from the previous table by a blank line");
            }
            sections.add(new Section(sections.size() + 1, title, header, i, end));
            i = end + 1;
        }
        if (sections.isEmpty()) {
            throw InputException.in(file).problem(
                    "no table found: no line starting with a YYYYMM or YYYY date sits below a header row",
                    "check that this is a file of tables (title line, header row, then rows of date and values)");
        }
        Map<String, Section> byTitle = new HashMap<>();
        for (Section s : sections) {
            Section earlier = byTitle.putIfAbsent(normalise(titleText(s.title)), s);
            if (earlier != null) {
                throw InputException.in(file).line(s.title.number).problem(
                        "two tables have the title \"" + titleText(s.title) + "\" (lines " + earlier.title.number + " and "
                                + s.title.number + "), so a table cannot be chosen by its title",
                        "give each table its own title, e.g. by adding \"monthly\" or \"annual\"");
            }
        }
        return sections;
    }

    private static Section choose(Path file, List<Section> sections, String wanted, List<String> lines) {
        String key = wanted == null ? "" : wanted.strip();
        if (key.matches("\\d+")) {
            int position = Integer.parseInt(key);
            if (position < 1 || position > sections.size()) {
                throw InputException.in(file).problem(
                        "there is no table " + position + "; the file holds " + sections.size(),
                        "choose a position from 1 to " + sections.size() + " or a title: " + listing(sections));
            }
            return sections.get(position - 1);
        }
        for (Section s : sections) {
            if (normalise(titleText(s.title)).equals(normalise(key))) {
                return s;
            }
        }
        List<String> titles = sections.stream().map(s -> titleText(s.title)).toList();
        for (int i = 0; i < lines.size(); i++) {
            if (normalise(stripSeparators(lines.get(i))).equals(normalise(key)) && !key.isEmpty()) {
                throw InputException.in(file).line(i + 1).problem(
                        "the title \"" + key + "\" is here, but no table (a header row, then rows starting with a"
                                + " YYYYMM or YYYY date) follows it; the table may be truncated",
                        "fetch the file again, or choose another table: " + listing(sections));
            }
        }
        throw InputException.in(file).problem("no table has the title \"" + key + "\"",
                "name a table by its title or position" + Suggestions.didYouMean(key, titles) + ": " + listing(sections));
    }

    private static String listing(List<Section> sections) {
        StringBuilder out = new StringBuilder();
        for (Section s : sections) {
            if (out.length() > 0) {
                out.append("; ");
            }
            out.append(s.position).append(" = \"").append(titleText(s.title)).append("\" (line ").append(s.title.number)
                    .append(')');
        }
        return out.toString();
    }

    private static String titleText(Line title) {
        return stripSeparators(title.text);
    }

    /** Spreadsheet exports pad a title with commas to the table's width; quotes may wrap it. */
    private static String stripSeparators(String text) {
        String t = text.strip();
        while (t.endsWith(",")) {
            t = t.substring(0, t.length() - 1).strip();
        }
        if (t.length() >= 2 && t.startsWith("\"") && t.endsWith("\"")) {
            t = t.substring(1, t.length() - 1).replace("\"\"", "\"").strip();
        }
        return t;
    }

    private static String normalise(String title) {
        return WHITESPACE.matcher(title.strip()).replaceAll(" ").toLowerCase(Locale.ROOT);
    }

    private static Line split(Path file, int number, String text) {
        return split(file, number, text, text.indexOf(',') >= 0);
    }

    private static Line split(Path file, int number, String text, boolean comma) {
        String stripped = text.strip();
        if (stripped.isEmpty()) {
            return new Line(number, text, List.of(""), comma);
        }
        if (!comma) {
            return new Line(number, text, List.of(WHITESPACE.split(stripped)), false);
        }
        try (CSVParser parser = CSVParser.parse(stripped, CELLS)) {
            List<CSVRecord> records = parser.getRecords();
            List<String> cells = records.isEmpty() ? List.of("") : records.get(0).toList();
            return new Line(number, text, cells, true);
        } catch (IOException | UncheckedIOException | IllegalStateException e) {
            throw InputException.in(file).line(number).problem(
                    "this line cannot be split into cells (unbalanced quotes)",
                    "check the quotes: every opening \" needs a closing \"");
        }
    }
}
