package org.orthogon.report;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.orthogon.analysis.ModelComparison;
import org.orthogon.analysis.ModelComparison.ModelSummary;
import org.orthogon.analysis.ModelComparison.NestedTest;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.ParameterEstimate;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/** The side-by-side comparison of several models, as console text and as JSON. */
public final class ComparisonReport {
    private ComparisonReport() {
    }

    /** Parameters (standard errors in parentheses below), tests and cross-sectional fit, one column per model. */
    public static String render(ModelComparison.Result result, String sampleLine) {
        return render(result, sampleLine, "");
    }

    /** As {@link #render(ModelComparison.Result, String)}, with {@code more} text before the warnings and caution. */
    public static String render(ModelComparison.Result result, String sampleLine, String more) {
        List<ModelSummary> models = result.models();
        List<String> header = new ArrayList<>(List.of(""));
        for (int m = 0; m < models.size(); m++) {
            header.add("(" + (m + 1) + ")");
        }
        TextTable table = new TextTable(header);
        Set<String> names = new LinkedHashSet<>();
        models.forEach(summary -> summary.fit().parameters().forEach(p -> names.add(p.name())));
        for (String name : names) {
            List<String> estimates = new ArrayList<>(List.of(name));
            List<String> errors = new ArrayList<>(List.of(""));
            for (ModelSummary summary : models) {
                ParameterEstimate p = summary.fit().parameters().stream().filter(e -> e.name().equals(name))
                        .findFirst().orElse(null);
                estimates.add(p == null ? "" : ConsoleReport.number(p.estimate()));
                errors.add(p == null ? "" : "(" + ConsoleReport.number(p.stdError()) + ")");
            }
            table.row(estimates);
            table.row(errors);
        }
        table.row(column(models, "overidentification", s -> ConsoleReport.fixed(s.fit().overidentification().statistic(), 3)));
        table.row(column(models, "  degrees of freedom", s -> Integer.toString(s.fit().overidentification().df())));
        table.row(column(models, "  p-value", s -> ConsoleReport.fixed(s.fit().overidentification().pValue(), 4)));
        table.row(column(models, "HJ distance", s -> s.fit().hj().map(h -> ConsoleReport.number(h.value())).orElse("n/a")));
        table.row(column(models, "  p-value", s -> s.fit().hj().map(h -> ConsoleReport.fixed(h.pValue(), 4)).orElse("n/a")));
        table.row(column(models, "cross-sectional R2", s -> ConsoleReport.fixed(s.crossSection().r2(), 4)));
        table.row(column(models, "mean |alpha|", s -> ConsoleReport.number(s.crossSection().meanAbsolute())));
        table.row(column(models, "RMS alpha", s -> ConsoleReport.number(s.crossSection().rootMeanSquare())));
        StringBuilder out = new StringBuilder("Model comparison on the same test assets, " + sampleLine + "\n");
        for (int m = 0; m < models.size(); m++) {
            ModelSummary summary = models.get(m);
            out.append(String.format("  (%d) %s: %s GMM, overidentification by %s%n", m + 1, summary.title(),
                    summary.fit().method().id(), summary.fit().overidentification().kind()));
        }
        out.append('\n').append(table.render("  "));
        out.append("  alpha: pricing error in expected-return units, (E_T[m x] - price) / E_T[m]\n");
        if (!result.nestedTests().isEmpty()) {
            out.append("\nNested models: difference of J statistics with the unrestricted model's S (Newey-West 1987)\n");
            TextTable nested = new TextTable(List.of("restricted", "unrestricted", "statistic", "df", "p-value"));
            for (NestedTest test : result.nestedTests()) {
                nested.row(List.of(test.restricted(), test.unrestricted(), ConsoleReport.fixed(test.test().statistic(), 3),
                        Integer.toString(test.test().df()), ConsoleReport.fixed(test.test().pValue(), 4)));
            }
            out.append(nested.render("  "));
        }
        out.append(more);
        for (int m = 0; m < models.size(); m++) {
            for (String warning : models.get(m).fit().warnings()) {
                out.append("WARNING (").append(m + 1).append("): ").append(warning).append('\n');
            }
        }
        out.append('\n').append(Caution.TEXT).append('\n');
        return out.toString();
    }

    private static List<String> column(List<ModelSummary> models, String label,
            java.util.function.Function<ModelSummary, String> cell) {
        List<String> row = new ArrayList<>(List.of(label));
        models.forEach(summary -> row.add(cell.apply(summary)));
        return row;
    }

    /** {"models": [results objects with the cross-sectional fit], "nested_tests": [...]} (docs/output.md). */
    public static ObjectNode json(ModelComparison.Result result, List<ObjectNode> fitObjects) {
        ObjectNode root = JsonResults.newObject();
        ArrayNode models = root.putArray("models");
        for (int m = 0; m < fitObjects.size(); m++) {
            ObjectNode node = fitObjects.get(m);
            var cross = result.models().get(m).crossSection();
            JsonResults.number(node, "cross_sectional_r2", cross.r2());
            JsonResults.number(node, "mean_abs_pricing_error", cross.meanAbsolute());
            JsonResults.number(node, "rms_pricing_error", cross.rootMeanSquare());
            models.add(node);
        }
        ArrayNode nested = root.putArray("nested_tests");
        for (NestedTest test : result.nestedTests()) {
            ObjectNode node = nested.addObject();
            node.put("restricted", test.restricted());
            node.put("unrestricted", test.unrestricted());
            ChiSquareTest chi = test.test();
            JsonResults.number(node, "statistic", chi.statistic());
            node.put("df", chi.df());
            JsonResults.number(node, "p_value", chi.pValue());
        }
        root.put("caution", Caution.TEXT);
        return root;
    }
}
