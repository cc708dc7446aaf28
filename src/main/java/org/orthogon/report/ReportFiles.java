package org.orthogon.report;

import java.nio.file.Path;
import java.util.List;
import org.orthogon.spec.InputSummary;
import org.orthogon.spec.RunSpec;
import tools.jackson.databind.node.ObjectNode;

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
            folder.write("tables/" + table.id() + ".tex", LatexTables.write(table, report.key()));
        }
        for (Chart chart : report.charts()) {
            int width = ChartRenderer.width(chart);
            int height = ChartRenderer.height(chart);
            folder.write("charts/" + chart.id() + ".png", ChartRenderer.png(chart, width, height,
                    ChartRenderer.PRINT_SCALE));
            folder.write("charts/" + chart.id() + ".svg", ChartRenderer.svgDocument(chart, width, height));
        }
        folder.write(OutputFolder.HTML, Html.write(report));
    }

    /**
     * Writes a complete output folder and moves it into place: {@code results.json}, the report's
     * tables, charts and HTML, and {@value OutputFolder#MANIFEST} last (with the hashes of all the
     * others). Any command (fit, compare, stability) calls this once with its own report and results.
     *
     * @param target    the final folder
     * @param overwrite true to replace a folder that holds an earlier report
     * @param report    the document
     * @param results   the results object, written as {@code results.json} exactly as {@code --json} writes it
     * @param run       the run's facts for the manifest
     * @param specs     every model file's specification as used
     * @param inputs    for each spec, the data files it read
     * @return the folder written
     */
    public static Path publish(Path target, boolean overwrite, Report report, ObjectNode results, Manifest.Run run,
            List<RunSpec> specs, List<List<InputSummary>> inputs) {
        try (OutputFolder folder = OutputFolder.create(target, overwrite)) {
            folder.write("results.json", JsonResults.text(results));
            write(report, folder);
            folder.write(OutputFolder.MANIFEST, JsonResults.text(Manifest.of(run, specs, inputs, folder.written())));
            return folder.publish();
        }
    }
}
