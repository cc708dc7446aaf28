package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.SampleInfo;
import org.orthogon.twopass.Alpha;
import org.orthogon.twopass.CrossSectionEstimate;
import org.orthogon.twopass.GrsTest;
import org.orthogon.twopass.TimeSeriesFit;
import org.orthogon.twopass.TwoPassResult;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The report of {@code two-pass}: console text, the results JSON and the document of the output folder
 * (time-series table with the GRS test, cross-section tables for OLS and GLS, pricing errors, and the
 * chart of mean realised against predicted excess returns).
 */
public final class TwoPassReport {
    private TwoPassReport() {
    }

    private static String sampleLine(SampleInfo sample) {
        return String.format(Locale.ROOT, "%s %s to %s (T = %d)", sample.frequency(), sample.start(), sample.end(),
                sample.observations());
    }

    /** The console summary, ending in a newline. */
    public static String render(RunSpec spec, SampleInfo sample, TwoPassResult result, List<String> notes) {
        TimeSeriesFit ts = result.timeSeries();
        StringBuilder out = new StringBuilder();
        out.append(spec.title()).append('\n');
        out.append(String.format(Locale.ROOT, "  two-pass regressions, %s, N = %d test assets, K = %d factors %s%n",
                sampleLine(sample), ts.assets().size(), ts.factors().size(), ts.factors()));
        out.append("\nTime series: R^e_i = alpha_i + beta_i'f + e_i, one OLS regression per asset\n");
        List<String> header = new ArrayList<>(List.of("asset", "alpha", "std. error", "t-stat", "p-value"));
        ts.factors().forEach(f -> header.add("beta " + f));
        header.add("R2");
        TextTable table = new TextTable(header);
        double[][] betas = ts.betas();
        for (int i = 0; i < ts.alphas().size(); i++) {
            Alpha a = ts.alphas().get(i);
            List<String> row = new ArrayList<>(List.of(a.asset(), ConsoleReport.fixed(a.estimate(), 6),
                    ConsoleReport.fixed(a.stdError(), 6), ConsoleReport.fixed(a.tStat(), 2),
                    ConsoleReport.fixed(a.pValue(), 4)));
            for (double b : betas[i]) {
                row.add(ConsoleReport.fixed(b, 3));
            }
            row.add(ConsoleReport.fixed(ts.r2()[i], 3));
            table.row(row);
        }
        out.append(table.render("  "));
        GrsTest grs = ts.grs();
        out.append(String.format(Locale.ROOT, "  GRS test of all alphas zero: F = %s with (%d, %d) degrees of freedom, "
                + "p-value %s%n", ConsoleReport.fixed(grs.statistic(), 3), grs.df1(), grs.df2(),
                ConsoleReport.fixed(grs.pValue(), 4)));
        for (CrossSectionEstimate cs : List.of(result.ols(), result.gls())) {
            out.append(String.format(Locale.ROOT, "%nCross section (%s, Fama-MacBeth on full-sample betas%s)%n",
                    cs.weighting() == org.orthogon.twopass.Weighting.OLS ? "OLS" : "GLS, W = V_R^-1",
                    cs.intercept() ? ", with intercept" : ", no intercept"));
            TextTable premia = new TextTable(List.of("coefficient", "estimate", "se FM", "se Shanken",
                    "se robust", "t FM", "t Shanken", "t robust"));
            for (CrossSectionEstimate.Coefficient c : cs.coefficients()) {
                premia.row(List.of(c.name(), ConsoleReport.number(c.estimate()),
                        ConsoleReport.number(c.stdErrorFamaMacBeth()), ConsoleReport.number(c.stdErrorShanken()),
                        ConsoleReport.number(c.stdErrorRobust()),
                        ConsoleReport.fixed(c.estimate() / c.stdErrorFamaMacBeth(), 2),
                        ConsoleReport.fixed(c.estimate() / c.stdErrorShanken(), 2),
                        ConsoleReport.fixed(c.estimate() / c.stdErrorRobust(), 2)));
            }
            out.append(premia.render("  "));
            out.append(String.format(Locale.ROOT, "  cross-sectional R2 %s (std. error %s)%n",
                    ConsoleReport.fixed(cs.r2(), 4), ConsoleReport.fixed(cs.r2StdError(), 4)));
        }
        out.append("\n  se FM: Fama-MacBeth (1973); se Shanken: errors-in-betas correction (Shanken 1992); se robust:\n"
                + "  robust to misspecification (Kan, Robotti and Shanken 2013). No serial correlation assumed.\n");
        if (!notes.isEmpty()) {
            out.append('\n');
            notes.forEach(note -> out.append("note: ").append(note).append('\n'));
        }
        out.append('\n').append(Caution.TEXT).append('\n');
        return out.toString();
    }

    /** The results object: {"time_series": {...}, "cross_section": {...}, "cross_section_gls": {...}}. */
    public static ObjectNode json(RunSpec spec, SampleInfo sample, TwoPassResult result) {
        ObjectNode root = JsonResults.newObject();
        root.put("title", spec.title());
        root.put("family", spec.model().family().id());
        root.put("analysis", "two-pass");
        ObjectNode sampleNode = root.putObject("sample");
        sampleNode.put("start", sample.start());
        sampleNode.put("end", sample.end());
        sampleNode.put("observations", sample.observations());
        sampleNode.put("frequency", sample.frequency());
        TimeSeriesFit ts = result.timeSeries();
        ArrayNode factors = root.putArray("factors");
        ts.factors().forEach(factors::add);
        ObjectNode timeSeries = root.putObject("time_series");
        ArrayNode alphas = timeSeries.putArray("alphas");
        double[][] betas = ts.betas();
        double[][] betaErrors = ts.betaStdErrors();
        for (int i = 0; i < ts.alphas().size(); i++) {
            Alpha a = ts.alphas().get(i);
            ObjectNode node = alphas.addObject();
            node.put("asset", a.asset());
            JsonResults.number(node, "estimate", a.estimate());
            JsonResults.number(node, "std_error", a.stdError());
            JsonResults.number(node, "t_stat", a.tStat());
            JsonResults.number(node, "p_value", a.pValue());
        }
        GrsTest grs = ts.grs();
        ObjectNode grsNode = timeSeries.putObject("grs");
        JsonResults.number(grsNode, "statistic", grs.statistic());
        grsNode.put("df1", grs.df1());
        grsNode.put("df2", grs.df2());
        JsonResults.number(grsNode, "p_value", grs.pValue());
        ArrayNode betaArray = timeSeries.putArray("betas");
        for (int i = 0; i < betas.length; i++) {
            ObjectNode node = betaArray.addObject();
            node.put("asset", ts.assets().get(i));
            ArrayNode loadings = node.putArray("loadings");
            for (int k = 0; k < betas[i].length; k++) {
                ObjectNode loading = loadings.addObject();
                loading.put("factor", ts.factors().get(k));
                JsonResults.number(loading, "estimate", betas[i][k]);
                JsonResults.number(loading, "std_error", betaErrors[i][k]);
            }
            JsonResults.number(node, "r2", ts.r2()[i]);
        }
        ArrayNode means = timeSeries.putArray("factor_means");
        for (int k = 0; k < ts.factors().size(); k++) {
            ObjectNode node = means.addObject();
            node.put("factor", ts.factors().get(k));
            JsonResults.number(node, "mean", ts.factorMeans()[k]);
        }
        crossSection(root.putObject("cross_section"), result.ols());
        crossSection(root.putObject("cross_section_gls"), result.gls());
        root.put("caution", Caution.TEXT);
        return root;
    }

    private static void crossSection(ObjectNode node, CrossSectionEstimate cs) {
        node.put("weighting", cs.weighting().id());
        if (cs.intercept()) {
            coefficient(node.putObject("intercept"), cs.coefficients().get(0));
        } else {
            node.putNull("intercept");
        }
        ArrayNode premia = node.putArray("risk_premia");
        for (CrossSectionEstimate.Coefficient c : cs.riskPremia()) {
            ObjectNode premium = premia.addObject();
            premium.put("factor", c.name());
            coefficient(premium, c);
        }
        ObjectNode r2 = node.putObject("r2");
        JsonResults.number(r2, "estimate", cs.r2());
        JsonResults.number(r2, "std_error", cs.r2StdError());
        ArrayNode errors = node.putArray("pricing_errors");
        double[] realised = cs.realised();
        double[] predicted = cs.predicted();
        for (int i = 0; i < realised.length; i++) {
            ObjectNode error = errors.addObject();
            error.put("asset", cs.assets().get(i));
            JsonResults.number(error, "realised", realised[i]);
            JsonResults.number(error, "predicted", predicted[i]);
            JsonResults.number(error, "error", realised[i] - predicted[i]);
        }
    }

    private static void coefficient(ObjectNode node, CrossSectionEstimate.Coefficient c) {
        JsonResults.number(node, "estimate", c.estimate());
        JsonResults.number(node, "std_error_fama_macbeth", c.stdErrorFamaMacBeth());
        JsonResults.number(node, "std_error_shanken", c.stdErrorShanken());
        JsonResults.number(node, "std_error_misspecification_robust", c.stdErrorRobust());
    }

    /** The document of the output folder. */
    public static Report build(RunSpec spec, SampleInfo sample, TwoPassResult result, List<String> notes) {
        TimeSeriesFit ts = result.timeSeries();
        Report.Builder report = Report.builder(spec.title())
                .key(spec.modelFile().getFileName().toString().replaceFirst("\\.toml$", "") + "-two-pass")
                .subtitle("Two-pass regressions; " + sampleLine(sample))
                .subtitle(String.format(Locale.ROOT, "N = %d test assets, K = %d factors: %s", ts.assets().size(),
                        ts.factors().size(), String.join(", ", ts.factors())));
        report.section("Time-series regressions").table(timeSeriesTable(ts));
        report.section("Cross-sectional regressions");
        report.table(crossSectionTable("cross-section-ols", result.ols()));
        report.table(crossSectionTable("cross-section-gls", result.gls()));
        report.section("Pricing errors").table(pricingErrorTable(result));
        report.chart(scatter("realised-vs-predicted", "Mean realised against predicted excess returns (OLS)",
                result.ols()));
        report.chart(scatter("realised-vs-predicted-gls", "Mean realised against predicted excess returns (GLS)",
                result.gls()));
        if (!notes.isEmpty()) {
            report.section("Data preparation");
            notes.forEach(report::paragraph);
        }
        return report.build();
    }

    static Table timeSeriesTable(TimeSeriesFit ts) {
        List<String> header = new ArrayList<>(List.of("asset", "alpha", "std. error", "t-stat", "p-value"));
        ts.factors().forEach(f -> header.add("beta " + f));
        header.add("R2");
        Table.Builder table = Table.builder("time-series", "Time-series regressions of excess returns on the factors",
                header).errorUnder("alpha", "std. error");
        double[][] betas = ts.betas();
        for (int i = 0; i < ts.alphas().size(); i++) {
            Alpha a = ts.alphas().get(i);
            // Fixed decimals: alphas of one scale side by side, which exponents would hide.
            List<Cell> row = new ArrayList<>(List.of(Cell.text(a.asset()), Cell.fixed(a.estimate(), 6),
                    Cell.fixed(a.stdError(), 6), Cell.fixed(a.tStat(), 2), Cell.fixed(a.pValue(), 4)));
            for (double b : betas[i]) {
                row.add(Cell.fixed(b, 3));
            }
            row.add(Cell.fixed(ts.r2()[i], 3));
            table.row(row);
        }
        GrsTest grs = ts.grs();
        return table.note("Alphas in decimals per period; OLS standard errors in parentheses; p-values from the t "
                + "distribution with T - K - 1 degrees of freedom.")
                .note(String.format(Locale.ROOT, "GRS test that all alphas are zero (Gibbons, Ross and Shanken 1989): "
                        + "F = %s, (%d, %d) degrees of freedom, p-value %s.", ConsoleReport.fixed(grs.statistic(), 3),
                        grs.df1(), grs.df2(), ConsoleReport.fixed(grs.pValue(), 4)))
                .build();
    }

    static Table crossSectionTable(String id, CrossSectionEstimate cs) {
        boolean ols = cs.weighting() == org.orthogon.twopass.Weighting.OLS;
        Table.Builder table = Table.builder(id, "Risk premia by " + (ols ? "OLS" : "GLS")
                + " cross-sectional regression on full-sample betas", "coefficient", "estimate", "se Fama-MacBeth",
                "se Shanken", "se robust", "t robust");
        for (CrossSectionEstimate.Coefficient c : cs.coefficients()) {
            table.row(Cell.text(c.name()), Cell.number(c.estimate()), Cell.number(c.stdErrorFamaMacBeth()),
                    Cell.number(c.stdErrorShanken()), Cell.number(c.stdErrorRobust()),
                    Cell.fixed(c.estimate() / c.stdErrorRobust(), 2));
        }
        return table.note(String.format(Locale.ROOT, "Cross-sectional R2 %s (standard error %s, Kan, Robotti and "
                + "Shanken 2013).", ConsoleReport.fixed(cs.r2(), 4), ConsoleReport.fixed(cs.r2StdError(), 4)))
                .note("Standard errors: Fama and MacBeth (1973); Shanken (1992), correcting for estimated betas; "
                        + "robust to misspecification, Kan, Robotti and Shanken (2013). No serial correlation assumed.")
                .note(ols ? "Weight: identity." : "Weight: the inverse covariance matrix of the returns, which gives "
                        + "the same estimates as the inverse residual covariance.")
                .build();
    }

    static Table pricingErrorTable(TwoPassResult result) {
        Table.Builder table = Table.builder("two-pass-pricing-errors", "Mean excess returns: realised and predicted",
                "asset", "realised mean", "predicted (OLS)", "error (OLS)", "predicted (GLS)", "error (GLS)");
        double[] realised = result.ols().realised();
        double[] ols = result.ols().predicted();
        double[] gls = result.gls().predicted();
        for (int i = 0; i < realised.length; i++) {
            table.row(Cell.text(result.ols().assets().get(i)), Cell.fixed(realised[i], 6), Cell.fixed(ols[i], 6),
                    Cell.fixed(realised[i] - ols[i], 6), Cell.fixed(gls[i], 6), Cell.fixed(realised[i] - gls[i], 6));
        }
        return table.note("Predicted: the intercept (if any) plus the betas times the estimated risk premia; decimals "
                + "per period.").build();
    }

    private static Chart scatter(String id, String title, CrossSectionEstimate cs) {
        List<Chart.Point> points = new ArrayList<>();
        double[] realised = cs.realised();
        double[] predicted = cs.predicted();
        for (int i = 0; i < realised.length; i++) {
            points.add(new Chart.Point(cs.assets().get(i), predicted[i], realised[i]));
        }
        return new Chart.Scatter(id, title, "predicted mean excess return", "realised mean excess return", points);
    }
}
