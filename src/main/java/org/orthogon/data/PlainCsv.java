package org.orthogon.data;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * The fast path of {@link CsvSeries#read} for the file nearly everyone has: ASCII text without a quote
 * character, one record per line (LF or CRLF), a header and then rows of a date and plain decimal numbers.
 * It reads the bytes in place, parses each number without making a string of it, and builds the same
 * {@link SeriesTable} the general reader builds (the same names, dates, line numbers and bits).
 *
 * <p>It never refuses anything itself. At the first thing it does not handle, a byte above 127 (a
 * byte-order mark, any non-ASCII text, bytes that are not UTF-8), a quote, a carriage return that does not
 * end a line, a blank line, a row of the wrong length, a cell that is not a plain number or overflows, or a
 * header, date or index that the shared checks refuse, it returns null, and {@link CsvSeries#read} reads the
 * file from the start with the general reader (Commons CSV, the parser of record), whose result or refusal
 * stands. Every error message therefore comes from one reader.
 */
final class PlainCsv {
    /** 2^53: every long up to it is an exact double. */
    private static final long EXACT_MANTISSA = 1L << 53;
    /** 10^0..10^22, every one an exact double. */
    private static final double[] POWERS_OF_TEN = new double[23];

    static {
        double power = 1.0;
        for (int i = 0; i < POWERS_OF_TEN.length; i++) {
            POWERS_OF_TEN[i] = power;
            power *= 10.0;
        }
    }

    private PlainCsv() {
    }

    /** The table, or null when the general reader must read this file. */
    static SeriesTable read(Path file, byte[] bytes) {
        try {
            return readPlain(file, bytes);
        } catch (InputException e) {
            return null;
        }
    }

    private static SeriesTable readPlain(Path file, byte[] bytes) {
        int n = bytes.length;
        int newlines = 0;
        for (int i = 0; i < n; i++) {
            byte b = bytes[i];
            if (b < 0 || b == '"' || b == '\r' && (i + 1 == n || bytes[i + 1] != '\n')) {
                return null;
            }
            if (b == '\n') {
                newlines++;
            }
        }
        int headerEnd = lineEnd(bytes, 0);
        int contentEnd = withoutCarriageReturn(bytes, 0, headerEnd);
        List<String> headerCells = new ArrayList<>();
        for (int from = 0; ; ) {
            int comma = indexOf(bytes, ',', from, contentEnd);
            int to = comma < 0 ? contentEnd : comma;
            headerCells.add(new String(bytes, from, to - from, StandardCharsets.ISO_8859_1).trim());
            if (comma < 0) {
                break;
            }
            from = comma + 1;
        }
        if (headerCells.stream().allMatch(String::isEmpty)) {
            return null;
        }
        CsvSeries.RawRow header = new CsvSeries.RawRow(1, headerCells);
        List<String> names = CsvSeries.columnNames(file, header);
        String dateName = headerCells.get(0).isEmpty() ? CsvSeries.DATE_HEADER : headerCells.get(0);
        int width = names.size();

        int capacity = newlines + 1;
        double[][] columns = new double[width][capacity];
        int[] lines = new int[capacity];
        List<Period.Parsed> dates = new ArrayList<>(capacity);
        int rows = 0;
        int at = headerEnd + 1;
        while (at < n) {
            int end = lineEnd(bytes, at);
            int stop = withoutCarriageReturn(bytes, at, end);
            int line = rows + 2;
            // the date: up to the first comma; an empty one (a blank line among them) goes to the general reader
            int comma = indexOf(bytes, ',', at, stop);
            if (comma < 0) {
                return null;
            }
            int dateFrom = skipSpace(bytes, at, comma);
            int dateTo = trimEnd(bytes, dateFrom, comma);
            if (dateFrom == dateTo) {
                return null;
            }
            String dateText = new String(bytes, dateFrom, dateTo - dateFrom, StandardCharsets.ISO_8859_1);
            dates.add(CsvSeries.parseDate(file, new CsvSeries.RawRow(line, List.of(dateText)), dateName,
                    dates.isEmpty() ? null : dates.get(0), 2));
            int from = comma + 1;
            for (int j = 0; j < width; j++) {
                int next = j + 1 < width ? indexOf(bytes, ',', from, stop) : stop;
                if (next < 0 || j + 1 == width && indexOf(bytes, ',', from, stop) >= 0) {
                    return null;
                }
                int cellFrom = skipSpace(bytes, from, next);
                double value = parsePlain(bytes, cellFrom, trimEnd(bytes, cellFrom, next));
                if (!Double.isFinite(value)) {
                    return null;
                }
                columns[j][rows] = value;
                from = next + 1;
            }
            lines[rows] = line;
            rows++;
            at = end + 1;
        }
        if (rows == 0) {
            return null;
        }
        if (rows < capacity) {
            for (int j = 0; j < width; j++) {
                columns[j] = Arrays.copyOf(columns[j], rows);
            }
            lines = Arrays.copyOf(lines, rows);
        }
        List<Period> index = CsvSeries.index(file, dates, lines, dateName);
        return new SeriesTable(file, index.get(0).frequency(), index, names, columns, lines);
    }

    /** The position of the next '\n' at or after {@code from}, or the length. */
    private static int lineEnd(byte[] bytes, int from) {
        int i = from;
        while (i < bytes.length && bytes[i] != '\n') {
            i++;
        }
        return i;
    }

    /** {@code end} less the '\r' of a CRLF (a carriage return anywhere else has sent the file to the general reader). */
    private static int withoutCarriageReturn(byte[] bytes, int from, int end) {
        return end > from && bytes[end - 1] == '\r' ? end - 1 : end;
    }

    private static int indexOf(byte[] bytes, char c, int from, int to) {
        for (int i = from; i < to; i++) {
            if (bytes[i] == c) {
                return i;
            }
        }
        return -1;
    }

    /** The first position in [from, to) holding a character above ' ' (the whitespace String.trim removes), or to. */
    private static int skipSpace(byte[] bytes, int from, int to) {
        int i = from;
        while (i < to && bytes[i] <= ' ') {
            i++;
        }
        return i;
    }

    /** One past the last position in [from, to) holding a character above ' ', or from. */
    private static int trimEnd(byte[] bytes, int from, int to) {
        int i = to;
        while (i > from && bytes[i - 1] <= ' ') {
            i--;
        }
        return i;
    }

    /**
     * The double that {@link Double#parseDouble} gives for the ASCII cell bytes[from, to) when the cell is a
     * plain decimal number ({@link CsvSeries#NUMBER}); NaN when it is not one. A mantissa of at most 2^53 with a power of ten of at most 22 in size is
     * converted by one correctly rounded multiplication or division of two exact doubles (Clinger 1990, "How
     * to read floating point numbers accurately", PLDI '90), which is the correctly rounded value that
     * Java's parser returns; any other number goes to Java's parser itself.
     */
    static double parsePlain(byte[] bytes, int from, int to) {
        if (from >= to) {
            return Double.NaN;
        }
        int i = from;
        boolean negative = false;
        if (bytes[i] == '+' || bytes[i] == '-') {
            negative = bytes[i] == '-';
            i++;
        }
        long mantissa = 0;
        int significant = 0;
        int scale = 0;
        int digits = 0;
        boolean exact = true;
        // the integer and the fraction digits in one pass; a digit after the point lowers the scale
        boolean afterPoint = false;
        for (; i < to; i++) {
            if (bytes[i] == '.' && !afterPoint) {
                afterPoint = true;
                continue;
            }
            if (bytes[i] < '0' || bytes[i] > '9') {
                break;
            }
            digits++;
            int d = bytes[i] - '0';
            if (significant > 0 || d != 0) {
                if (significant < 18) {
                    mantissa = mantissa * 10 + d;
                    significant++;
                } else {
                    exact = false;
                }
            }
            if (afterPoint) {
                scale--;
            }
        }
        if (digits == 0) {
            return Double.NaN;
        }
        if (i < to && (bytes[i] == 'e' || bytes[i] == 'E')) {
            i++;
            boolean negativeExponent = false;
            if (i < to && (bytes[i] == '+' || bytes[i] == '-')) {
                negativeExponent = bytes[i] == '-';
                i++;
            }
            int exponent = 0;
            int exponentDigits = 0;
            for (; i < to && bytes[i] >= '0' && bytes[i] <= '9'; i++) {
                exponentDigits++;
                if (exponent < 100_000) {
                    exponent = exponent * 10 + (bytes[i] - '0');
                }
            }
            if (exponentDigits == 0) {
                return Double.NaN;
            }
            scale += negativeExponent ? -exponent : exponent;
        }
        if (i != to) {
            return Double.NaN;
        }
        double value;
        if (exact && mantissa <= EXACT_MANTISSA && Math.abs(scale) < POWERS_OF_TEN.length) {
            value = scale >= 0 ? mantissa * POWERS_OF_TEN[scale] : mantissa / POWERS_OF_TEN[-scale];
            return negative ? -value : value;
        }
        return Double.parseDouble(new String(bytes, from, to - from, StandardCharsets.ISO_8859_1));
    }
}
