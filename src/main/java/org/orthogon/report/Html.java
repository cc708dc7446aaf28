package org.orthogon.report;

import java.util.List;

/**
 * A {@link Report} as one self-contained HTML file: the style sheet is inline, every chart is an
 * inline SVG, and nothing is fetched from anywhere (no script, font, image, link or address), so
 * the file can be e-mailed, opened offline and printed.
 */
public final class Html {
    private static final String STYLE = """
            :root { --ink: #233344; --muted: #5b6773; --accent: #2e6e73; --rule: #c9d0d6; --soft: #f3f5f6;
              --warn: #8a4b12; --warn-bg: #fbf3e6; }
            * { box-sizing: border-box; }
            body { margin: 0; color: var(--ink); background: #fff;
              font: 15px/1.5 "Segoe UI", "Helvetica Neue", Arial, sans-serif; }
            main { max-width: 62rem; margin: 0 auto; padding: 2rem 1.5rem 3rem; }
            header { border-bottom: 3px solid var(--accent); padding-bottom: .8rem; margin-bottom: 1.2rem; }
            h1 { font-size: 1.6rem; margin: 0 0 .4rem; line-height: 1.25; }
            header p { margin: .1rem 0; color: var(--muted); }
            h2 { font-size: 1.2rem; margin: 2rem 0 .6rem; padding-bottom: .2rem; border-bottom: 1px solid var(--rule); }
            section > p { margin: .4rem 0 .8rem; }
            .warnings { background: var(--warn-bg); border-left: 4px solid var(--warn); padding: .6rem 1rem;
              margin: 1rem 0; }
            .warnings h2 { border: 0; margin: 0 0 .3rem; font-size: 1rem; color: var(--warn); }
            .warnings ul { margin: 0; padding-left: 1.2rem; }
            figure { margin: 1rem 0 1.6rem; }
            figcaption { font-weight: 600; margin-bottom: .35rem; }
            table { border-collapse: collapse; font-variant-numeric: tabular-nums; min-width: 50%; }
            thead th { border-top: 2px solid var(--ink); border-bottom: 1px solid var(--ink); font-weight: 600; }
            tbody tr:last-child td { border-bottom: 2px solid var(--ink); }
            th, td { padding: .22rem .8rem; text-align: left; white-space: nowrap; }
            .num { text-align: right; }
            tr.se td { color: var(--muted); padding-top: 0; font-size: .92em; }
            tbody tr.flat:nth-child(even) td { background: var(--soft); }
            tr.main td { padding-top: .45rem; }
            .notes { margin: .4rem 0 0; padding: 0; list-style: none; color: var(--muted); font-size: .9rem; }
            .chart svg { width: 100%; height: auto; border: 1px solid var(--rule); }
            footer { margin-top: 2.5rem; padding-top: .8rem; border-top: 1px solid var(--rule); color: var(--muted);
              font-size: .9rem; }
            @media print { body { font-size: 11pt; } main { max-width: none; padding: 0; }
              figure, .tablewrap { break-inside: avoid; } tbody tr td { background: none !important; } }
            """;

    private Html() {
    }

    /** The complete HTML document of {@code report}. */
    public static String write(Report report) {
        StringBuilder out = new StringBuilder(64_000);
        out.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
                .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
                .append("<meta name=\"generator\" content=\"Orthogon\">\n")
                .append("<title>").append(escape(report.title())).append("</title>\n")
                .append("<style>\n").append(STYLE).append("</style>\n</head>\n<body>\n<main>\n");
        out.append("<header>\n<h1>").append(escape(report.title())).append("</h1>\n");
        for (String line : report.subtitle()) {
            out.append("<p>").append(escape(line)).append("</p>\n");
        }
        out.append("</header>\n");
        warnings(out, report.warnings());
        for (Report.Section section : report.sections()) {
            out.append("<section>\n<h2>").append(escape(section.heading())).append("</h2>\n");
            for (Report.Block block : section.blocks()) {
                if (block instanceof Report.Paragraph paragraph) {
                    out.append("<p>").append(escape(paragraph.text())).append("</p>\n");
                } else if (block instanceof Report.TableBlock table) {
                    table(out, table.table());
                } else {
                    Chart chart = ((Report.ChartBlock) block).chart();
                    int width = ChartRenderer.width(chart);
                    out.append("<figure class=\"chart\" id=\"chart-").append(chart.id()).append("\">\n<figcaption>")
                            .append(escape(chart.title())).append("</figcaption>\n")
                            .append(ChartRenderer.svgElement(chart, width, ChartRenderer.height(chart))
                                    .replaceFirst("<svg ", "<svg style=\"max-width: " + width + "px\" "))
                            .append("\n</figure>\n");
                }
            }
            out.append("</section>\n");
        }
        out.append("<footer>\n<p>").append(escape(report.caution())).append("</p>\n</footer>\n");
        return out.append("</main>\n</body>\n</html>\n").toString();
    }

    private static void warnings(StringBuilder out, List<String> warnings) {
        if (warnings.isEmpty()) {
            return;
        }
        out.append("<div class=\"warnings\" role=\"note\">\n<h2>Read before the numbers</h2>\n<ul>\n");
        for (String warning : warnings) {
            out.append("<li>").append(escape(warning)).append("</li>\n");
        }
        out.append("</ul>\n</div>\n");
    }

    private static void table(StringBuilder out, Table table) {
        List<Integer> shown = table.shownColumns();
        boolean stacked = !table.errorUnder().isEmpty();
        out.append("<figure class=\"tablewrap\" id=\"table-").append(table.id()).append("\">\n<figcaption>")
                .append(escape(table.caption())).append("</figcaption>\n<table>\n<thead><tr>");
        for (int c : shown) {
            out.append(table.isNumericColumn(c) ? "<th class=\"num\">" : "<th>").append(escape(table.header().get(c)))
                    .append("</th>");
        }
        out.append("</tr></thead>\n<tbody>\n");
        for (List<Cell> row : table.rows()) {
            out.append(stacked ? "<tr class=\"main\">" : "<tr class=\"flat\">");
            for (int c : shown) {
                cell(out, row.get(c).text(), row.get(c).numeric());
            }
            out.append("</tr>\n");
            if (stacked) {
                out.append("<tr class=\"se\">");
                for (int c : shown) {
                    int error = table.errorColumnUnder(c);
                    cell(out, error >= 0 ? "(" + row.get(error).text() + ")" : "", error >= 0 || row.get(c).numeric());
                }
                out.append("</tr>\n");
            }
        }
        out.append("</tbody>\n</table>\n");
        if (!table.notes().isEmpty()) {
            out.append("<ul class=\"notes\">\n");
            for (String note : table.notes()) {
                out.append("<li>").append(escape(note)).append("</li>\n");
            }
            out.append("</ul>\n");
        }
        out.append("</figure>\n");
    }

    private static void cell(StringBuilder out, String text, boolean numeric) {
        out.append(numeric ? "<td class=\"num\">" : "<td>").append(escape(text)).append("</td>");
    }

    /** Text safe in HTML content and in double-quoted attributes. */
    public static String escape(String text) {
        StringBuilder out = new StringBuilder(text.length() + 16);
        for (char ch : text.toCharArray()) {
            switch (ch) {
                case '&' -> out.append("&amp;");
                case '<' -> out.append("&lt;");
                case '>' -> out.append("&gt;");
                case '"' -> out.append("&quot;");
                case '\'' -> out.append("&#39;");
                default -> out.append(ch);
            }
        }
        return out.toString();
    }
}
