package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;

/**
 * A table as Markdown (the pipe-table dialect most renderers share): the caption in bold, the
 * table, then the notes. A standard error declared with {@link Table.Builder#errorUnder} goes in
 * parentheses on its own line under its estimate.
 */
public final class MarkdownTables {
    private MarkdownTables() {
    }

    /** The Markdown text of {@code table}, ending in a newline. */
    public static String write(Table table) {
        List<Integer> shown = table.shownColumns();
        StringBuilder out = new StringBuilder();
        out.append("**").append(escape(table.caption())).append("**\n\n");
        List<String> header = new ArrayList<>();
        List<String> rule = new ArrayList<>();
        for (int c : shown) {
            header.add(escape(table.header().get(c)));
            rule.add(table.isNumericColumn(c) ? "---:" : ":---");
        }
        line(out, header);
        line(out, rule);
        for (List<Cell> row : table.rows()) {
            for (List<String> texts : table.paperLines(row)) {
                line(out, texts.stream().map(MarkdownTables::escape).toList());
            }
        }
        if (!table.notes().isEmpty()) {
            out.append('\n');
            for (String note : table.notes()) {
                out.append(escape(note)).append("  \n");
            }
        }
        return out.toString();
    }

    private static void line(StringBuilder out, List<String> cells) {
        out.append("| ").append(String.join(" | ", cells)).append(" |\n");
    }

    /** Backslash-escapes the characters Markdown would read as markup or as a cell boundary. */
    static String escape(String text) {
        StringBuilder out = new StringBuilder(text.length());
        for (char ch : text.toCharArray()) {
            if ("\\|*_`[]<>#$".indexOf(ch) >= 0) {
                out.append('\\');
            }
            out.append(ch == '\n' ? ' ' : ch);
        }
        return out.toString();
    }
}
