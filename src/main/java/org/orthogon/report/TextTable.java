package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;

/**
 * A plain-text table with a header row, for the console and for text files: the first column and
 * text columns align left, numeric columns right.
 */
final class TextTable {
    /** Cells that right-align: numbers, and the placeholders printed in numeric columns. */
    private static final java.util.regex.Pattern NUMBER =
            java.util.regex.Pattern.compile("[-+]?[0-9.]+(e[-+]?[0-9]+)?|n/a|-|");
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
        boolean[] numeric = new boolean[header.size()];
        for (int c = 1; c < widths.length; c++) {
            numeric[c] = true;
            for (List<String> row : rows) {
                numeric[c] &= NUMBER.matcher(row.get(c)).matches();
            }
        }
        StringBuilder out = new StringBuilder();
        appendRow(out, indent, header, widths, numeric);
        StringBuilder rule = new StringBuilder(indent);
        for (int c = 0; c < widths.length; c++) {
            rule.append(c == 0 ? "" : "  ").append("-".repeat(widths[c]));
        }
        out.append(rule).append('\n');
        for (List<String> row : rows) {
            appendRow(out, indent, row, widths, numeric);
        }
        return out.toString();
    }

    private static void appendRow(StringBuilder out, String indent, List<String> cells, int[] widths,
            boolean[] numeric) {
        StringBuilder line = new StringBuilder(indent);
        for (int c = 0; c < cells.size(); c++) {
            String cell = cells.get(c);
            String pad = " ".repeat(widths[c] - cell.length());
            line.append(c == 0 ? "" : "  ").append(numeric[c] ? pad + cell : cell + pad);
        }
        out.append(line.toString().stripTrailing()).append('\n');
    }
}
