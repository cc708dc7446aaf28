package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A table as LaTeX with booktabs rules (\toprule, \midrule, \bottomrule), for {@code \input} into a
 * paper whose preamble loads {@code booktabs} and {@code graphicx}. Standard errors declared with
 * {@link Table.Builder#errorUnder} sit in parentheses on a line of their own under the estimate;
 * parameter names are set in math mode (β, b with the factor as a subscript); the notes go in a
 * footnote-size block under the rules.
 *
 * <p>Fitting the page: every tabular shrinks to the text width when it is wider (and is never
 * enlarged), and a table of more than {@value #FLOAT_LINES} body lines (the sensitivity grid, many
 * windows) is split into several {@code table} floats of at most that many lines, the later ones
 * captioned "(continued)" and the notes under the last. Labels are {@code tab:<run>-<table>}, so the
 * tables of two models input into one paper never share a label.
 */
public final class LatexTables {
    /** The most body lines one table float holds (a row with a standard error under it takes two). */
    static final int FLOAT_LINES = 40;

    private LatexTables() {
    }

    /** The LaTeX source of {@code table}, labelled as a table of the run {@code key}, ending in a newline. */
    public static String write(Table table, String key) {
        List<Integer> shown = table.shownColumns();
        StringBuilder spec = new StringBuilder();
        for (int c : shown) {
            spec.append(table.isNumericColumn(c) ? 'r' : 'l');
        }
        List<String> header = new ArrayList<>();
        for (int c : shown) {
            header.add(escape(table.header().get(c)));
        }
        boolean stacked = !table.errorUnder().isEmpty();
        int rowsPerFloat = Math.max(1, FLOAT_LINES / (stacked ? 2 : 1));
        int rows = table.rows().size();
        int floats = Math.max(1, (rows + rowsPerFloat - 1) / rowsPerFloat);
        StringBuilder out = new StringBuilder();
        out.append("% ").append(escape(table.caption())).append(" (written by Orthogon)\n");
        for (int part = 0; part < floats; part++) {
            out.append("\\begin{table}[htbp]\n\\centering\n");
            String suffix = part == 0 ? "" : "-" + (part + 1);
            out.append("\\caption{").append(escape(table.caption())).append(part == 0 ? "" : " (continued)")
                    .append("}\n");
            out.append("\\label{tab:").append(key).append('-').append(table.id()).append(suffix).append("}\n");
            // Shrunk to the text width when wider, never enlarged.
            out.append("\\resizebox{\\ifdim\\width>\\linewidth\\linewidth\\else\\width\\fi}{!}{%\n");
            out.append("\\begin{tabular}{").append(spec).append("}\n\\toprule\n");
            row(out, header);
            out.append("\\midrule\n");
            int to = Math.min(rows, (part + 1) * rowsPerFloat);
            for (List<Cell> cells : table.rows().subList(part * rowsPerFloat, to)) {
                List<String> main = new ArrayList<>();
                List<String> under = new ArrayList<>();
                for (int c : shown) {
                    Cell cell = cells.get(c);
                    main.add(cell.parameter() ? symbol(cell.text()) : escape(cell.text()));
                    int error = table.errorColumnUnder(c);
                    under.add(error >= 0 ? "(" + escape(cells.get(error).text()) + ")" : "");
                }
                row(out, main);
                if (stacked) {
                    row(out, under);
                }
            }
            out.append("\\bottomrule\n\\end{tabular}}\n");
            if (part == floats - 1) {
                notes(out, table);
            }
            out.append("\\end{table}\n");
        }
        return out.toString();
    }

    private static void notes(StringBuilder out, Table table) {
        if (!table.notes().isEmpty()) {
            out.append("\\par\\smallskip\n{\\footnotesize\n");
            for (String note : table.notes()) {
                out.append(escape(note)).append("\\par\n");
            }
            out.append("}\n");
        }
    }

    /** A minimal document around the given table sources, so they can be compiled on their own. */
    public static String standalone(List<String> tables) {
        StringBuilder out = new StringBuilder("\\documentclass{article}\n\\usepackage[T1]{fontenc}\n"
                + "\\usepackage{booktabs}\n\\usepackage{graphicx}\n\\begin{document}\n");
        tables.forEach(out::append);
        return out.append("\\end{document}\n").toString();
    }

    private static void row(StringBuilder out, List<String> cells) {
        out.append(String.join(" & ", cells)).append(" \\\\\n");
    }

    /** Parameter names that are Greek letters, as LaTeX writes them. */
    private static final Map<String, String> GREEK = Map.ofEntries(Map.entry("alpha", "\\alpha"),
            Map.entry("beta", "\\beta"), Map.entry("gamma", "\\gamma"), Map.entry("delta", "\\delta"),
            Map.entry("epsilon", "\\varepsilon"), Map.entry("eta", "\\eta"), Map.entry("theta", "\\theta"),
            Map.entry("kappa", "\\kappa"), Map.entry("lambda", "\\lambda"), Map.entry("mu", "\\mu"),
            Map.entry("nu", "\\nu"), Map.entry("rho", "\\rho"), Map.entry("sigma", "\\sigma"),
            Map.entry("tau", "\\tau"), Map.entry("phi", "\\phi"), Map.entry("psi", "\\psi"),
            Map.entry("omega", "\\omega"), Map.entry("xi", "\\xi"), Map.entry("zeta", "\\zeta"));

    private static final Pattern NAME = Pattern.compile("([A-Za-z]+)(?:_(.+))?");

    /**
     * A parameter name in math mode: a Greek letter's name as the letter ("beta" as β), a single letter
     * in italics ("a"), anything else upright; what follows the first underscore becomes an upright
     * subscript ("b_MKT" as b with subscript MKT; "*" in a scaled factor's name as ×). A name of another
     * shape stays text.
     */
    static String symbol(String name) {
        Matcher m = NAME.matcher(name);
        if (!m.matches()) {
            return escape(name);
        }
        String base = m.group(1);
        String symbol = GREEK.getOrDefault(base.toLowerCase(Locale.ROOT), base.length() == 1 ? base
                : "\\mathrm{" + base + "}");
        if (GREEK.containsKey(base.toLowerCase(Locale.ROOT)) && !base.equals(base.toLowerCase(Locale.ROOT))) {
            symbol = "\\mathrm{" + base + "}"; // upper-case Greek names are left as words, not guessed
        }
        String subscript = m.group(2);
        if (subscript == null) {
            return "$" + symbol + "$";
        }
        StringBuilder sub = new StringBuilder();
        for (String part : subscript.split("\\*", -1)) {
            if (sub.length() > 0) {
                sub.append("\\times");
            }
            sub.append("\\mathrm{").append(escapeInMath(part)).append('}');
        }
        return "$" + symbol + "_{" + sub + "}$";
    }

    private static String escapeInMath(String text) {
        StringBuilder out = new StringBuilder();
        for (char ch : text.toCharArray()) {
            switch (ch) {
                case '_', '&', '%', '$', '#', '{', '}' -> out.append('\\').append(ch);
                case '^', '~', '\\' -> out.append("\\text{?}");
                default -> out.append(ch);
            }
        }
        return out.toString();
    }

    /**
     * Text safe inside a LaTeX paragraph: the ten special characters get their escapes, and the few
     * non-ASCII symbols Orthogon writes itself become commands (α, χ, θ in math mode; ² as a
     * superscript; | as \textbar, which every font encoding prints), so the source compiles without
     * Unicode packages. Neighbouring math pieces are joined ("χ²" becomes one $\chi^{2}$), since "$$"
     * would start display math.
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
                case '|' -> out.append("\\textbar{}");
                case '\u00B2' -> out.append("$^{2}$");
                case '\u03B1' -> out.append("$\\alpha$");
                case '\u03C7' -> out.append("$\\chi$");
                case '\u03B8' -> out.append("$\\theta$");
                case '\u00B1' -> out.append("$\\pm$");
                case '\u2212' -> out.append("$-$");
                case '\u2013' -> out.append("--");
                case '\n' -> out.append(' ');
                default -> out.append(ch);
            }
        }
        return joinMath(out.toString());
    }

    /** "$a$$b$" as "$ab$": adjacent math pieces made one, but an escaped dollar "\$" left alone. */
    private static String joinMath(String text) {
        StringBuilder out = new StringBuilder(text.length());
        for (int i = 0; i < text.length(); i++) {
            boolean escaped = i > 0 && text.charAt(i - 1) == '\\';
            if (!escaped && text.startsWith("$$", i)) {
                i++;
                continue;
            }
            out.append(text.charAt(i));
        }
        return out.toString();
    }
}
