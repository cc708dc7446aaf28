package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;

/**
 * A plain-text table with a header row, right-aligned numeric columns and a left-aligned first
 * column, for the console and for text files.
 */
final class TextTable {
    private final List<String> header;
    private final List<List<String>> rows = new ArrayList<>();

    TextTable(List<String> header) {
        this.header = List.copyOf(header);
    }

    TextTable row(List<String> cells) {
        if (cells.size() != header.size()) {
            throw new IllegalArgumentException("row has " + cells.size() + " cells, header has " + header.size());
        }
        rows.add(List.copyOf(cells));
        return this;
    }

    String render(String indent) {
        int[] widths = new int[header.size()];
        for (int c = 0; c < widths.length; c++) {
            widths[c] = header.get(c).length();
            for (List<String> row : rows) {
                widths[c] = Math.max(widths[c], row.get(c).length());
            }
        }
        StringBuilder out = new StringBuilder();
        appendRow(out, indent, header, widths);
        StringBuilder rule = new StringBuilder(indent);
        for (int c = 0; c < widths.length; c++) {
            rule.append(c == 0 ? "" : "  ").append("-".repeat(widths[c]));
        }
        out.append(rule).append('\n');
        for (List<String> row : rows) {
            appendRow(out, indent, row, widths);
        }
        return out.toString();
    }

    private static void appendRow(StringBuilder out, String indent, List<String> cells, int[] widths) {
        out.append(indent);
        for (int c = 0; c < cells.size(); c++) {
            String cell = cells.get(c);
            String pad = " ".repeat(widths[c] - cell.length());
            out.append(c == 0 ? "" : "  ").append(c == 0 ? cell + pad : pad + cell);
        }
        out.append('\n');
    }
}
