package org.orthogon.report;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.orthogon.bootstrap.FitBootstrap;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The recentred block bootstrap of a fit as console text, the JSON field "bootstrap", the report table
 * {@code bootstrap} and the chart {@code bootstrap-j} (docs/output.md).
 */
public final class BootstrapReport {
    private BootstrapReport() {
    }

    /** Adds {@code "bootstrap": {...}} to the results object of a fit. */
    public static void addTo(ObjectNode results, FitBootstrap.Result result) {
        ObjectNode node = results.putObject("bootstrap");
        node.put("method", "recentred-block");
        node.put("replications", result.replications());
        node.put("successful_replications", result.successfulReplications());
        node.put("failed_replications", result.failedReplications());
        ArrayNode reasons = node.putArray("failure_reasons");
        result.failureReasons().entrySet().stream().sorted(Map.Entry.comparingByKey()).forEach(entry -> {
            ObjectNode reason = reasons.addObject();
            reason.put("reason", entry.getKey());
            reason.put("count", entry.getValue());
        });
        node.put("block_length", result.blockLength());
        node.put("block_length_rule", result.automaticBlockLength() ? "politis-white" : "given");
        node.put("block_scheme", result.scheme().id());
        node.put("seed", result.seed());
        test(node, "overidentification", result.overidentification());
        test(node, "pricing_errors_joint", result.pricingErrorsJoint());
        ArrayNode parameters = node.putArray("parameters");
        double[] scale = result.tScale();
        for (int i = 0; i < result.parameters().size(); i++) {
            FitBootstrap.Interval interval = result.parameters().get(i);
            ObjectNode p = parameters.addObject();
            p.put("name", interval.name());
            JsonResults.number(p, "estimate", interval.estimate());
            JsonResults.number(p, "conf_low", interval.low());
            JsonResults.number(p, "conf_high", interval.high());
            JsonResults.number(p, "level", interval.level());
            JsonResults.number(p, "t_scale", scale[i]);
        }
    }

    private static void test(ObjectNode parent, String field, FitBootstrap.Test test) {
        if (test == null) {
            parent.putNull(field);
            return;
        }
        ObjectNode node = parent.putObject(field);
        node.put("kind", test.kind());
        JsonResults.number(node, "statistic", test.statistic());
        node.put("df", test.df());
        JsonResults.number(node, "p_value", test.pValue());
        JsonResults.number(node, "asymptotic_p_value", test.asymptoticPValue());
        ObjectNode critical = node.putObject("critical_values");
        JsonResults.number(critical, "0.10", test.critical10());
        JsonResults.number(critical, "0.05", test.critical05());
        JsonResults.number(critical, "0.01", test.critical01());
    }

    /** The console section. */
    public static String render(FitBootstrap.Result result) {
        StringBuilder out = new StringBuilder();
        out.append(String.format(Locale.ROOT, "%nRecentred block bootstrap (Hall-Horowitz): %d replications, %s "
                + "blocks of %d (%s), seed %d%n", result.replications(), result.scheme().id(), result.blockLength(),
                result.automaticBlockLength() ? "Politis-White rule" : "given", result.seed()));
        TextTable tests = new TextTable(List.of("test", "statistic", "df", "asymptotic p", "bootstrap p",
                "bootstrap 5% critical"));
        for (FitBootstrap.Test test : testsOf(result)) {
            tests.row(List.of(testName(test.kind()), ConsoleReport.fixed(test.statistic(), 3),
                    Integer.toString(test.df()), ConsoleReport.fixed(test.asymptoticPValue(), 4),
                    ConsoleReport.fixed(test.pValue(), 4), ConsoleReport.fixed(test.critical05(), 3)));
        }
        if (!testsOf(result).isEmpty()) {
            out.append(tests.render("  "));
        }
        TextTable intervals = new TextTable(List.of("parameter", "estimate", "std. error", level(result) + " low",
                level(result) + " high"));
        for (FitBootstrap.Interval interval : result.parameters()) {
            intervals.row(List.of(interval.name(), ConsoleReport.number(interval.estimate()),
                    ConsoleReport.number(interval.stdError()), ConsoleReport.number(interval.low()),
                    ConsoleReport.number(interval.high())));
        }
        out.append("  Percentile-t intervals:\n").append(intervals.render("  "));
        out.append(failureLine(result)).append('\n');
        return out.toString();
    }

    /** The table {@code bootstrap}: the tests, then the intervals. */
    public static Table table(FitBootstrap.Result result) {
        Table.Builder table = Table.builder("bootstrap", "Recentred block bootstrap", "item", "statistic or low",
                "asymptotic p or high", "bootstrap p");
        for (FitBootstrap.Test test : testsOf(result)) {
            table.row(Cell.text(testName(test.kind())), Cell.fixed(test.statistic(), 3),
                    Cell.fixed(test.asymptoticPValue(), 4), Cell.fixed(test.pValue(), 4));
        }
        for (FitBootstrap.Interval interval : result.parameters()) {
            table.row(Cell.text(interval.name() + " " + level(result) + " percentile-t"), Cell.number(interval.low()),
                    Cell.number(interval.high()), Cell.text(""));
        }
        return table.note(String.format(Locale.ROOT, "%d replications of %s blocks of %d rows (%s), seed %d; moments "
                + "recentred at their bootstrap mean at the estimate (Hall and Horowitz 1996), each resample refitted "
                + "with the model file's estimator.", result.replications(), result.scheme().id(),
                result.blockLength(), result.automaticBlockLength() ? "Politis-White rule" : "given", result.seed()))
                .note("Bootstrap p-value (1 + #{replications at least as large}) / (successful replications + 1).")
                .note(failureLine(result).trim()).build();
    }

    /** The chart {@code bootstrap-j}: the replications' J (or joint test) with the sample value marked; null when K = P. */
    public static Chart chart(FitBootstrap.Result result) {
        FitBootstrap.Test test = result.overidentification();
        if (test == null) {
            return null;
        }
        return new Chart.Histogram("bootstrap-j", "Bootstrap distribution of " + testName(test.kind()),
                testName(test.kind()) + " in the replications", "replications",
                Arrays.stream(test.draws()).boxed().toList(), test.statistic(),
                "sample " + ConsoleReport.fixed(test.statistic(), 2));
    }

    /** Adds the section "Bootstrap" (table and chart) to a fit's document. */
    public static void addSection(Report.Builder report, FitBootstrap.Result result) {
        report.section("Recentred block bootstrap").table(table(result));
        Chart chart = chart(result);
        if (chart != null) {
            report.chart(chart);
        }
    }

    private static List<FitBootstrap.Test> testsOf(FitBootstrap.Result result) {
        List<FitBootstrap.Test> tests = new ArrayList<>();
        if (result.overidentification() != null) {
            tests.add(result.overidentification());
            if (!result.pricingErrorsJoint().kind().equals(result.overidentification().kind())) {
                tests.add(result.pricingErrorsJoint());
            }
        }
        return tests;
    }

    private static String failureLine(FitBootstrap.Result result) {
        StringBuilder line = new StringBuilder(String.format(Locale.ROOT, "  Failed replications: %d of %d",
                result.failedReplications(), result.replications()));
        result.failureReasons().entrySet().stream().sorted(Map.Entry.comparingByKey())
                .forEach(e -> line.append(String.format(Locale.ROOT, "; %d x %s", e.getValue(), e.getKey())));
        return line.toString();
    }

    private static String level(FitBootstrap.Result result) {
        double level = result.parameters().isEmpty() ? 0.95 : result.parameters().get(0).level();
        return String.format(Locale.ROOT, "%.0f%%", 100 * level);
    }

    private static String testName(String kind) {
        return switch (kind) {
            case "hansen-j" -> "Hansen J";
            case "pricing-errors-joint" -> "joint pricing-error test";
            default -> kind;
        };
    }
}
