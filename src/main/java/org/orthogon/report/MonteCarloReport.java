package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.orthogon.bootstrap.MonteCarlo;
import org.orthogon.gmm.GmmFit;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.SampleInfo;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The result of {@code montecarlo} as console text, the results JSON, and the report document (the table
 * {@code rejection-rates} and the chart of actual against nominal rejection rates; docs/output.md).
 */
public final class MonteCarloReport {
    private MonteCarloReport() {
    }

    /** The results object of a Monte Carlo study. */
    public static ObjectNode json(RunSpec spec, SampleInfo sample, GmmFit fit, MonteCarlo.Result result) {
        ObjectNode root = JsonResults.newObject();
        root.put("title", spec.title());
        root.put("family", spec.model().family().id());
        root.put("method", fit.method().id());
        root.put("analysis", "montecarlo");
        ObjectNode sampleNode = root.putObject("sample");
        sampleNode.put("start", sample.start());
        sampleNode.put("end", sample.end());
        sampleNode.put("observations", sample.observations());
        sampleNode.put("frequency", sample.frequency());
        ObjectNode simulation = root.putObject("simulation");
        simulation.put("design", "recentred-block-bootstrap");
        simulation.put("replications", result.replications());
        simulation.put("successful_replications", result.successfulReplications());
        simulation.put("failed_replications", result.failedReplications());
        ArrayNode reasons = simulation.putArray("failure_reasons");
        result.failureReasons().entrySet().stream().sorted(Map.Entry.comparingByKey()).forEach(entry -> {
            ObjectNode reason = reasons.addObject();
            reason.put("reason", entry.getKey());
            reason.put("count", entry.getValue());
        });
        simulation.put("block_length", result.blockLength());
        simulation.put("block_length_rule", result.automaticBlockLength() ? "politis-white" : "given");
        simulation.put("block_scheme", result.scheme().id());
        simulation.put("seed", result.seed());
        simulation.put("observations", result.observations());
        simulation.put("moments", result.moments());
        ArrayNode truth = simulation.putArray("truth");
        for (int i = 0; i < result.parameterNames().size(); i++) {
            ObjectNode node = truth.addObject();
            node.put("name", result.parameterNames().get(i));
            JsonResults.number(node, "value", result.truth()[i]);
        }
        if (result.alternative().isNull()) {
            simulation.putNull("alternative");
        } else {
            ObjectNode alternative = simulation.putObject("alternative");
            ArrayNode errors = alternative.putArray("pricing_errors");
            result.alternative().pricingErrors().forEach((name, value) -> {
                ObjectNode node = errors.addObject();
                node.put("moment", name);
                JsonResults.number(node, "value", value);
            });
            ArrayNode shifts = alternative.putArray("parameter_shifts");
            result.alternative().parameterShifts().forEach((name, value) -> {
                ObjectNode node = shifts.addObject();
                node.put("name", name);
                JsonResults.number(node, "value", value);
            });
        }
        ArrayNode rates = root.putArray("rejection_rates");
        for (MonteCarlo.Rates r : result.rates()) {
            ObjectNode node = rates.addObject();
            node.put("test", r.test());
            node.put("kind", r.underNull() ? "size" : "power");
            ArrayNode levels = node.putArray("levels");
            for (int l = 0; l < MonteCarlo.LEVELS.length; l++) {
                ObjectNode level = levels.addObject();
                JsonResults.number(level, "nominal", MonteCarlo.LEVELS[l]);
                JsonResults.number(level, "rate", r.rates()[l]);
                JsonResults.number(level, "mc_std_error", r.stdErrors()[l]);
            }
        }
        root.put("caution", Caution.TEXT);
        return root;
    }

    /** The console text. */
    public static String render(RunSpec spec, SampleInfo sample, GmmFit fit, MonteCarlo.Result result) {
        StringBuilder out = new StringBuilder("Monte Carlo of \"" + spec.title() + "\"\n");
        out.append(String.format(Locale.ROOT, "  %d samples of T = %d, K = %d like the %s sample %s to %s, drawn "
                + "from the recentred block bootstrap of the %s estimate (%s blocks of %d, %s; seed %d)%n",
                result.replications(), result.observations(), result.moments(), sample.frequency(), sample.start(),
                sample.end(), fit.method().id(), result.scheme().id(), result.blockLength(),
                result.automaticBlockLength() ? "Politis-White rule" : "given", result.seed()));
        out.append("  truth of the simulated world: ").append(truth(result)).append('\n');
        if (!result.alternative().isNull()) {
            out.append("  alternative: ").append(alternative(result)).append('\n');
        }
        TextTable table = new TextTable(List.of("test", "kind", "1%", "5%", "10%"));
        for (MonteCarlo.Rates r : result.rates()) {
            List<String> cells = new ArrayList<>(List.of(testName(r.test()), r.underNull() ? "size" : "power"));
            for (int l = 0; l < MonteCarlo.LEVELS.length; l++) {
                cells.add(String.format(Locale.ROOT, "%.3f (%.3f)", r.rates()[l], r.stdErrors()[l]));
            }
            table.row(cells);
        }
        out.append("  Rejection rates at the nominal levels (Monte Carlo standard errors):\n").append(table.render("  "));
        out.append(String.format(Locale.ROOT, "  failed samples: %d of %d%n", result.failedReplications(),
                result.replications()));
        result.failureReasons().entrySet().stream().sorted(Map.Entry.comparingByKey())
                .forEach(e -> out.append("    ").append(e.getValue()).append(" x ").append(e.getKey()).append('\n'));
        out.append('\n').append(Caution.TEXT).append('\n');
        return out.toString();
    }

    /** The report document: the rates table and the chart of actual against nominal rates. */
    public static Report document(RunSpec spec, SampleInfo sample, GmmFit fit, MonteCarlo.Result result) {
        Report.Builder report = Report.builder("Monte Carlo: " + spec.title())
                .key(spec.modelFile().getFileName().toString().replaceFirst("\\.toml$", "") + "-montecarlo")
                .subtitle(String.format(Locale.ROOT, "%d samples of T = %d, K = %d from the recentred block bootstrap "
                        + "of the %s estimate (%s blocks of %d; seed %d)", result.replications(), result.observations(),
                        result.moments(), fit.method().id(), result.scheme().id(), result.blockLength(), result.seed()))
                .subtitle("Truth: " + truth(result));
        if (!result.alternative().isNull()) {
            report.subtitle("Alternative: " + alternative(result));
        }
        Table.Builder table = Table.builder("rejection-rates", "Rejection rates at nominal levels", "test", "kind",
                "1%", "se 1%", "5%", "se 5%", "10%", "se 10%");
        List<Chart.Point> points = new ArrayList<>();
        for (MonteCarlo.Rates r : result.rates()) {
            List<Cell> row = new ArrayList<>(List.of(Cell.text(testName(r.test())),
                    Cell.text(r.underNull() ? "size" : "power")));
            for (int l = 0; l < MonteCarlo.LEVELS.length; l++) {
                row.add(Cell.fixed(r.rates()[l], 3));
                row.add(Cell.fixed(r.stdErrors()[l], 3));
                points.add(new Chart.Point(shortName(r.test()), MonteCarlo.LEVELS[l], r.rates()[l]));
            }
            table.row(row);
        }
        table.note(String.format(Locale.ROOT, "Share of %d fitted samples (of %d drawn) in which each asymptotic "
                + "test rejects; Monte Carlo standard errors sqrt(r(1 - r)/R). Samples drawn by the recentred block "
                + "bootstrap, each fitted with the model file's estimator; t tests of the simulated world's truth.",
                result.successfulReplications(), result.replications()));
        report.section("Rejection rates").table(table.build())
                .chart(new Chart.Scatter("rejection-rates", "Actual against nominal rejection rates", "nominal level",
                        "rejection rate", points));
        return report.build();
    }

    private static String truth(MonteCarlo.Result result) {
        List<String> parts = new ArrayList<>();
        for (int i = 0; i < result.parameterNames().size(); i++) {
            parts.add(result.parameterNames().get(i) + " = " + ConsoleReport.number(result.truth()[i]));
        }
        return String.join(", ", parts);
    }

    private static String alternative(MonteCarlo.Result result) {
        List<String> parts = new ArrayList<>();
        result.alternative().pricingErrors().forEach((name, value) -> parts.add("pricing error of " + name + " = "
                + ConsoleReport.number(value)));
        result.alternative().parameterShifts().forEach((name, value) -> parts.add("t test of " + name + " at truth "
                + (value >= 0 ? "+ " : "- ") + ConsoleReport.number(Math.abs(value))));
        return String.join(", ", parts);
    }

    private static String testName(String test) {
        if (test.startsWith("t:")) {
            return "t test of " + test.substring(2);
        }
        return switch (test) {
            case "hansen-j" -> "Hansen J";
            case "pricing-errors-joint" -> "joint pricing-error test";
            default -> test;
        };
    }

    private static String shortName(String test) {
        return test.startsWith("t:") ? "t " + test.substring(2) : test.equals("hansen-j") ? "J" : "joint";
    }
}
