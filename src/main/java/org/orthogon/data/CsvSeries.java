package org.orthogon.data;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVPrinter;
import org.apache.commons.csv.CSVRecord;

/**
 * Reads and writes wide CSV files of series: a header row, then one row per period with the date in
 * the first column and one number per series. Every refusal is an {@link InputException} that names
 * the file, the line and, where there is one, the column, together with the fix.
 *
 * <p>Accepted as harmless: a UTF-8 byte-order mark, Windows line endings, spaces around cells, blank
 * lines (or lines of empty cells, as spreadsheets export) at the end of the file, and a blank name
 * for the date column. Everything else unusual is refused rather than guessed, because a silently
 * misread return file gives a wrong test with a confident p-value.
 */
public final class CsvSeries {

    /** The header written above the date column. */
    public static final String DATE_HEADER = "date";

    private static final CSVFormat READ_FORMAT = CSVFormat.DEFAULT.builder()
            .setIgnoreEmptyLines(false)
            .setTrim(true)
            .get();

    private static final CSVFormat WRITE_FORMAT = CSVFormat.DEFAULT.builder()
            .setRecordSeparator("\n")
            .get();

    /** Plain decimal notation only: Java's parser would also take "1d", "0x1p3" or "Infinity". */
    static final Pattern NUMBER = Pattern.compile("[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?");

    private static final Set<String> MISSING_MARKERS = Set.of("na", "n/a", "nan", "null", "none", ".", "-",
            "#n/a", "?");

    private static final Set<String> INFINITE_MARKERS = Set.of("inf", "+inf", "-inf", "infinity", "+infinity",
            "-infinity");

    private CsvSeries() {
    }

    /**
     * Reads a wide CSV file of series.
     *
     * @param file the file to read
     * @return the table, its frequency detected from the dates
     * @throws InputException for a missing, unreadable or empty file; a header without data; blank or
     *                        duplicate column names; an unreadable date; a non-numeric, empty, NaN or
     *                        infinite cell; duplicate, unsorted or missing dates; mixed frequencies;
     *                        and rows with the wrong number of cells
     */
    public static SeriesTable read(Path file) {
        byte[] bytes = readBytes(file);
        SeriesTable plain = PlainCsv.read(file, bytes);
        return plain != null ? plain : read(file, decodeUtf8(file, bytes));
    }

    /** The general reader over the decoded text (Commons CSV): the parser of record, and every refusal. */
    static SeriesTable read(Path file, String text) {
        List<RawRow> rows = parse(file, text);
        if (rows.isEmpty()) {
            throw InputException.in(file).problem("the file is empty",
                    "write a header row (date, then one name per series) and one row per period below it");
        }
        RawRow header = rows.get(0);
        List<String> names = columnNames(file, header);
        if (rows.size() == 1) {
            throw InputException.in(file).line(header.line + 1).problem(
                    "the file has a header but no data rows",
                    "add one row per period below the header, starting with its date");
        }
        List<RawRow> data = rows.subList(1, rows.size());
        String dateName = header.cells.get(0).isEmpty() ? DATE_HEADER : header.cells.get(0);

        int rowCount = data.size();
        double[][] columns = new double[names.size()][rowCount];
        int[] lines = new int[rowCount];
        List<Period.Parsed> parsedDates = new ArrayList<>(rowCount);
        for (int t = 0; t < rowCount; t++) {
            RawRow row = data.get(t);
            lines[t] = row.line;
            if (row.cells.size() != header.cells.size()) {
                throw InputException.in(file).line(row.line).problem(
                        "this row has " + row.cells.size() + " cells but the header has " + header.cells.size(),
                        "give every row a date and one value per column; look for a missing or extra comma");
            }
            parsedDates.add(parseDate(file, row, dateName, parsedDates.isEmpty() ? null : parsedDates.get(0),
                    data.get(0).line));
            for (int j = 0; j < names.size(); j++) {
                columns[j][t] = parseNumber(file, row.line, j + 2, names.get(j), row.cells.get(j + 1));
            }
        }
        List<Period> dates = index(file, parsedDates, lines, dateName);
        Frequency frequency = dates.get(0).frequency();
        return new SeriesTable(file, frequency, dates, names, columns, lines);
    }

    /**
     * Writes a table as a wide CSV file that {@link #read} reads back to the same dates, names and
     * values.
     *
     * <p>The output is deterministic, so the same table gives byte-identical files on any platform
     * and Java version: UTF-8 without a byte-order mark, "\n" line endings, a header of
     * {@value #DATE_HEADER} and the column names, dates in the canonical {@link Period#label()}
     * notation (a file read with YYYY-MM-DD or YYYYMM dates is written as YYYY-MM), and each number
     * with the fewest of 15, 16 or 17 significant digits that reads back to exactly the same double,
     * trailing zeros removed ("0.0123", "1.5", "2", "1.2E-7"). Decimal arithmetic is used rather
     * than {@link Double#toString}, whose digits changed between Java versions. Negative zero is
     * written as "0".
     *
     * @throws InputException if the file cannot be written (naming it and the reason)
     */
    public static void write(SeriesTable table, Path file) {
        try {
            Path parent = file.toAbsolutePath().getParent();
            if (parent != null) {
                Files.createDirectories(parent);
            }
            try (Writer out = Files.newBufferedWriter(file, StandardCharsets.UTF_8);
                 CSVPrinter printer = new CSVPrinter(out, WRITE_FORMAT)) {
                List<String> header = new ArrayList<>();
                header.add(DATE_HEADER);
                header.addAll(table.columnNames());
                printer.printRecord(header);
                double[][] columns = table.columns();
                List<String> cells = new ArrayList<>(columns.length + 1);
                for (int t = 0; t < table.rows(); t++) {
                    cells.clear();
                    cells.add(table.dates().get(t).label());
                    for (double[] column : columns) {
                        cells.add(formatNumber(column[t]));
                    }
                    printer.printRecord(cells);
                }
            }
        } catch (IOException | UncheckedIOException e) {
            throw InputException.in(file).problem("the file could not be written (" + e.getMessage() + ")",
                    "check that the folder exists and is writable and that the file is not open elsewhere");
        }
    }

    /**
     * The number as {@link #write} prints it: the fewest of 15, 16 or 17 significant digits that
     * parse back to exactly {@code value}.
     *
     * @throws IllegalArgumentException for NaN or infinity, which a table never holds
     */
    public static String formatNumber(double value) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException("not a finite number: " + value);
        }
        if (value == 0.0) {
            return "0";
        }
        BigDecimal exact = new BigDecimal(value);
        for (int digits = 15; digits <= 17; digits++) {
            BigDecimal rounded = exact.round(new MathContext(digits, RoundingMode.HALF_EVEN)).stripTrailingZeros();
            if (rounded.scale() < 0) {
                rounded = rounded.setScale(0);
            }
            String text = rounded.toString();
            if (Double.parseDouble(text) == value) {
                return text;
            }
        }
        // 17 significant digits always identify a double; reaching here would be a JDK defect.
        throw new IllegalStateException("no round-trip decimal for " + value);
    }

    record RawRow(int line, List<String> cells) {
        boolean blank() {
            return cells.stream().allMatch(String::isEmpty);
        }
    }

    static String readText(Path file) {
        return decodeUtf8(file, readBytes(file));
    }

    /** The file's bytes, refusing a missing, unreadable or folder path. */
    private static byte[] readBytes(Path file) {
        if (!Files.exists(file)) {
            throw InputException.in(file).problem(
                    "the file does not exist (looked for " + file.toAbsolutePath().normalize() + ")",
                    "check the spelling of the path; paths in a model file are relative to the model file's folder");
        }
        if (Files.isDirectory(file)) {
            throw InputException.in(file).problem("this is a folder, not a file",
                    "point to a CSV file" + csvFilesIn(file));
        }
        if (!Files.isReadable(file)) {
            throw InputException.in(file).problem("the file cannot be read (permission denied)",
                    "give your user read permission on the file, or copy it somewhere readable");
        }
        try {
            return Files.readAllBytes(file);
        } catch (IOException e) {
            throw InputException.in(file).problem("the file cannot be read (" + e.getMessage() + ")",
                    "check that the file is a regular file you may read and that the disk is reachable");
        }
    }

    private static String csvFilesIn(Path folder) {
        try (Stream<Path> entries = Files.list(folder)) {
            List<String> csv = entries.map(p -> p.getFileName().toString())
                    .filter(n -> n.toLowerCase(Locale.ROOT).endsWith(".csv")).sorted().limit(6).toList();
            return csv.isEmpty() ? "" : " inside it, e.g. " + String.join(", ", csv);
        } catch (IOException | UncheckedIOException e) {
            return "";
        }
    }

    /** Strict UTF-8 so a Latin-1 file is refused at the line where it goes wrong, not misread. */
    private static String decodeUtf8(Path file, byte[] bytes) {
        int offset = bytes.length >= 3 && (bytes[0] & 0xFF) == 0xEF && (bytes[1] & 0xFF) == 0xBB
                && (bytes[2] & 0xFF) == 0xBF ? 3 : 0;
        CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
                .onMalformedInput(CodingErrorAction.REPORT)
                .onUnmappableCharacter(CodingErrorAction.REPORT);
        ByteBuffer in = ByteBuffer.wrap(bytes, offset, bytes.length - offset);
        CharBuffer out = CharBuffer.allocate(bytes.length);
        CoderResult result = decoder.decode(in, out, true);
        if (!result.isError()) {
            result = decoder.flush(out);
        }
        if (result.isError()) {
            int line = 1;
            for (int i = 0; i < in.position(); i++) {
                if (bytes[i] == '\n') {
                    line++;
                }
            }
            throw InputException.in(file).line(line).problem(
                    "the file contains bytes that are not UTF-8 text (byte " + (in.position() + 1) + ")",
                    "save the file as UTF-8 (in a spreadsheet: \"CSV UTF-8\"), or remove the odd character");
        }
        out.flip();
        return out.toString();
    }

    static List<RawRow> parse(Path file, String text) {
        List<RawRow> rows = new ArrayList<>();
        long consumed = 0;
        try (CSVParser parser = CSVParser.parse(text, READ_FORMAT)) {
            for (CSVRecord record : parser) {
                rows.add(new RawRow((int) consumed + 1, record.toList()));
                consumed = parser.getCurrentLineNumber();
            }
        } catch (IOException | UncheckedIOException | IllegalStateException e) {
            throw InputException.in(file).line((int) consumed + 1).problem(
                    "the CSV text cannot be split into cells from here on (" + rootMessage(e) + ")",
                    "check the quotes: every opening \" needs a closing \", and a quote inside a quoted cell is written \"\"");
        }
        int end = rows.size();
        while (end > 0 && rows.get(end - 1).blank()) {
            end--;
        }
        List<RawRow> kept = rows.subList(0, end);
        for (RawRow row : kept) {
            if (row.blank()) {
                throw InputException.in(file).line(row.line).problem(
                        "a blank line sits between rows of the file",
                        "delete the blank line; blank lines are allowed only at the end of the file");
            }
        }
        return kept;
    }

    private static String rootMessage(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null && t.getCause() != t) {
            t = t.getCause();
        }
        return t.getMessage();
    }

    static List<String> columnNames(Path file, RawRow header) {
        List<String> cells = header.cells;
        if (cells.size() < 2) {
            String only = cells.isEmpty() ? "" : cells.get(0);
            String fix = only.contains(";") ? "separate cells with commas, not semicolons"
                    : only.contains("\t") ? "separate cells with commas, not tabs"
                    : "add one column per series after the date column, separated by commas";
            throw InputException.in(file).line(header.line).problem(
                    "the header has only one column, so there are no series to read", fix);
        }
        // Without this check a file lacking its header would lose its first row and name its
        // columns after numbers, and every later message would be confusing.
        if (Period.parseNotation(cells.get(0)) != null
                && cells.subList(1, cells.size()).stream().allMatch(c -> NUMBER.matcher(c).matches())) {
            throw InputException.in(file).line(header.line).problem(
                    "the first line looks like data (a date and numbers), not a header",
                    "add a header line above it: the word date, then one name per column, e.g. date,P01,P02");
        }
        return checkedNames(file, header.line, cells.subList(1, cells.size()), 2);
    }

    /**
     * The series names of a header, refusing an empty or repeated name at its column;
     * {@code firstColumn} is the 1-based file column of the first name.
     */
    static List<String> checkedNames(Path file, int line, List<String> cells, int firstColumn) {
        List<String> names = new ArrayList<>();
        Map<String, Integer> seen = new HashMap<>();
        for (int c = 0; c < cells.size(); c++) {
            String name = cells.get(c);
            int column = c + firstColumn;
            if (name.isEmpty()) {
                throw InputException.in(file).line(line).column(column, null).problem(
                        "column " + column + " has no name in the header",
                        "give every column a name, or delete the empty column (often a trailing comma)");
            }
            Integer earlier = seen.putIfAbsent(name, column);
            if (earlier != null) {
                throw InputException.in(file).line(line).column(column, name).problem(
                        "the column name \"" + name + "\" appears twice, in columns " + earlier + " and " + column,
                        "rename one of the two columns so every name is unique");
            }
            names.add(name);
        }
        return List.copyOf(names);
    }

    static Period.Parsed parseDate(Path file, RawRow row, String dateName, Period.Parsed first,
                                           int firstLine) {
        String cell = row.cells.get(0);
        Period.Parsed parsed = Period.parseNotation(cell);
        if (parsed == null) {
            String fix = cell.matches("\\d{8}")
                    ? "write the day with dashes, e.g. " + cell.substring(0, 4) + "-" + cell.substring(4, 6) + "-"
                    + cell.substring(6) + "; accepted are " + Period.ACCEPTED_FORMATS
                    : "write dates as " + Period.ACCEPTED_FORMATS + " (e.g. 1970-01 or 1970Q1), with a real month and day";
            throw InputException.in(file).line(row.line).column(1, dateName).problem(
                    cell.isEmpty() ? "the date cell is empty" : "\"" + cell + "\" is not a date", fix);
        }
        if (first != null && parsed.notation() != first.notation()) {
            Frequency mine = notationFrequency(parsed.notation());
            Frequency theirs = notationFrequency(first.notation());
            if (mine != null && theirs != null && mine != theirs) {
                throw InputException.in(file).line(row.line).column(1, dateName).problem(
                        "mixed frequencies: the date " + cell + " is " + mine.id() + ", but the first date ("
                                + "line " + firstLine + ") is " + theirs.id(),
                        "keep one frequency per file; put " + mine.id() + " series in a file of their own"
                                + " (monthly returns can be compounded to quarterly)");
            }
            throw InputException.in(file).line(row.line).column(1, dateName).problem(
                    "the date " + cell + " is written as " + parsed.notation().shape + ", but the first date (line "
                            + firstLine + ") is written as " + first.notation().shape,
                    "write every date of the file in one notation, " + first.notation().shape);
        }
        return parsed;
    }

    /** The frequency a notation fixes by itself; null for full days, whose spacing decides. */
    private static Frequency notationFrequency(Period.Notation notation) {
        return switch (notation) {
            case DAY -> null;
            case MONTH_DASH, MONTH_COMPACT -> Frequency.MONTHLY;
            case QUARTER -> Frequency.QUARTERLY;
            case YEAR -> Frequency.ANNUAL;
        };
    }

    static double parseNumber(Path file, int line, int column, String name, String cell) {
        if (isPlainNumber(cell)) {
            double value = Double.parseDouble(cell);
            if (Double.isFinite(value)) {
                return value;
            }
        }
        String lower = cell.toLowerCase(Locale.ROOT);
        if (cell.isEmpty() || MISSING_MARKERS.contains(lower)) {
            throw InputException.in(file).line(line).column(column, name).problem(
                    cell.isEmpty() ? "the cell is empty (a missing value)" : "the cell holds \"" + cell
                            + "\", a missing value",
                    "missing values are not supported yet: fill in the value, or set the sample start/end"
                            + " to dates where every column has data");
        }
        if (INFINITE_MARKERS.contains(lower)) {
            throw InputException.in(file).line(line).column(column, name).problem(
                    "the cell holds \"" + cell + "\", which is not a finite number",
                    "replace it with the actual value; infinite values cannot enter the moments");
        }
        if (!NUMBER.matcher(cell).matches()) {
            String fix;
            if (cell.endsWith("%")) {
                fix = "remove the % sign and declare units = \"percent\" for this file";
            } else if (cell.matches("[+-]?\\d+,\\d+")) {
                fix = "use a point as the decimal separator (" + cell.replace(',', '.') + ")";
            } else {
                fix = "write a plain number such as 0.0123, -1.5 or 1.2e-3 (point as decimal separator,"
                        + " no thousands separators, no units)";
            }
            throw InputException.in(file).line(line).column(column, name).problem(
                    "\"" + cell + "\" is not a number", fix);
        }
        double value = Double.parseDouble(cell);
        if (!Double.isFinite(value)) {
            throw InputException.in(file).line(line).column(column, name).problem(
                    "\"" + cell + "\" is too large to be stored as a number",
                    "check the value; returns and macro series are never this large");
        }
        return value;
    }

    /**
     * Whether the cell matches {@link #NUMBER}, checked character by character: the cells of a wide file
     * are almost all plain numbers, and the pattern matcher costs more than the parse.
     */
    static boolean isPlainNumber(String cell) {
        int n = cell.length();
        int i = 0;
        if (i < n && (cell.charAt(i) == '+' || cell.charAt(i) == '-')) {
            i++;
        }
        int digits = 0;
        while (i < n && isDigit(cell.charAt(i))) {
            i++;
            digits++;
        }
        if (i < n && cell.charAt(i) == '.') {
            i++;
            while (i < n && isDigit(cell.charAt(i))) {
                i++;
                digits++;
            }
        }
        if (digits == 0) {
            return false;
        }
        if (i < n && (cell.charAt(i) == 'e' || cell.charAt(i) == 'E')) {
            i++;
            if (i < n && (cell.charAt(i) == '+' || cell.charAt(i) == '-')) {
                i++;
            }
            int exponent = 0;
            while (i < n && isDigit(cell.charAt(i))) {
                i++;
                exponent++;
            }
            if (exponent == 0) {
                return false;
            }
        }
        return i == n;
    }

    private static boolean isDigit(char c) {
        return c >= '0' && c <= '9';
    }

    /** Fixes the frequency and checks that the dates form one increasing index without gaps. */
    static List<Period> index(Path file, List<Period.Parsed> parsed, int[] lines, String dateName) {
        Frequency frequency = notationFrequency(parsed.get(0).notation());
        if (frequency == null) {
            frequency = dayFrequency(file, parsed, lines, dateName);
        }
        List<Period> dates = new ArrayList<>(parsed.size());
        Map<Period, Integer> seen = new HashMap<>();
        for (int t = 0; t < parsed.size(); t++) {
            Period.Parsed p = parsed.get(t);
            Period date = p.notation() == Period.Notation.DAY ? p.period().containingPeriod(frequency) : p.period();
            String text = text(p);
            Integer earlier = seen.putIfAbsent(date, t);
            if (earlier != null) {
                String earlierText = text(parsed.get(earlier));
                String problem = earlierText.equals(text)
                        ? "the date " + text + " appears twice, on lines " + lines[earlier] + " and " + lines[t]
                        : "the dates " + earlierText + " (line " + lines[earlier] + ") and " + text + " fall in the same "
                        + unitWord(frequency) + " " + date;
                throw InputException.in(file).line(lines[t]).column(1, dateName).problem(problem,
                        "keep one row per " + unitWord(frequency) + " and delete the other");
            }
            if (t > 0 && dates.get(t - 1).compareTo(date) > 0) {
                throw InputException.in(file).line(lines[t]).column(1, dateName).problem(
                        "the dates are not sorted: " + text + " comes after " + text(parsed.get(t - 1))
                                + " (line " + lines[t - 1] + ")",
                        "sort the rows by date, oldest first");
            }
            dates.add(date);
        }
        // Gaps are looked for only once the order is known to be right: in a shuffled file every
        // other row looks like a gap, and "sort the rows" is the fix that helps.
        for (int t = 1; t < dates.size(); t++) {
            Period previous = dates.get(t - 1);
            Period date = dates.get(t);
            int step = previous.until(date);
            if (step > 1) {
                String missing = step == 2 ? previous.plus(1).label()
                        : previous.plus(1) + " to " + date.plus(-1) + " (" + (step - 1) + " " + unitWord(frequency) + "s)";
                throw InputException.in(file).line(lines[t]).column(1, dateName).problem(
                        "the dates jump from " + previous + " (line " + lines[t - 1] + ") to " + date
                                + "; missing: " + missing,
                        "add the missing rows, or start or end the sample so that it has no gap;"
                                + " every " + unitWord(frequency) + " needs a row");
            }
        }
        return dates;
    }

    /**
     * Full days say nothing by themselves about frequency; the spacing of the first two dates
     * decides, because files of month-end or quarter-end days are common and both look alike row by
     * row. The index check that follows then holds every later row to that frequency.
     */
    private static Frequency dayFrequency(Path file, List<Period.Parsed> parsed, int[] lines, String dateName) {
        if (parsed.size() == 1) {
            return Frequency.MONTHLY;
        }
        LocalDate d0 = parsed.get(0).day();
        LocalDate d1 = parsed.get(1).day();
        Period m0 = parsed.get(0).period();
        Period m1 = parsed.get(1).period();
        int months = m0.until(m1);
        if (months == 1) {
            return Frequency.MONTHLY;
        }
        if (m0.containingPeriod(Frequency.QUARTERLY).until(m1.containingPeriod(Frequency.QUARTERLY)) == 1) {
            return Frequency.QUARTERLY;
        }
        if (m1.year() - m0.year() == 1) {
            return Frequency.ANNUAL;
        }
        String first = d0 + " (line " + lines[0] + ")";
        if (d1.equals(d0)) {
            throw InputException.in(file).line(lines[1]).column(1, dateName).problem(
                    "the date " + d1 + " appears twice, on lines " + lines[0] + " and " + lines[1],
                    "keep one row per period and delete the other");
        }
        if (d1.isBefore(d0)) {
            throw InputException.in(file).line(lines[1]).column(1, dateName).problem(
                    "the dates are not sorted: " + d1 + " comes after " + first,
                    "sort the rows by date, oldest first");
        }
        if (months == 0) {
            throw InputException.in(file).line(lines[1]).column(1, dateName).problem(
                    "the dates " + first + " and " + d1 + " fall in the same month; daily or weekly data are not supported",
                    "keep one row per month (e.g. the last trading day) or per quarter");
        }
        throw InputException.in(file).line(lines[1]).column(1, dateName).problem(
                "the frequency cannot be told: the first two dates, " + first + " and " + d1 + ", are " + months
                        + " months apart, which is neither monthly, quarterly nor annual",
                "use one row per consecutive month, quarter or year, or write the dates as YYYY-MM or YYYYQn");
    }

    private static String text(Period.Parsed p) {
        return p.text();
    }

    private static String unitWord(Frequency frequency) {
        return switch (frequency) {
            case MONTHLY -> "month";
            case QUARTERLY -> "quarter";
            case ANNUAL -> "year";
        };
    }
}
