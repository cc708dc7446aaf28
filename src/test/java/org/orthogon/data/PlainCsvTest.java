package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The fast path of the CSV reader against the general reader (Commons CSV) and Java's own number parser:
 * on every file it accepts it must give the very table the general reader gives, and on every number the
 * very double {@link Double#parseDouble} gives (the JDK parser is correctly rounded, so both are the one
 * correct answer). Whatever it does not accept goes to the general reader, so the refusals stay that
 * reader's; the mutated files below check both halves of that bargain.
 */
class PlainCsvTest {
    @TempDir
    Path dir;

    @Test
    void numbersAreTheDoublesJavasParserGives() {
        String[] cells = {"0", "-0", "+0", "0.0", "-0.0", "1", "-1", "+1.", ".5", "-.5", "1e3", "1E-3", "1.5e+7",
            "0.0123", "9007199254740992", "9007199254740993", "123456789012345678", "1234567890123456789",
            "0.1", "0.2", "0.3", "1e22", "1e23", "1e-22", "1e-23", "4.35", "2.675", "1.7976931348623157e308",
            "4.9e-324", "1e-400", "1e999", "0e999", "0.000000000000000000000000001", "100000000000000000000000",
            "000000123.4500000", "3.14159265358979323846", "-99.99", "5e-324", "2.2250738585072014E-308"};
        for (String cell : cells) {
            assertSameAsJava(cell);
        }
    }

    @Test
    void randomDecimalsAreTheDoublesJavasParserGives() {
        Random random = new Random(20251202L);
        for (int n = 0; n < 300_000; n++) {
            StringBuilder cell = new StringBuilder();
            if (random.nextInt(3) == 0) {
                cell.append(random.nextBoolean() ? '-' : '+');
            }
            int integer = random.nextInt(4) == 0 ? 0 : 1 + random.nextInt(random.nextBoolean() ? 3 : 12);
            for (int i = 0; i < integer; i++) {
                cell.append((char) ('0' + random.nextInt(10)));
            }
            if (integer == 0 || random.nextBoolean()) {
                cell.append('.');
                int fraction = (integer == 0 ? 1 : 0) + random.nextInt(random.nextBoolean() ? 8 : 20);
                for (int i = 0; i < fraction; i++) {
                    cell.append((char) ('0' + random.nextInt(10)));
                }
            }
            if (random.nextInt(5) == 0) {
                cell.append(random.nextBoolean() ? 'e' : 'E').append(random.nextBoolean() ? "-" : "")
                        .append(random.nextInt(random.nextBoolean() ? 30 : 330));
            }
            assertSameAsJava(cell.toString());
        }
    }

    @Test
    void cellsThatAreNotPlainNumbersAreNotParsed() {
        String alphabet = "0123456789+-.eE x";
        Random random = new Random(7L);
        for (int n = 0; n < 100_000; n++) {
            StringBuilder cell = new StringBuilder();
            int length = 1 + random.nextInt(7);
            for (int i = 0; i < length; i++) {
                cell.append(alphabet.charAt(random.nextInt(alphabet.length())));
            }
            String text = cell.toString();
            byte[] bytes = text.getBytes(StandardCharsets.ISO_8859_1);
            double parsed = PlainCsv.parsePlain(bytes, 0, bytes.length);
            assertThat(Double.isNaN(parsed)).as("\"%s\"", text).isEqualTo(!CsvSeries.NUMBER.matcher(text).matches());
            if (!Double.isNaN(parsed)) {
                assertSameAsJava(text);
            }
        }
    }

    @Test
    void mutatedFilesGiveTheGeneralReadersTableOrGoToIt() throws IOException {
        Random random = new Random(20251203L);
        int fast = 0;
        int cases = 6000;
        for (int n = 0; n < cases; n++) {
            byte[] bytes = mutate(base(random), random);
            Path file = dir.resolve("case.csv");
            Files.write(file, bytes);
            SeriesTable plain = PlainCsv.read(file, bytes);
            SeriesTable general;
            try {
                general = CsvSeries.read(file, CsvSeries.readText(file));
            } catch (InputException e) {
                assertThat(plain).as("case %d refused by the general reader (%s), accepted by the fast path:%n%s", n,
                        e.getMessage(), new String(bytes, StandardCharsets.UTF_8)).isNull();
                continue;
            }
            if (plain == null) {
                continue;
            }
            fast++;
            String context = "case " + n + ":\n" + new String(bytes, StandardCharsets.UTF_8);
            assertThat(plain.frequency()).as(context).isEqualTo(general.frequency());
            assertThat(plain.dates()).as(context).isEqualTo(general.dates());
            assertThat(plain.columnNames()).as(context).isEqualTo(general.columnNames());
            assertThat(plain.lineNumbers()).as(context).isEqualTo(general.lineNumbers());
            double[][] a = plain.columns();
            double[][] b = general.columns();
            assertThat(a.length).isEqualTo(b.length);
            for (int j = 0; j < a.length; j++) {
                for (int t = 0; t < a[j].length; t++) {
                    assertThat(Double.doubleToRawLongBits(a[j][t])).as(context)
                            .isEqualTo(Double.doubleToRawLongBits(b[j][t]));
                }
            }
        }
        // not a vacuous check: a good share of the files take the fast path
        assertThat(fast).isGreaterThan(cases / 5);
    }

    @Test
    void csvSeriesReadsTheUsualFileThroughTheFastPath() throws IOException {
        String text = "date,P01,P02\n1962-01,0.0123,-0.004\r\n1962-02, 0.02 ,1.5e-3\n";
        Path file = dir.resolve("usual.csv");
        Files.writeString(file, text);
        assertThat(PlainCsv.read(file, text.getBytes(StandardCharsets.UTF_8))).isNotNull();
        assertThat(CsvSeries.read(file).column("P02")).containsExactly(-0.004, 0.0015);
    }

    private static void assertSameAsJava(String cell) {
        byte[] bytes = cell.getBytes(StandardCharsets.ISO_8859_1);
        double expected = Double.parseDouble(cell);
        double actual = PlainCsv.parsePlain(bytes, 0, bytes.length);
        assertThat(Double.doubleToRawLongBits(actual)).as("\"%s\": %s against Java's %s", cell, actual, expected)
                .isEqualTo(Double.doubleToRawLongBits(expected));
    }

    private static final String[] DATES = {"1970-01", "197001", "1970Q1", "1970", "1970-01-31"};

    /** A valid file of a few rows in one of the date notations, numbers of every plain shape. */
    private static byte[] base(Random random) {
        String notation = DATES[random.nextInt(DATES.length)];
        int columns = 1 + random.nextInt(4);
        int rows = 1 + random.nextInt(6);
        StringBuilder csv = new StringBuilder(random.nextInt(5) == 0 ? "" : "date");
        for (int j = 0; j < columns; j++) {
            csv.append(',').append("P").append(j);
        }
        String eol = random.nextInt(4) == 0 ? "\r\n" : "\n";
        csv.append(eol);
        for (int t = 0; t < rows; t++) {
            csv.append(date(notation, t));
            for (int j = 0; j < columns; j++) {
                double value = (random.nextDouble() - 0.5) * Math.pow(10, random.nextInt(6) - 3);
                String cell = switch (random.nextInt(4)) {
                    case 0 -> Double.toString(value);
                    case 1 -> String.format(java.util.Locale.ROOT, "%.6f", value);
                    case 2 -> String.format(java.util.Locale.ROOT, "%.3e", value);
                    default -> Long.toString(Math.round(value * 100));
                };
                csv.append(',').append(random.nextInt(6) == 0 ? " " + cell + " " : cell);
            }
            if (t + 1 < rows || random.nextBoolean()) {
                csv.append(eol);
            }
        }
        return csv.toString().getBytes(StandardCharsets.UTF_8);
    }

    private static String date(String notation, int t) {
        int year = 1970 + t / 12;
        int month = 1 + t % 12;
        return switch (notation) {
            case "1970-01" -> String.format("%d-%02d", year, month);
            case "197001" -> String.format("%d%02d", year, month);
            case "1970Q1" -> (1970 + t / 4) + "Q" + (1 + t % 4);
            case "1970" -> Integer.toString(1970 + t);
            default -> java.time.YearMonth.of(year, month).atEndOfMonth().toString();
        };
    }

    private static final String[] TOKENS = {",", "\"", "\r", "\n", "\r\n", " ", "\t", "x", "0", "5", "e", "E", ".",
        "-", "+", "1e999", "NaN", "\u00e9", "\uFEFF", "#", ";", "", "date", "P0", "1970-02", "1970Q5", "\u0000"};

    /** Zero to three edits: a token inserted or put in place of a byte, a byte deleted, a line doubled or blanked. */
    private static byte[] mutate(byte[] bytes, Random random) {
        List<Byte> out = new ArrayList<>();
        for (byte b : bytes) {
            out.add(b);
        }
        int edits = random.nextInt(4);
        for (int e = 0; e < edits; e++) {
            int at = out.isEmpty() ? 0 : random.nextInt(out.size() + 1);
            switch (random.nextInt(4)) {
                case 0, 1 -> {
                    if (random.nextBoolean() && at < out.size()) {
                        out.remove(at);
                    }
                    byte[] token = TOKENS[random.nextInt(TOKENS.length)].getBytes(StandardCharsets.UTF_8);
                    for (int i = token.length - 1; i >= 0; i--) {
                        out.add(Math.min(at, out.size()), token[i]);
                    }
                }
                case 2 -> {
                    if (at < out.size()) {
                        out.remove(at);
                    }
                }
                default -> {
                    String text = new String(toArray(out), StandardCharsets.UTF_8);
                    List<String> lines = new ArrayList<>(Arrays.asList(text.split("\n", -1)));
                    int line = random.nextInt(lines.size());
                    if (random.nextBoolean()) {
                        lines.add(line, lines.get(line));
                    } else {
                        lines.add(line, random.nextBoolean() ? "" : ",,");
                    }
                    out.clear();
                    for (byte b : String.join("\n", lines).getBytes(StandardCharsets.UTF_8)) {
                        out.add(b);
                    }
                }
            }
        }
        return toArray(out);
    }

    private static byte[] toArray(List<Byte> list) {
        byte[] out = new byte[list.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = list.get(i);
        }
        return out;
    }
}
