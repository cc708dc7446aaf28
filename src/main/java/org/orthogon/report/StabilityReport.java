package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.analysis.Stability;
import org.orthogon.analysis.Stability.PeriodFit;
import org.orthogon.analysis.Stability.SupWald;
import org.orthogon.bootstrap.SupWaldBootstrap;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.SampleInfo;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/** Stability across sample periods as console text and as the stability JSON of docs/output.md. */
public final class StabilityReport {
    private static final double[] LEVELS = {0.10, 0.05, 0.01};

    private StabilityReport() {
    }

    /**
     * Everything one variant (the model file's estimator, or the fixed-weight one) produced.
     *
     * @param label    "efficient (two-step)" or "fixed weight (one-step, identity)"
     * @param periods  per-period fits at the known splits (empty without splits)
     * @param equality the equality test across those periods (null without splits)
     * @param supWald  the unknown-break test (null when not run)
     * @param rolling  rolling or expanding window fits (empty when not run)
     * @param supWaldBootstrap the bootstrap critical values and p-value of sup-Wald (null without --bootstrap)
     */
    public record Variant(String label, List<PeriodFit> periods, ChiSquareTest equality, SupWald supWald,
            List<PeriodFit> rolling, SupWaldBootstrap.Result supWaldBootstrap) {
        public Variant {
            periods = List.copyOf(periods);
            rolling = List.copyOf(rolling);
        }

        /** A variant without a bootstrap of sup-Wald. */
        public Variant(String label, List<PeriodFit> periods, ChiSquareTest equality, SupWald supWald,
                List<PeriodFit> rolling) {
            this(label, periods, equality, supWald, rolling, null);
        }
    }

    /** The line of the sup-Wald bootstrap, for the console and the report. */
    static String bootstrapLine(SupWaldBootstrap.Result b) {
        return String.format(Locale.ROOT, "bootstrap (recentred %s blocks of %d, %s; %d replications, %d failed; "
                + "seed %d): critical values 10%% %s, 5%% %s, 1%% %s, p-value %s", b.scheme().id(), b.blockLength(),
                b.automaticBlockLength() ? "Politis-White rule" : "given", b.replications(), b.failedReplications(),
                b.seed(), ConsoleReport.fixed(b.critical10(), 2), ConsoleReport.fixed(b.critical05(), 2),
                ConsoleReport.fixed(b.critical01(), 2), ConsoleReport.fixed(b.pValue(), 4));
    }

    public static String render(RunSpec spec, SampleInfo sample, List<Variant> variants, List<String> warnings) {
        StringBuilder out = new StringBuilder("Stability of \"" + spec.title() + "\" across sample periods\n");
        out.append(String.format(Locale.ROOT, "  full sample %s %s to %s (T = %d); each period is fitted separately%n",
                sample.frequency(), sample.start(), sample.end(), sample.observations()));
        for (Variant variant : variants) {
            out.append('\n').append("== ").append(variant.label()).append(" ==\n");
            if (!variant.periods().isEmpty()) {
                out.append(periodTable(variant.periods()));
                ChiSquareTest test = variant.equality();
                out.append(String.format(Locale.ROOT, "  equal parameters in every period (Andrews-Fair Wald): "
                        + "statistic %s, %d degrees of freedom, p-value %s%n", ConsoleReport.fixed(test.statistic(), 3),
                        test.df(), ConsoleReport.fixed(test.pValue(), 4)));
            }
            SupWald sup = variant.supWald();
            if (sup != null) {
                var d = sup.distribution();
                out.append(String.format(Locale.ROOT, "  unknown break (sup-Wald, %.0f%% trimming): statistic %s at %s,"
                        + " p-value %s%n", 100 * sup.trimming(), ConsoleReport.fixed(sup.statistic(), 3), sup.breakDate(),
                        ConsoleReport.fixed(sup.pValue(), 4)));
                out.append(String.format(Locale.ROOT, "    critical values 10%% %s, 5%% %s, 1%% %s (simulated limit of "
                        + "Andrews 1993 for %d parameters; seed %d, %d draws)%n",
                        ConsoleReport.fixed(d.criticalValue(0.10), 2), ConsoleReport.fixed(d.criticalValue(0.05), 2),
                        ConsoleReport.fixed(d.criticalValue(0.01), 2), d.parameters(), d.seed(), d.draws()));
                if (variant.supWaldBootstrap() != null) {
                    out.append("    ").append(bootstrapLine(variant.supWaldBootstrap())).append('\n');
                }
                if (!sup.failedDates().isEmpty()) {
                    out.append("    ").append(sup.failedDates().size())
                            .append(" candidate dates could not be fitted on both sides and were left out\n");
                }
            }
            if (!variant.rolling().isEmpty()) {
                out.append(rollingTable(variant.rolling(), spec.stability().expanding()));
            }
        }
        for (String warning : warnings) {
            out.append("WARNING: ").append(warning).append('\n');
        }
        out.append('\n').append(Caution.TEXT).append('\n');
        return out.toString();
    }

    private static String periodTable(List<PeriodFit> periods) {
        List<String> header = new ArrayList<>(List.of("parameter"));
        periods.forEach(p -> header.add(p.start() + " to " + p.end()));
        TextTable table = new TextTable(header);
        List<ParameterEstimate> names = periods.get(0).fit().parameters();
        for (int i = 0; i < names.size(); i++) {
            List<String> estimates = new ArrayList<>(List.of(names.get(i).name()));
            List<String> errors = new ArrayList<>(List.of(""));
            for (PeriodFit period : periods) {
                ParameterEstimate p = period.fit().parameters().get(i);
                estimates.add(ConsoleReport.number(p.estimate()));
                errors.add("(" + ConsoleReport.number(p.stdError()) + ")");
            }
            table.row(estimates);
            table.row(errors);
        }
        List<String> t = new ArrayList<>(List.of("observations"));
        List<String> j = new ArrayList<>(List.of("overidentification"));
        List<String> p = new ArrayList<>(List.of("  p-value"));
        for (PeriodFit period : periods) {
            t.add(Integer.toString(period.fit().observations()));
            j.add(ConsoleReport.fixed(period.fit().overidentification().statistic(), 3));
            p.add(ConsoleReport.fixed(period.fit().overidentification().pValue(), 4));
        }
        table.row(t).row(j).row(p);
        return table.render("  ");
    }

    private static String rollingTable(List<PeriodFit> windows, boolean expanding) {
        List<String> header = new ArrayList<>(List.of("window"));
        List<String> names = windows.stream().filter(w -> w.fit() != null).findFirst()
                .map(w -> w.fit().parameters().stream().map(ParameterEstimate::name).toList()).orElse(List.of());
        names.forEach(name -> {
            header.add(name);
            header.add("se");
        });
        header.add("p(overid)");
        TextTable table = new TextTable(header);
        for (PeriodFit window : windows) {
            List<String> row = new ArrayList<>(List.of(window.start() + " to " + window.end()));
            if (window.fit() == null) {
                names.forEach(name -> {
                    row.add("failed");
                    row.add("-");
                });
                row.add("-");
            } else {
                for (ParameterEstimate p : window.fit().parameters()) {
                    row.add(ConsoleReport.number(p.estimate()));
                    row.add(ConsoleReport.number(p.stdError()));
                }
                row.add(ConsoleReport.fixed(window.fit().overidentification().pValue(), 4));
            }
            table.row(row);
        }
        return "  " + windowKind(expanding) + " windows (estimate, standard error; bands are estimate +- 1.96 se)\n"
                + table.render("  ");
    }

    /** "expanding" (every window starts at the first observation) or "rolling" (fixed length). */
    static String windowKind(boolean expanding) {
        return expanding ? "expanding" : "rolling";
    }

    /** The stability JSON: the model file's variant at the top level, the fixed-weight one under "fixed_weight". */
    public static ObjectNode json(RunSpec spec, SampleInfo sample, List<Variant> variants) {
        ObjectNode root = variantJson(spec, sample.frequency(), variants.get(0));
        for (int v = 1; v < variants.size(); v++) {
            root.set("fixed_weight", variantJson(spec, sample.frequency(), variants.get(v)));
        }
        root.put("caution", Caution.TEXT);
        return root;
    }

    private static ObjectNode variantJson(RunSpec spec, String frequency, Variant variant) {
        ObjectNode root = JsonResults.newObject();
        root.put("variant", variant.label());
        ArrayNode periods = root.putArray("periods");
        for (PeriodFit period : variant.periods()) {
            periods.add(JsonResults.fit(spec, sampleOf(period, frequency), period.fit()));
        }
        if (variant.equality() != null) {
            ObjectNode test = root.putObject("equality_test");
            JsonResults.number(test, "statistic", variant.equality().statistic());
            test.put("df", variant.equality().df());
            JsonResults.number(test, "p_value", variant.equality().pValue());
        }
        SupWald sup = variant.supWald();
        if (sup != null) {
            ObjectNode node = root.putObject("sup_wald");
            JsonResults.number(node, "statistic", sup.statistic());
            node.put("break_date", sup.breakDate());
            node.put("trimming", sup.trimming());
            ObjectNode critical = node.putObject("critical_values");
            for (double level : LEVELS) {
                JsonResults.number(critical, String.format(Locale.ROOT, "%.2f", level),
                        sup.distribution().criticalValue(level));
            }
            JsonResults.number(node, "p_value", sup.pValue());
            node.put("p_value_method", "simulated limit of Andrews (1993)");
            node.put("seed", sup.distribution().seed());
            node.put("draws", sup.distribution().draws());
            SupWaldBootstrap.Result b = variant.supWaldBootstrap();
            if (b != null) {
                ObjectNode boot = node.putObject("bootstrap");
                boot.put("method", "recentred-block");
                boot.put("replications", b.replications());
                boot.put("failed_replications", b.failedReplications());
                boot.put("block_length", b.blockLength());
                boot.put("block_length_rule", b.automaticBlockLength() ? "politis-white" : "given");
                boot.put("block_scheme", b.scheme().id());
                boot.put("seed", b.seed());
                ObjectNode values = boot.putObject("critical_values");
                JsonResults.number(values, "0.10", b.critical10());
                JsonResults.number(values, "0.05", b.critical05());
                JsonResults.number(values, "0.01", b.critical01());
                JsonResults.number(boot, "p_value", b.pValue());
            }
            ArrayNode sequence = node.putArray("sequence");
            for (Stability.BreakPoint point : sup.sequence()) {
                ObjectNode entry = sequence.addObject();
                entry.put("date", point.date());
                JsonResults.number(entry, "statistic", point.statistic());
            }
        }
        ArrayNode rolling = root.putArray("rolling");
        root.put("expanding", spec.stability().expanding());
        for (PeriodFit window : variant.rolling()) {
            ObjectNode node = rolling.addObject();
            node.put("start", window.start());
            node.put("end", window.end());
            GmmFit fit = window.fit();
            if (fit == null) {
                node.putNull("parameters");
                node.putNull("overidentification");
                continue;
            }
            ObjectNode full = JsonResults.fit(spec, sampleOf(window, frequency), fit);
            node.set("parameters", full.get("parameters"));
            node.set("overidentification", full.get("overidentification"));
        }
        return root;
    }

    private static SampleInfo sampleOf(PeriodFit period, String frequency) {
        return new SampleInfo(period.start(), period.end(), period.to() - period.from(), frequency);
    }
}
