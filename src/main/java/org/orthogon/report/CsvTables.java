package org.orthogon.report;

import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;

/**
 * A table as CSV for spreadsheets and scripts: one header line, one line per row, every column flat
 * (standard errors in their own column), numbers at full double precision, missing numbers empty.
 * Caption and notes are left out so the file stays rectangular.
 */
public final class CsvTables {
    private static final CSVFormat FORMAT = CSVFormat.DEFAULT.builder().setRecordSeparator("\n").get();

    private CsvTables() {
    }

    /** The CSV text of {@code table}, ending in a newline. */
    public static String write(Table table) {
        StringWriter text = new StringWriter();
        try (CSVPrinter printer = new CSVPrinter(text, FORMAT)) {
            printer.printRecord(table.header().stream().map(CsvTables::guard).toList());
            for (List<Cell> row : table.rows()) {
                List<String> values = new ArrayList<>(row.size());
                for (Cell cell : row) {
                    values.add(cell.numeric() ? cell.exact() : guard(cell.text()));
                }
                printer.printRecord(values);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("writing to memory cannot fail", e);
        }
        return text.toString();
    }

    /**
     * Text that a spreadsheet would run as a formula (it begins with =, +, -, @, a tab or a carriage
     * return) gets a leading apostrophe, which spreadsheets show as plain text. Numbers never come
     * here, so "-0.5" in a number column stays a number.
     */
    static String guard(String text) {
        if (!text.isEmpty() && "=+-@\t\r".indexOf(text.charAt(0)) >= 0) {
            return "'" + text;
        }
        return text;
    }
}
