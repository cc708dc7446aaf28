package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;

/**
 * A table as a LaTeX {@code table} float with booktabs rules (\toprule, \midrule, \bottomrule), for
 * {@code \input} into a paper whose preamble loads {@code booktabs}. Standard errors declared with
 * {@link Table.Builder#errorUnder} sit in parentheses on a line of their own under the estimate;
 * the notes (tests, p-values) go in a footnote-size block under the rules.
 */
public final class LatexTables {
    private LatexTables() {
    }

    /** The LaTeX source of {@code table}, ending in a newline. */
    public static String write(Table table) {
        List<Integer> shown = table.shownColumns();
        StringBuilder spec = new StringBuilder();
        for (int c : shown) {
            spec.append(table.isNumericColumn(c) ? 'r' : 'l');
        }
        StringBuilder out = new StringBuilder();
        out.append("% ").append(escape(table.caption())).append(" (written by Orthogon)\n");
        out.append("\\begin{table}[htbp]\n\\centering\n");
        out.append("\\caption{").append(escape(table.caption())).append("}\n");
        out.append("\\label{tab:").append(table.id()).append("}\n");
        out.append("\\begin{tabular}{").append(spec).append("}\n\\toprule\n");
        List<String> header = new ArrayList<>();
        for (int c : shown) {
            header.add(escape(table.header().get(c)));
        }
        row(out, header);
        out.append("\\midrule\n");
        for (List<Cell> cells : table.rows()) {
            for (List<String> texts : table.paperLines(cells)) {
                row(out, texts.stream().map(LatexTables::escape).toList());
            }
        }
        out.append("\\bottomrule\n\\end{tabular}\n");
        if (!table.notes().isEmpty()) {
            out.append("\\par\\smallskip\n{\\footnotesize\n");
            for (String note : table.notes()) {
                out.append(escape(note)).append("\\par\n");
            }
            out.append("}\n");
        }
        out.append("\\end{table}\n");
        return out.toString();
    }

    /** A minimal document around the given table sources, so they can be compiled on their own. */
    public static String standalone(List<String> tables) {
        StringBuilder out = new StringBuilder("\\documentclass{article}\n\\usepackage[T1]{fontenc}\n"
                + "\\usepackage{booktabs}\n\\begin{document}\n");
        tables.forEach(out::append);
        return out.append("\\end{document}\n").toString();
    }

    private static void row(StringBuilder out, List<String> cells) {
        out.append(String.join(" & ", cells)).append(" \\\\\n");
    }

    /**
     * Text safe inside a LaTeX paragraph: the ten special characters get their escapes, and the few
     * non-ASCII symbols Orthogon writes itself become commands, so the source compiles without
     * Unicode packages.
     */
    static String escape(String text) {
        StringBuilder out = new StringBuilder(text.length() + 8);
        for (int i = 0; i < text.length(); i++) {
            char ch = text.charAt(i);
            switch (ch) {
                case '&', '%', '$', '#', '_', '{', '}' -> out.append('\\').append(ch);
                case '~' -> out.append("\\textasciitilde{}");
                case '^' -> out.append("\\textasciicircum{}");
                case '\\' -> out.append("\\textbackslash{}");
                case '<' -> out.append("\\textless{}");
                case '>' -> out.append("\\textgreater{}");
                case '\u00B2' -> out.append("\\textsuperscript{2}");
                case '\u03C7' -> out.append("$\\chi$");
                case '\u03B8' -> out.append("$\\theta$");
                case '\u00B1' -> out.append("$\\pm$");
                case '\u2212' -> out.append("$-$");
                case '\u2013' -> out.append("--");
                case '\n' -> out.append(' ');
                default -> out.append(ch);
            }
        }
        return out.toString();
    }
}
