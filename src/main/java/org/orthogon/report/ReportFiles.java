package org.orthogon.report;

/**
 * Writes every form of a {@link Report} into an {@link OutputFolder}: per table
 * {@code tables/<id>.csv}, {@code .md} and {@code .tex}; per chart {@code charts/<id>.png} and
 * {@code .svg}; and {@value OutputFolder#HTML} with everything in one file.
 */
public final class ReportFiles {
    private ReportFiles() {
    }

    /** Writes the tables, charts and HTML report of {@code report} into {@code folder}. */
    public static void write(Report report, OutputFolder folder) {
        for (Table table : report.tables()) {
            folder.write("tables/" + table.id() + ".csv", CsvTables.write(table));
            folder.write("tables/" + table.id() + ".md", MarkdownTables.write(table));
            folder.write("tables/" + table.id() + ".tex", LatexTables.write(table));
        }
        for (Chart chart : report.charts()) {
            folder.write("charts/" + chart.id() + ".png", ChartRenderer.png(chart, ChartRenderer.WIDTH,
                    ChartRenderer.HEIGHT));
            folder.write("charts/" + chart.id() + ".svg", ChartRenderer.svgDocument(chart, ChartRenderer.WIDTH,
                    ChartRenderer.HEIGHT));
        }
        folder.write(OutputFolder.HTML, Html.write(report));
    }
}
