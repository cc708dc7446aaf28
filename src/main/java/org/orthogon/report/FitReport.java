package org.orthogon.report;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.ConfidenceInterval;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.gmm.PricingError;
import org.orthogon.analysis.CrossSectionFit;
import org.orthogon.analysis.SensitivityGrid;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import tools.jackson.databind.node.ObjectNode;

/**
 * The report of one {@code fit}: parameter, overidentification and pricing-error tables, the
 * pricing-error chart and, without instruments, realised against model-implied mean returns;
 * and the output folder that holds them (docs/output.md describes every file).
 */
public final class FitReport {
    private FitReport() {
    }

    /** The document of one fit, without restriction tests or sensitivity grid. */
    public static Report build(RunSpec spec, PreparedRun prepared, GmmFit fit) {
        return build(spec, prepared, fit, null, List.of(), List.of());
    }

    /**
     * What a fit may add to its report beyond the estimates, each null when absent: Windmeijer's corrected
     * standard errors, the weak-identification-robust sets, the recentred block bootstrap.
     */
    public record Extras(org.orthogon.gmm.WindmeijerCorrection.Result windmeijer,
            org.orthogon.robust.RobustSets.Analysis robust, org.orthogon.bootstrap.FitBootstrap.Result bootstrap) {
        /** Nothing extra. */
        public static final Extras NONE = new Extras(null, null, null);

        /** Windmeijer's standard errors and the robust sets, without a bootstrap. */
        public Extras(org.orthogon.gmm.WindmeijerCorrection.Result windmeijer,
                org.orthogon.robust.RobustSets.Analysis robust) {
            this(windmeijer, robust, null);
        }
    }

    /**
     * The document of one fit with the risk premia of a demeaned linear SDF (null when there are none), the
     * Wald tests of its restrictions and the rows of its kernel-and-bandwidth sensitivity grid (either list
     * may be empty).
     */
    public static Report build(RunSpec spec, PreparedRun prepared, GmmFit fit, FittedRun.RiskPremiumEstimates premia,
            List<FittedRun.RestrictionTest> restrictions, List<SensitivityGrid.SensitivityRow> sensitivity) {
        return build(spec, prepared, fit, premia, restrictions, sensitivity, Extras.NONE);
    }

    /** As above, with Windmeijer's standard errors and the robust sets when {@code extras} holds them. */
    public static Report build(RunSpec spec, PreparedRun prepared, GmmFit fit, FittedRun.RiskPremiumEstimates premia,
            List<FittedRun.RestrictionTest> restrictions, List<SensitivityGrid.SensitivityRow> sensitivity,
            Extras extras) {
        var sample = prepared.sample();
        java.util.Optional<BetaPricingView> beta = BetaPricingView.of(spec, fit);
        Report.Builder report = Report.builder(spec.title()).key(spec.modelFile().getFileName().toString()
                .replaceFirst("\\.toml$", ""))
                .subtitle(String.format(Locale.ROOT, "%s, %s GMM; %s sample %s to %s, T = %d",
                        beta.map(BetaPricingView::describe).orElse(spec.model().family().id() + " SDF"),
                        fit.method().id(), sample.frequency(), sample.start(),
                        sample.end(), sample.observations()))
                .subtitle("N = " + ConsoleReport.count(prepared.assets().size(), "test asset") + ", K = "
                        + ConsoleReport.count(fit.momentCount(), "moment") + ", P = "
                        + ConsoleReport.count(fit.parameters().size(), "parameter"))
                .subtitle("Long-run covariance: " + ConsoleReport.describeLongRun(fit));
        report.section("Parameters").table(parameters(fit, extras.windmeijer() == null ? null
                : extras.windmeijer().stdErrors(), beta));
        beta.ifPresent(view -> report.table(view.table()));
        if (premia != null) {
            report.table(riskPremia(premia));
        }
        report.section("Overidentifying restrictions").table(overidentification(fit));
        MeanPayoffs means = beta.map(view -> new MeanPayoffs(new CrossSectionFit(prepared.assets(), view.realised(),
                view.predicted(), view.pricingErrors().stream().mapToDouble(PricingError::error).toArray(), Double.NaN,
                Double.NaN, Double.NaN, Double.NaN), "excess return")).orElseGet(() -> realisedAndImplied(spec, prepared,
                        fit));
        List<PricingError> rows = beta.map(BetaPricingView::pricingErrors).orElse(fit.pricingErrors());
        report.section("Pricing errors").table(pricingErrors(rows, fit.pricingErrorsJoint(), means, beta.isPresent()))
                .chart(errorChart(rows));
        if (means != null) {
            report.chart(scatter(prepared.assets(), means));
        }
        if (!restrictions.isEmpty()) {
            report.section("Linear restrictions").table(restrictions(restrictions));
        }
        if (!sensitivity.isEmpty()) {
            report.section("Sensitivity to the long-run covariance")
                    .table(SensitivityReport.table(sensitivity, mainParameters(spec, fit.parameterNames())));
        }
        if (extras.robust() != null) {
            RobustSetsReport.addSection(report, extras.robust());
        }
        if (extras.bootstrap() != null) {
            BootstrapReport.addSection(report, extras.bootstrap());
        }
        if (!prepared.notes().isEmpty()) {
            report.section("Data preparation");
            prepared.notes().forEach(report::paragraph);
        }
        List<String> warnings = new ArrayList<>();
        prepared.warnings().forEach(warning -> warnings.add(warning.text()));
        warnings.addAll(fit.warnings());
        return report.warnings(warnings).build();
    }

    /**
     * The parameters a report lists in its main tables: all of them, except for the beta-pricing system,
     * whose λ (and λ_0) come first and whose a and β have a table of their own.
     */
    public static List<String> mainParameters(RunSpec spec, List<String> names) {
        return spec.model() instanceof org.orthogon.spec.BetaPricingSpec beta
                ? names.subList(0, beta.crossSectionCoefficients()) : names;
    }

    /** The Wald tests of the model file's and the command line's linear restrictions. */
    static Table restrictions(List<FittedRun.RestrictionTest> tests) {
        Table.Builder table = Table.builder("restrictions", "Wald tests of linear restrictions", "restrictions",
                "statistic", "df", "p-value");
        for (FittedRun.RestrictionTest test : tests) {
            table.row(Cell.text(test.restrictions()), Cell.fixed(test.test().statistic(), 3),
                    Cell.count(test.test().df()), Cell.fixed(test.test().pValue(), 4));
        }
        return table.note("Wald statistics with the reported parameter covariance; chi-square with one degree of "
                + "freedom per restriction.").build();
    }

    /**
     * Writes the output folder of one fit: {@code results.json} (exactly what {@code --json} writes),
     * the tables, charts and HTML report, and {@code manifest.json} last. Nothing is visible under
     * {@code target} until every file is complete.
     *
     * @return the folder written
     */
    public static Path writeFolder(Path target, boolean overwrite, ObjectNode results, RunSpec spec,
            PreparedRun prepared, GmmFit fit, FittedRun.RiskPremiumEstimates premia,
            List<FittedRun.RestrictionTest> restrictions, List<SensitivityGrid.SensitivityRow> sensitivity,
            Extras extras, Manifest.Run run) {
        return ReportFiles.publish(target, overwrite, build(spec, prepared, fit, premia, restrictions, sensitivity,
                extras), results, run, List.of(spec),
                List.of(prepared.inputs()));
    }

    /** The parameter table, standard errors under the estimates. */
    public static Table parameters(GmmFit fit) {
        return parameters(fit, null);
    }

    /** The parameter table, with Windmeijer's corrected standard errors in a column when given. */
    public static Table parameters(GmmFit fit, double[] windmeijer) {
        return parameters(fit, windmeijer, java.util.Optional.empty());
    }

    /** The same; for the beta-pricing system only λ, with a note pointing to the time-series table. */
    private static Table parameters(GmmFit fit, double[] windmeijer, java.util.Optional<BetaPricingView> beta) {
        String level = String.format(Locale.ROOT, "%.0f%%", 100 * fit.confidenceLevel());
        List<String> header = new ArrayList<>(List.of("parameter", "estimate", "std. error", "t-stat", "p-value",
                level + " low", level + " high"));
        if (windmeijer != null) {
            header.add(3, "Windmeijer s.e.");
        }
        Table.Builder table = Table.builder("parameters", "Parameter estimates", header)
                .errorUnder("estimate", "std. error");
        List<ConfidenceInterval> intervals = fit.confidenceIntervals();
        int shown = beta.map(view -> view.headline().size()).orElse(fit.parameters().size());
        for (int i = 0; i < shown; i++) {
            ParameterEstimate p = fit.parameters().get(i);
            List<Cell> row = new ArrayList<>(List.of(Cell.parameter(p.name()), Cell.number(p.estimate()),
                    Cell.number(p.stdError()), Cell.fixed(p.tStat(), 2), Cell.fixed(p.pValue(), 4),
                    Cell.number(intervals.get(i).lower()), Cell.number(intervals.get(i).upper())));
            if (windmeijer != null) {
                row.add(3, Cell.number(windmeijer[i]));
            }
            table.row(row);
        }
        if (windmeijer != null) {
            table.note("Windmeijer s.e.: corrected for the estimated weight of two-step GMM (Windmeijer 2005, "
                    + "Journal of Econometrics 126); t-statistics, p-values and intervals use the usual standard errors.");
        }
        ChiSquareTest over = fit.overidentification();
        beta.ifPresent(view -> table.note(view.timeSeriesNote("in the table time-series")));
        return table.note("Standard errors in parentheses; p-values two-sided against zero, normal approximation.")
                .note(String.format(Locale.ROOT, "%s: statistic %s, %d degrees of freedom, p-value %s.", testName(over),
                        ConsoleReport.fixed(over.statistic(), 3), over.df(), ConsoleReport.fixed(over.pValue(), 4)))
                .note(String.format(Locale.ROOT, "Method: %s GMM, T = %d.", fit.method().id(), fit.observations()))
                .build();
    }

    /** λ = Σ_F b per factor with its delta-method standard error. */
    static Table riskPremia(org.orthogon.spec.FittedRun.RiskPremiumEstimates premia) {
        Table.Builder table = Table.builder("risk-premia", "Factor risk premia implied by the SDF", "factor",
                "risk premium", "std. error", "t-stat").errorUnder("risk premium", "std. error");
        for (int k = 0; k < premia.factors().size(); k++) {
            table.row(Cell.text(premia.factors().get(k)), Cell.number(premia.estimates()[k]),
                    Cell.number(premia.stdErrors()[k]), Cell.fixed(premia.estimates()[k] / premia.stdErrors()[k], 2));
        }
        return table.note("lambda = Cov(F, F') b (Cochrane 2005, section 6.3); standard errors by the delta method on b "
                + "and the factor covariance jointly, b's influence taken at the fit's own weight.").build();
    }

    /** The overidentification test and the joint test of the pricing errors. */
    public static Table overidentification(GmmFit fit) {
        Table.Builder table = Table.builder("overidentification", "Tests of the overidentifying restrictions",
                "test", "statistic", "df", "p-value");
        ChiSquareTest over = fit.overidentification();
        ChiSquareTest joint = fit.pricingErrorsJoint();
        table.row(Cell.text(testName(over)), Cell.fixed(over.statistic(), 3), Cell.count(over.df()),
                Cell.fixed(over.pValue(), 4));
        if (!joint.kind().equals(over.kind())) {
            table.row(Cell.text(testName(joint)), Cell.fixed(joint.statistic(), 3), Cell.count(joint.df()),
                    Cell.fixed(joint.pValue(), 4));
        }
        fit.hj().ifPresent(hj -> table.row(Cell.text("Hansen-Jagannathan distance"), Cell.number(hj.value()),
                Cell.text(""), Cell.fixed(hj.pValue(), 4)));
        table.note("p-values from the chi-square distribution with K - P degrees of freedom, a large-sample "
                + "approximation.");
        fit.hj().ifPresent(hj -> table.note("Hansen-Jagannathan distance: p-value from " + hj.pValueSource() + "."));
        return table.build();
    }

    private static String testName(ChiSquareTest test) {
        return switch (test.kind()) {
            case "hansen-j" -> "Hansen J";
            case "pricing-errors-joint" -> "Joint test that all pricing errors are zero";
            default -> test.kind();
        };
    }

    /** One row per moment; with realised and model-implied means when {@code means} is not null. */
    static Table pricingErrors(GmmFit fit, MeanPayoffs means) {
        return pricingErrors(fit.pricingErrors(), fit.pricingErrorsJoint(), means, false);
    }

    /** The rows given; {@code betaPricing} says the implied means are β'λ rather than SDF prices. */
    private static Table pricingErrors(List<PricingError> errors, ChiSquareTest joint, MeanPayoffs means,
            boolean betaPricing) {
        List<String> header = new ArrayList<>(List.of("moment", "error", "std. error", "t-stat"));
        if (means != null) {
            header.addAll(List.of("realised mean", "model-implied mean"));
        }
        Table.Builder table = Table.builder("pricing-errors", "Pricing errors at the estimate", header);
        for (int i = 0; i < errors.size(); i++) {
            PricingError e = errors.get(i);
            boolean priced = means != null && i < means.realised().length;
            // Fixed decimals: the column compares returns of one scale, which exponents would hide.
            List<Cell> row = new ArrayList<>(List.of(Cell.text(e.asset()), Cell.fixed(e.error(), 6),
                    Cell.fixed(e.stdError(), 6), Cell.fixed(e.tStat(), 2)));
            if (means != null) {
                row.add(priced ? Cell.fixed(means.realised()[i], 6) : Cell.text(""));
                row.add(priced ? Cell.fixed(means.implied()[i], 6) : Cell.text(""));
            }
            table.row(row);
        }
        table.note(betaPricing ? "Error: alpha = mean excess return - beta'lambda (the cross-sectional residual), in "
                + "decimals per period, with its GMM standard error." : "Error: the sample mean of the moment at the "
                + "estimate (g_T), in decimals per period.");
        if (betaPricing) {
            table.note("Model-implied mean: beta'lambda with the estimated betas and premia (plus lambda_0 with the "
                    + "cross-sectional intercept).");
        } else if (means != null) {
            table.note(String.format(Locale.ROOT, "Realised mean: sample mean %s. Model-implied mean: realised "
                    + "minus error / mean SDF, with mean SDF %s.", means.payoff(),
                    ConsoleReport.fixed(means.fit().meanSdf(), 6)));
        }
        return table.note(String.format(Locale.ROOT, "All errors zero: chi-square %s, %d degrees of freedom, "
                + "p-value %s.", ConsoleReport.fixed(joint.statistic(), 3), joint.df(),
                ConsoleReport.fixed(joint.pValue(), 4))).build();
    }

    private static Chart errorChart(List<PricingError> errors) {
        return new Chart.ErrorBars("pricing-errors", "Pricing errors with 95% bands (±1.96 standard errors)",
                "moment", "pricing error", errors.stream()
                        .map(e -> new Chart.Estimate(e.asset(), e.error(), e.stdError())).toList());
    }

    private static Chart scatter(List<String> assets, MeanPayoffs means) {
        String payoff = means.payoff();
        List<Chart.Point> points = new ArrayList<>();
        for (int i = 0; i < assets.size(); i++) {
            points.add(new Chart.Point(assets.get(i), means.implied()[i], means.realised()[i]));
        }
        return new Chart.Scatter("realised-vs-implied", "Realised against model-implied mean " + payoff + "s",
                "model-implied mean " + payoff, "realised mean " + payoff, points);
    }

    /**
     * Realised and model-implied mean payoffs of the test assets at the estimate.
     *
     * @param fit    the cross-sectional fit: realised x̄_i, implied x̄_i - g_i / m̄
     * @param payoff "excess return" or "gross return", for labels
     */
    record MeanPayoffs(CrossSectionFit fit, String payoff) {
        double[] realised() {
            return fit.realised();
        }

        double[] implied() {
            return fit.implied();
        }
    }

    /**
     * Realised and model-implied mean payoffs per asset (see {@link CrossSectionFit}); null where they
     * are not defined: moments scaled by instruments (several moments per asset) or a single asset.
     */
    static MeanPayoffs realisedAndImplied(RunSpec spec, PreparedRun prepared, GmmFit fit) {
        if (!spec.model().instrumentColumns().isEmpty() || prepared.assets().size() < 2) {
            return null;
        }
        return new MeanPayoffs(CrossSectionFit.of(prepared.moments(), fit.estimates()), payoffLabel(spec));
    }

    /** What the moments price: "gross return" (E[m R] = 1) or "excess return" (E[m R^e] = 0). */
    static String payoffLabel(RunSpec spec) {
        return spec.model().payoff().label();
    }
}
