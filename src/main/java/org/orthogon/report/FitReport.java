package org.orthogon.report;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.gmm.PricingError;
import org.orthogon.moments.MomentAlgebra;
import org.orthogon.moments.MomentModel;
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

    /** The document of one fit. */
    public static Report build(RunSpec spec, PreparedRun prepared, GmmFit fit) {
        var sample = prepared.sample();
        Report.Builder report = Report.builder(spec.title())
                .subtitle(String.format(Locale.ROOT, "%s SDF, %s GMM; %s sample %s to %s, T = %d",
                        spec.model().family().id(), fit.method().id(), sample.frequency(), sample.start(),
                        sample.end(), sample.observations()))
                .subtitle(String.format(Locale.ROOT, "N = %d test assets, K = %d moments, P = %d parameters",
                        prepared.assets().size(), fit.momentCount(), fit.parameters().size()))
                .subtitle("Long-run covariance: " + ConsoleReport.describeLongRun(fit));
        report.section("Parameters").table(parameters(fit));
        report.section("Overidentifying restrictions").table(overidentification(fit));
        List<double[]> means = realisedAndImplied(spec, prepared, fit);
        report.section("Pricing errors").table(pricingErrors(fit, means, payoffName(spec))).chart(errorChart(fit));
        if (means != null) {
            report.chart(scatter(prepared.assets(), means, payoffName(spec)));
        }
        if (!prepared.notes().isEmpty()) {
            report.section("Data preparation");
            prepared.notes().forEach(report::paragraph);
        }
        return report.warnings(fit.warnings()).build();
    }

    /**
     * Writes the output folder of one fit: {@code results.json} (exactly what {@code --json} writes),
     * the tables, charts and HTML report, and {@code manifest.json} last. Nothing is visible under
     * {@code target} until every file is complete.
     *
     * @return the folder written
     */
    public static Path writeFolder(Path target, boolean overwrite, ObjectNode results, RunSpec spec,
            PreparedRun prepared, GmmFit fit, Manifest.Run run) {
        return ReportFiles.publish(target, overwrite, build(spec, prepared, fit), results, run, List.of(spec),
                List.of(prepared.inputs()));
    }

    /** The parameter table, standard errors under the estimates. */
    public static Table parameters(GmmFit fit) {
        Table.Builder table = Table.builder("parameters", "Parameter estimates", "parameter", "estimate",
                "std. error", "t-stat", "p-value").errorUnder("estimate", "std. error");
        for (ParameterEstimate p : fit.parameters()) {
            table.row(Cell.text(p.name()), Cell.number(p.estimate()), Cell.number(p.stdError()),
                    Cell.fixed(p.tStat(), 2), Cell.fixed(p.pValue(), 4));
        }
        ChiSquareTest over = fit.overidentification();
        return table.note("Standard errors in parentheses; p-values two-sided against zero, normal approximation.")
                .note(String.format(Locale.ROOT, "%s = %s with %d degrees of freedom, p-value %s.", testName(over),
                        ConsoleReport.fixed(over.statistic(), 3), over.df(), ConsoleReport.fixed(over.pValue(), 4)))
                .note(String.format(Locale.ROOT, "%s GMM, T = %d.", fit.method().id(), fit.observations()))
                .build();
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
        return table.note("p-values from the chi-square distribution with K - P degrees of freedom, a large-sample "
                + "approximation.").build();
    }

    private static String testName(ChiSquareTest test) {
        return switch (test.kind()) {
            case "hansen-j" -> "Hansen J";
            case "pricing-errors-joint" -> "all pricing errors zero";
            default -> test.kind();
        };
    }

    /** One row per moment; with realised and model-implied means when {@code means} is not null. */
    static Table pricingErrors(GmmFit fit, List<double[]> means, String payoff) {
        List<String> header = new ArrayList<>(List.of("moment", "error", "std. error", "t-stat"));
        if (means != null) {
            header.addAll(List.of("realised mean", "model-implied mean"));
        }
        Table.Builder table = Table.builder("pricing-errors", "Pricing errors at the estimate", header);
        for (int i = 0; i < fit.pricingErrors().size(); i++) {
            PricingError e = fit.pricingErrors().get(i);
            // Fixed decimals: the column compares returns of one scale, which exponents would hide.
            List<Cell> row = new ArrayList<>(List.of(Cell.text(e.asset()), Cell.fixed(e.error(), 6),
                    Cell.fixed(e.stdError(), 6), Cell.fixed(e.tStat(), 2)));
            if (means != null) {
                row.add(Cell.fixed(means.get(0)[i], 6));
                row.add(Cell.fixed(means.get(1)[i], 6));
            }
            table.row(row);
        }
        ChiSquareTest joint = fit.pricingErrorsJoint();
        table.note("Error: the sample mean of the moment at the estimate (g_T), in decimals per period.");
        if (means != null) {
            table.note(String.format(Locale.ROOT, "Realised mean: sample mean %s. Model-implied mean: realised "
                    + "minus error / mean SDF, with mean SDF %s.", payoff, ConsoleReport.fixed(means.get(2)[0], 6)));
        }
        return table.note(String.format(Locale.ROOT, "All errors zero: chi-square %s, %d degrees of freedom, "
                + "p-value %s.", ConsoleReport.fixed(joint.statistic(), 3), joint.df(),
                ConsoleReport.fixed(joint.pValue(), 4))).build();
    }

    private static Chart errorChart(GmmFit fit) {
        return new Chart.ErrorBars("pricing-errors", "Pricing errors with 95% bands (±1.96 standard errors)",
                "moment", "pricing error", fit.pricingErrors().stream()
                        .map(e -> new Chart.Estimate(e.asset(), e.error(), e.stdError())).toList());
    }

    /** What the payoffs are, for labels: the linear families price excess returns, power utility gross returns. */
    private static String payoffName(RunSpec spec) {
        return spec.model().family() == RunSpec.Family.POWER_UTILITY ? "gross return" : "excess return";
    }

    private static Chart scatter(List<String> assets, List<double[]> means, String payoff) {
        List<Chart.Point> points = new ArrayList<>();
        for (int i = 0; i < assets.size(); i++) {
            points.add(new Chart.Point(assets.get(i), means.get(1)[i], means.get(0)[i]));
        }
        return new Chart.Scatter("realised-vs-implied", "Realised against model-implied mean " + payoff + "s",
                "model-implied mean " + payoff, "realised mean " + payoff, points);
    }

    /**
     * Realised and model-implied mean payoffs per asset, and the mean discount factor; null where the
     * pair is not defined (moments scaled by instruments: each asset gives several moments, none of
     * which is a mean return).
     *
     * <p>Each moment is g_i = (1/T) Σ_t m_t x_{t,i} - p_i, with x the payoff (excess return, price
     * p = 0, for linear SDFs; gross return, p = 1, for power utility). In expected-return units the
     * pricing error is α_i = g_i / m̄, m̄ = (1/T) Σ_t m_t, and the model-implied mean is
     * x̄_i - α_i = (p_i - Cov_T(m, x_i)) / m̄. The moments give m_t exactly: m_t x_{t,i} = f_{t,i} + p,
     * so m_t = Σ_i (f_{t,i} + p) x_{t,i} / Σ_i x_{t,i}².
     *
     * @return realised x̄, implied x̄ - α, and {m̄} as a one-element array; or null
     */
    static List<double[]> realisedAndImplied(RunSpec spec, PreparedRun prepared, GmmFit fit) {
        MomentModel moments = prepared.moments();
        if (!moments.momentNames().equals(prepared.assets())) {
            return null;
        }
        double price = spec.model().family() == RunSpec.Family.POWER_UTILITY ? 1.0 : 0.0;
        DMatrixRMaj f = moments.contributions(fit.estimates());
        DMatrixRMaj x = moments.payoffs();
        int t = f.numRows;
        int n = f.numCols;
        double meanSdf = 0.0;
        for (int row = 0; row < t; row++) {
            double cross = 0.0;
            double squares = 0.0;
            for (int i = 0; i < n; i++) {
                cross += (f.get(row, i) + price) * x.get(row, i);
                squares += x.get(row, i) * x.get(row, i);
            }
            meanSdf += cross / squares;
        }
        meanSdf /= t;
        DMatrixRMaj means = MomentAlgebra.columnMeans(x);
        double[] realised = new double[n];
        double[] implied = new double[n];
        for (int i = 0; i < n; i++) {
            realised[i] = means.get(i, 0);
            implied[i] = realised[i] - fit.pricingErrors().get(i).error() / meanSdf;
        }
        return List.of(realised, implied, new double[] {meanSdf});
    }
}
