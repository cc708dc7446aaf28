package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.analysis.Stability;
import org.orthogon.analysis.Stability.PeriodFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.SampleInfo;

/**
 * The report document of `stability`: per-period tables, the tests, the sup-Wald sequence, and the
 * rolling or expanding windows as a table and as one chart per parameter.
 */
public final class StabilityDocument {
    private StabilityDocument() {
    }

    public static Report build(RunSpec spec, SampleInfo sample, List<StabilityReport.Variant> variants,
            List<String> warnings) {
        Report.Builder report = Report.builder("Stability: " + spec.title())
                .key(spec.modelFile().getFileName().toString().replaceFirst("\\.toml$", "") + "-stability")
                .subtitle(String.format(Locale.ROOT, "Full sample %s %s to %s, T = %d; each period fitted separately",
                        sample.frequency(), sample.start(), sample.end(), sample.observations()));
        for (int v = 0; v < variants.size(); v++) {
            StabilityReport.Variant variant = variants.get(v);
            String suffix = v == 0 ? "" : "-fixed-weight";
            report.section(capitalise(variant.label()));
            if (!variant.periods().isEmpty()) {
                report.table(periods("periods" + suffix, variant));
            }
            Stability.SupWald sup = variant.supWald();
            if (sup != null) {
                var d = sup.distribution();
                report.paragraph(String.format(Locale.ROOT, "Unknown break: sup-Wald %s at %s, p-value %s; "
                        + "critical values 10%% %s, 5%% %s, 1%% %s (simulated limit of Andrews 1993 for %d parameters, "
                        + "%.0f%% trimming; seed %d, %d draws).", ConsoleReport.fixed(sup.statistic(), 3),
                        sup.breakDate(), ConsoleReport.fixed(sup.pValue(), 4), ConsoleReport.fixed(d.criticalValue(0.10), 2),
                        ConsoleReport.fixed(d.criticalValue(0.05), 2), ConsoleReport.fixed(d.criticalValue(0.01), 2),
                        d.parameters(), 100 * sup.trimming(), d.seed(), d.draws()));
                if (variant.supWaldBootstrap() != null) {
                    report.paragraph("Sup-Wald " + StabilityReport.bootstrapLine(variant.supWaldBootstrap()) + ".");
                }
                report.chart(new Chart.Sequence("sup-wald" + suffix, "Wald statistic at each candidate break date",
                        "break date", "Wald statistic", sup.sequence().stream().map(Stability.BreakPoint::date).toList(),
                        sup.sequence().stream().map(Stability.BreakPoint::statistic).toList(), d.criticalValue(0.05),
                        "5% critical value of the supremum"));
            }
            if (!variant.rolling().isEmpty()) {
                boolean expanding = spec.stability().expanding();
                report.table(windows("windows" + suffix, variant.rolling(), expanding));
                // One chart per parameter: parameters on different scales would flatten each other.
                rollingCharts("rolling", suffix, variant.rolling(), expanding).forEach(report::chart);
            }
        }
        return report.warnings(warnings).build();
    }

    private static Table periods(String id, StabilityReport.Variant variant) {
        List<PeriodFit> periods = variant.periods();
        List<String> header = new ArrayList<>(List.of("parameter"));
        for (PeriodFit period : periods) {
            header.add(period.start() + " to " + period.end());
            header.add("se " + period.start());
        }
        Table.Builder table = Table.builder(id, "Estimates by period", header);
        for (PeriodFit period : periods) {
            table.errorUnder(period.start() + " to " + period.end(), "se " + period.start());
        }
        List<ParameterEstimate> first = periods.get(0).fit().parameters();
        for (int i = 0; i < first.size(); i++) {
            List<Cell> row = new ArrayList<>(List.of(Cell.parameter(first.get(i).name())));
            for (PeriodFit period : periods) {
                ParameterEstimate p = period.fit().parameters().get(i);
                row.add(Cell.number(p.estimate()));
                row.add(Cell.number(p.stdError()));
            }
            table.row(row);
        }
        StringBuilder overid = new StringBuilder("Overidentification p-values by period:");
        for (PeriodFit period : periods) {
            overid.append(' ').append(period.start()).append(" to ").append(period.end()).append(' ')
                    .append(ConsoleReport.fixed(period.fit().overidentification().pValue(), 4)).append(';');
        }
        var equality = variant.equality();
        return table.note("Standard errors in parentheses.").note(overid.substring(0, overid.length() - 1) + ".")
                .note(String.format(Locale.ROOT, "Equal parameters in every period (Andrews-Fair Wald): statistic %s, "
                        + "%d degrees of freedom, p-value %s.", ConsoleReport.fixed(equality.statistic(), 3),
                        equality.df(), ConsoleReport.fixed(equality.pValue(), 4)))
                .build();
    }

    /**
     * One row per window: its dates and T, each parameter's estimate with its standard error under it,
     * and the overidentification p-value; a window whose fit failed shows n/a.
     */
    private static Table windows(String id, List<PeriodFit> windows, boolean expanding) {
        List<String> names = windows.stream().filter(w -> w.fit() != null).findFirst()
                .map(w -> w.fit().parameters().stream().map(ParameterEstimate::name).toList()).orElse(List.of());
        List<String> header = new ArrayList<>(List.of("window", "T"));
        for (String name : names) {
            header.add(name);
            header.add("se " + name);
        }
        header.add("p(overid)");
        Table.Builder table = Table.builder(id, "Estimates over " + StabilityReport.windowKind(expanding) + " windows",
                header);
        names.forEach(name -> table.errorUnder(name, "se " + name));
        for (PeriodFit window : windows) {
            List<Cell> row = new ArrayList<>(List.of(Cell.text(window.start() + " to " + window.end()),
                    Cell.count(window.to() - window.from())));
            for (int i = 0; i < names.size(); i++) {
                ParameterEstimate p = window.fit() == null ? null : window.fit().parameters().get(i);
                row.add(Cell.number(p == null ? Double.NaN : p.estimate()));
                row.add(Cell.number(p == null ? Double.NaN : p.stdError()));
            }
            row.add(Cell.fixed(window.fit() == null ? Double.NaN : window.fit().overidentification().pValue(), 4));
            table.row(row);
        }
        long failed = windows.stream().filter(w -> w.fit() == null).count();
        table.note("Standard errors in parentheses; p(overid) is the p-value of each window's overidentification test.");
        if (failed > 0) {
            table.note(failed + " of " + windows.size() + " windows could not be fitted (n/a).");
        }
        return table.build();
    }

    private static List<Chart> rollingCharts(String prefix, String suffix, List<PeriodFit> windows, boolean expanding) {
        List<String> dates = windows.stream().map(PeriodFit::end).toList();
        PeriodFit sample = windows.stream().filter(w -> w.fit() != null).findFirst().orElse(null);
        List<Chart> charts = new ArrayList<>();
        if (sample == null) {
            return charts;
        }
        for (int i = 0; i < sample.fit().parameters().size(); i++) {
            String name = sample.fit().parameters().get(i).name();
            List<Double> values = new ArrayList<>();
            List<Double> errors = new ArrayList<>();
            for (PeriodFit window : windows) {
                ParameterEstimate p = window.fit() == null ? null : window.fit().parameters().get(i);
                values.add(p == null ? Double.NaN : p.estimate());
                errors.add(p == null ? Double.NaN : p.stdError());
            }
            String id = prefix + "-" + name.toLowerCase(java.util.Locale.ROOT).replaceAll("[^a-z0-9]+", "-") + suffix;
            charts.add(new Chart.Bands(id, name + " over " + StabilityReport.windowKind(expanding)
                    + " windows (±1.96 standard errors)", "window end",
                    name, dates, List.of(new Chart.Path(name, values, errors))));
        }
        return charts;
    }

    private static String capitalise(String text) {
        return text.isEmpty() ? text : Character.toUpperCase(text.charAt(0)) + text.substring(1);
    }
}
