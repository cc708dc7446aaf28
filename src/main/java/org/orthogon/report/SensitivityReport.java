package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import org.orthogon.analysis.SensitivityGrid;
import org.orthogon.analysis.SensitivityGrid.SensitivityRow;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/** The kernel-and-bandwidth sensitivity grid as console text and as the JSON field "sensitivity". */
public final class SensitivityReport {
    private SensitivityReport() {
    }

    /** A table with one row per choice; rows whose 5% verdict differs from the main fit carry "<< differs". */
    public static String render(List<SensitivityRow> rows, List<String> parameterNames) {
        List<String> header = new ArrayList<>(List.of("kernel", "bandwidth", "prewhiten", "b used", "statistic",
                "p-value"));
        parameterNames.forEach(name -> header.add("se(" + name + ")"));
        header.add("verdict");
        TextTable table = new TextTable(header);
        int differing = 0;
        for (SensitivityRow row : rows) {
            List<String> cells = new ArrayList<>();
            cells.add(row.choice().kernel().id());
            cells.add(SensitivityGrid.bandwidthLabel(row.choice()));
            cells.add(row.choice().prewhiten() ? "yes" : "no");
            if (row.failure() != null) {
                cells.add("-");
                cells.add("failed");
                cells.add("-");
                parameterNames.forEach(name -> cells.add("-"));
                cells.add(shorten(row.failure()));
            } else {
                cells.add(ConsoleReport.fixed(row.bandwidth(), 2));
                cells.add(ConsoleReport.fixed(row.statistic(), 3));
                cells.add(ConsoleReport.fixed(row.pValue(), 4));
                row.standardErrors().forEach(se -> cells.add(ConsoleReport.number(se)));
                cells.add(row.verdictDiffers() ? "<< differs" : "");
                if (row.verdictDiffers()) {
                    differing++;
                }
            }
            table.row(cells);
        }
        return "Sensitivity of the overidentification test and standard errors to the long-run covariance\n"
                + table.render("  ")
                + String.format("  %d of %d rows reach a different verdict at the %.0f%% level than the main "
                        + "specification%n", differing, rows.size(), 100 * SensitivityGrid.LEVEL);
    }

    /**
     * The grid as a report table: one row per choice with the bandwidth used, the overidentification
     * test, each parameter's standard error and the verdict flag; a failed fit shows n/a and why.
     */
    public static Table table(List<SensitivityRow> rows, List<String> parameterNames) {
        List<String> header = new ArrayList<>(List.of("kernel", "bandwidth", "prewhiten", "b used", "statistic",
                "p-value"));
        parameterNames.forEach(name -> header.add("se " + name));
        header.add("verdict");
        Table.Builder table = Table.builder("sensitivity", "Overidentification test and standard errors under every "
                + "long-run covariance choice", header);
        int differing = 0;
        for (SensitivityRow row : rows) {
            List<Cell> cells = new ArrayList<>(List.of(Cell.text(row.choice().kernel().id()),
                    Cell.text(SensitivityGrid.bandwidthLabel(row.choice())), Cell.text(row.choice().prewhiten() ? "yes"
                            : "no")));
            boolean failed = row.failure() != null;
            cells.add(Cell.fixed(failed ? Double.NaN : row.bandwidth(), 2));
            cells.add(Cell.fixed(failed ? Double.NaN : row.statistic(), 3));
            cells.add(Cell.fixed(failed ? Double.NaN : row.pValue(), 4));
            for (int i = 0; i < parameterNames.size(); i++) {
                cells.add(Cell.number(failed ? Double.NaN : row.standardErrors().get(i)));
            }
            cells.add(Cell.text(failed ? "failed: " + shorten(row.failure()) : row.verdictDiffers() ? "differs" : ""));
            differing += row.verdictDiffers() ? 1 : 0;
            table.row(cells);
        }
        return table.note(String.format(java.util.Locale.ROOT, "%d of %d rows reach a different verdict at the %.0f%% "
                + "level than the main specification (\"differs\").", differing, rows.size(),
                100 * SensitivityGrid.LEVEL)).build();
    }

    /** Adds the field "sensitivity" (an array of rows) to a results object. */
    public static void addTo(ObjectNode results, List<SensitivityRow> rows, List<String> parameterNames) {
        ArrayNode array = results.putArray("sensitivity");
        for (SensitivityRow row : rows) {
            ObjectNode node = array.addObject();
            node.put("kernel", row.choice().kernel().id());
            node.put("bandwidth_choice", SensitivityGrid.bandwidthLabel(row.choice()));
            JsonResults.number(node, "bandwidth", row.bandwidth());
            node.put("prewhitened", row.choice().prewhiten());
            node.put("centered", row.choice().centered());
            if (row.failure() != null) {
                node.put("failure", row.failure());
                continue;
            }
            JsonResults.number(node, "statistic", row.statistic());
            node.put("df", row.df());
            JsonResults.number(node, "p_value", row.pValue());
            ObjectNode errors = node.putObject("std_errors");
            for (int i = 0; i < parameterNames.size(); i++) {
                JsonResults.number(errors, parameterNames.get(i), row.standardErrors().get(i));
            }
            node.put("verdict_differs", row.verdictDiffers());
            ArrayNode warnings = node.putArray("warnings");
            row.warnings().forEach(warnings::add);
        }
    }

    private static String shorten(String message) {
        String firstLine = message.lines().findFirst().orElse("");
        return firstLine.length() > 60 ? firstLine.substring(0, 57) + "..." : firstLine;
    }
}
