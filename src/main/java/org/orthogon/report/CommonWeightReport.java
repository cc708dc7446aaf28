package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.analysis.CommonWeightComparison;
import org.orthogon.analysis.CrossSectionFit;
import org.orthogon.analysis.VolatilityBound;
import org.orthogon.twopass.EqualR2Test;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The like-for-like part of `compare`: every model at the common second-moment weight, the tests of equal
 * Hansen-Jagannathan distances (Kan and Robotti 2009) and of equal two-pass R² (Kan, Robotti and Shanken
 * 2013), and the Hansen-Jagannathan (1991) volatility bound with the models' SDFs on it.
 *
 * @param common  the models at the common weight and the distance tests
 * @param r2Tests the tests of equal cross-sectional R² of the linear-factor models
 * @param bound   the volatility bound, or null when no model has an SDF
 * @param notes   what was left out and why
 */
public record CommonWeightReport(CommonWeightComparison.Result common, List<EqualR2Test.Result> r2Tests,
        VolatilityBound bound, List<String> notes) {

    public CommonWeightReport {
        r2Tests = List.copyOf(r2Tests);
        notes = List.copyOf(notes);
    }

    /** Console text, appended after the comparison at each model's own weight. */
    public String render() {
        StringBuilder out = new StringBuilder("\nAt the common weight W = G^-1 (second moments of the payoffs; the HJ "
                + "distance estimate of every model)\n");
        TextTable table = new TextTable(List.of("model", "HJ distance", "cross-sectional R2", "mean |alpha|",
                "RMS alpha", "parameters"));
        for (CommonWeightComparison.ModelAtCommonWeight model : common.models()) {
            CrossSectionFit cross = model.crossSection();
            table.row(List.of(model.title(), ConsoleReport.number(model.distance()), ConsoleReport.fixed(cross.r2(), 4),
                    ConsoleReport.number(cross.meanAbsolute()), ConsoleReport.number(cross.rootMeanSquare()),
                    parameters(model)));
        }
        out.append(table.render("  "));
        if (!common.tests().isEmpty()) {
            out.append("\nEqual HJ distances (Kan and Robotti 2009)\n");
            TextTable tests = new TextTable(List.of("model 1", "model 2", "kind", "statistic", "p-value",
                    "same SDF: Wald", "df", "p-value"));
            for (CommonWeightComparison.DistanceTest test : common.tests()) {
                tests.row(List.of(test.first(), test.second(), test.nested() ? "nested" : "non-nested",
                        ConsoleReport.fixed(test.statistic(), 3), ConsoleReport.fixed(test.pValue(), 4),
                        test.sameSdf() == null ? "-" : ConsoleReport.fixed(test.sameSdf().statistic(), 3),
                        test.sameSdf() == null ? "-" : Integer.toString(test.sameSdf().df()),
                        test.sameSdf() == null ? "-" : ConsoleReport.fixed(test.sameSdf().pValue(), 4)));
            }
            out.append(tests.render("  "));
            out.append("  nested: T(d1^2 - d2^2), weighted chi-square limit (simulated); non-nested: normal, meaningful "
                    + "only when the same-SDF test rejects\n");
        }
        if (!r2Tests.isEmpty()) {
            out.append("\nEqual two-pass cross-sectional R2, OLS with intercept (Kan, Robotti and Shanken 2013)\n");
            TextTable tests = new TextTable(List.of("model 1", "model 2", "R2 1", "R2 2", "kind", "statistic",
                    "p-value", "same fit: Wald", "df", "p-value"));
            for (EqualR2Test.Result test : r2Tests) {
                tests.row(List.of(test.first(), test.second(), ConsoleReport.fixed(test.r2First(), 4),
                        ConsoleReport.fixed(test.r2Second(), 4), test.nested() ? "nested" : "non-nested",
                        ConsoleReport.fixed(test.statistic(), 3), ConsoleReport.fixed(test.pValue(), 4),
                        test.sameCrossSection() == null ? "-" : ConsoleReport.fixed(test.sameCrossSection().statistic(), 3),
                        test.sameCrossSection() == null ? "-" : Integer.toString(test.sameCrossSection().df()),
                        test.sameCrossSection() == null ? "-" : ConsoleReport.fixed(test.sameCrossSection().pValue(), 4)));
            }
            out.append(tests.render("  "));
        }
        notes.forEach(note -> out.append("note: ").append(note).append('\n'));
        return out.toString();
    }

    private static String parameters(CommonWeightComparison.ModelAtCommonWeight model) {
        List<String> parts = new ArrayList<>();
        for (int j = 0; j < model.parameterNames().size(); j++) {
            parts.add(model.parameterNames().get(j) + " " + ConsoleReport.number(model.estimates()[j]));
        }
        return String.join(", ", parts);
    }

    /** Adds "common_weight" to each model object (by title) and the "hj_distance_tests" and "r2_tests" arrays. */
    public void addTo(ObjectNode root) {
        for (var node : root.get("models")) {
            ObjectNode model = (ObjectNode) node;
            String title = model.get("title").asString();
            common.models().stream().filter(m -> m.title().equals(title)).findFirst().ifPresent(m -> {
                ObjectNode at = model.putObject("common_weight");
                ArrayNode parameters = at.putArray("parameters");
                for (int j = 0; j < m.parameterNames().size(); j++) {
                    ObjectNode p = parameters.addObject();
                    p.put("name", m.parameterNames().get(j));
                    JsonResults.number(p, "estimate", m.estimates()[j]);
                }
                JsonResults.number(at, "hj_distance", m.distance());
                JsonResults.number(at, "cross_sectional_r2", m.crossSection().r2());
                JsonResults.number(at, "mean_abs_pricing_error", m.crossSection().meanAbsolute());
                JsonResults.number(at, "rms_pricing_error", m.crossSection().rootMeanSquare());
            });
        }
        ArrayNode distance = root.putArray("hj_distance_tests");
        for (CommonWeightComparison.DistanceTest test : common.tests()) {
            ObjectNode node = distance.addObject();
            node.put("model_1", test.first());
            node.put("model_2", test.second());
            node.put("kind", test.nested() ? "nested" : "non-nested");
            JsonResults.number(node, "statistic", test.statistic());
            JsonResults.number(node, "p_value", test.pValue());
            if (test.sameSdf() != null) {
                ObjectNode same = node.putObject("same_sdf");
                JsonResults.number(same, "statistic", test.sameSdf().statistic());
                same.put("df", test.sameSdf().df());
                JsonResults.number(same, "p_value", test.sameSdf().pValue());
            }
        }
        ArrayNode r2 = root.putArray("r2_tests");
        for (EqualR2Test.Result test : r2Tests) {
            ObjectNode node = r2.addObject();
            node.put("model_1", test.first());
            node.put("model_2", test.second());
            node.put("kind", test.nested() ? "nested" : "non-nested");
            JsonResults.number(node, "r2_1", test.r2First());
            JsonResults.number(node, "r2_2", test.r2Second());
            JsonResults.number(node, "statistic", test.statistic());
            JsonResults.number(node, "p_value", test.pValue());
            if (test.sameCrossSection() != null) {
                ObjectNode same = node.putObject("same_cross_section");
                JsonResults.number(same, "statistic", test.sameCrossSection().statistic());
                same.put("df", test.sameCrossSection().df());
                JsonResults.number(same, "p_value", test.sameCrossSection().pValue());
            }
        }
    }

    /** Adds the section "At the common weight" with its tables and the volatility-bound chart. */
    void addTo(Report.Builder report) {
        report.section("At the common weight");
        Table.Builder models = Table.builder("common-weight", "Models at the common second-moment weight",
                "model", "HJ distance", "cross-sectional R2", "mean |alpha|", "RMS alpha");
        for (CommonWeightComparison.ModelAtCommonWeight model : common.models()) {
            models.row(Cell.text(model.title()), Cell.number(model.distance()), Cell.fixed(model.crossSection().r2(), 4),
                    Cell.number(model.crossSection().meanAbsolute()), Cell.number(model.crossSection().rootMeanSquare()));
        }
        report.table(models.note("Every model estimated with W = G^{-1}, G the second moments of the payoffs: the "
                + "same yardstick for all (Hansen and Jagannathan 1997).").build());
        if (!common.tests().isEmpty()) {
            Table.Builder tests = Table.builder("hj-distance-tests", "Tests of equal HJ distances", "model 1",
                    "model 2", "kind", "statistic", "p-value", "same SDF (Wald)", "same SDF p-value");
            for (CommonWeightComparison.DistanceTest test : common.tests()) {
                tests.row(Cell.text(test.first()), Cell.text(test.second()), Cell.text(test.nested() ? "nested"
                        : "non-nested"), Cell.fixed(test.statistic(), 3), Cell.fixed(test.pValue(), 4),
                        test.sameSdf() == null ? Cell.text("") : Cell.fixed(test.sameSdf().statistic(), 3),
                        test.sameSdf() == null ? Cell.text("") : Cell.fixed(test.sameSdf().pValue(), 4));
            }
            report.table(tests.note("Kan and Robotti (2009). Nested: T(d1^2 - d2^2) against its weighted chi-square "
                    + "limit (simulated). Non-nested: normal test, meaningful only when the test that the two SDFs "
                    + "coincide rejects.").build());
        }
        if (!r2Tests.isEmpty()) {
            Table.Builder tests = Table.builder("r2-tests", "Tests of equal two-pass cross-sectional R2", "model 1",
                    "model 2", "R2 1", "R2 2", "kind", "statistic", "p-value");
            for (EqualR2Test.Result test : r2Tests) {
                tests.row(Cell.text(test.first()), Cell.text(test.second()), Cell.fixed(test.r2First(), 4),
                        Cell.fixed(test.r2Second(), 4), Cell.text(test.nested() ? "nested" : "non-nested"),
                        Cell.fixed(test.statistic(), 3), Cell.fixed(test.pValue(), 4));
            }
            report.table(tests.note("Kan, Robotti and Shanken (2013), OLS cross sections with an intercept on "
                    + "full-sample betas.").build());
        }
        if (bound != null) {
            report.chart(chart(bound));
        }
        notes.forEach(report::paragraph);
    }

    static Chart chart(VolatilityBound bound) {
        List<Chart.Point> curve = new ArrayList<>();
        double[] means = bound.means();
        double[] sigma = bound.bound();
        for (int i = 0; i < means.length; i++) {
            curve.add(new Chart.Point("", means[i], sigma[i]));
        }
        List<Chart.Point> points = bound.sdfs().stream()
                .map(p -> new Chart.Point(p.title(), p.mean(), p.volatility())).toList();
        return new Chart.Frontier("volatility-bound", String.format(Locale.ROOT,
                "Hansen-Jagannathan volatility bound and the models' SDFs"), "mean of the SDF",
                "standard deviation of the SDF", curve, points);
    }
}
