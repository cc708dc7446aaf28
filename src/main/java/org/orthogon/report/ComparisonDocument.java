package org.orthogon.report;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.orthogon.analysis.CrossSectionFit;
import org.orthogon.analysis.ModelComparison;
import org.orthogon.analysis.ModelComparison.ModelSummary;
import org.orthogon.analysis.ModelComparison.NestedTest;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.ParameterEstimate;

/** The report document of `compare`: parameters side by side, tests, cross-sectional fit, nested tests, charts. */
public final class ComparisonDocument {
    private ComparisonDocument() {
    }

    public static Report build(ModelComparison.Result result, String sampleLine) {
        return build(result, sampleLine, null, "compare");
    }

    /**
     * The comparison's document, with the comparison at the common weight when {@code common} is given;
     * {@code key} labels its LaTeX tables (the output folder's name).
     */
    public static Report build(ModelComparison.Result result, String sampleLine, CommonWeightReport common,
            String key) {
        List<ModelSummary> models = result.models();
        Report.Builder report = Report.builder("Model comparison").key(key)
                .subtitle("The same test assets, " + sampleLine);
        for (int m = 0; m < models.size(); m++) {
            ModelSummary summary = models.get(m);
            report.subtitle(String.format(Locale.ROOT, "(%d) %s: %s GMM", m + 1, summary.title(),
                    summary.fit().method().id()));
        }
        report.section("Parameters").table(parameters(models));
        report.section("Tests and cross-sectional fit").table(tests(models));
        if (!result.nestedTests().isEmpty()) {
            report.table(nested(result.nestedTests(), models));
        }
        report.section("Realised against model-implied means");
        for (int m = 0; m < models.size(); m++) {
            CrossSectionFit fit = models.get(m).crossSection();
            List<Chart.Point> points = new ArrayList<>();
            for (int i = 0; i < fit.assets().size(); i++) {
                points.add(new Chart.Point(fit.assets().get(i), fit.implied()[i], fit.realised()[i]));
            }
            report.chart(new Chart.Scatter("realised-vs-implied-" + (m + 1), "(" + (m + 1) + ") "
                    + models.get(m).title(), "model-implied mean", "realised mean", points));
        }
        if (common != null) {
            common.addTo(report);
        }
        List<String> warnings = new ArrayList<>();
        for (int m = 0; m < models.size(); m++) {
            for (String warning : models.get(m).fit().warnings()) {
                warnings.add("(" + (m + 1) + ") " + warning);
            }
        }
        return report.warnings(warnings).build();
    }

    /** One estimate and one standard-error column per model; blank where a model lacks the parameter. */
    static Table parameters(List<ModelSummary> models) {
        List<String> header = new ArrayList<>(List.of("parameter"));
        for (int m = 0; m < models.size(); m++) {
            header.add("(" + (m + 1) + ")");
            header.add("se (" + (m + 1) + ")");
        }
        Table.Builder table = Table.builder("comparison-parameters", "Parameter estimates by model", header);
        for (int m = 0; m < models.size(); m++) {
            table.errorUnder("(" + (m + 1) + ")", "se (" + (m + 1) + ")");
        }
        Set<String> names = new LinkedHashSet<>();
        models.forEach(summary -> summary.fit().parameters().forEach(p -> names.add(p.name())));
        for (String name : names) {
            List<Cell> row = new ArrayList<>(List.of(Cell.parameter(name)));
            for (ModelSummary summary : models) {
                ParameterEstimate p = summary.fit().parameters().stream().filter(e -> e.name().equals(name))
                        .findFirst().orElse(null);
                row.add(p == null ? Cell.text("") : Cell.number(p.estimate()));
                row.add(p == null ? Cell.text("") : Cell.number(p.stdError()));
            }
            table.row(row);
        }
        return table.note("Standard errors in parentheses.").note(legend(models)).build();
    }

    /** "(1) title; (2) title.": the short labels the columns and rows use, so each table stands alone. */
    static String legend(List<ModelSummary> models) {
        StringBuilder legend = new StringBuilder("Models: ");
        for (int m = 0; m < models.size(); m++) {
            legend.append(m == 0 ? "" : "; ").append("(").append(m + 1).append(") ").append(models.get(m).title());
        }
        return legend.append('.').toString();
    }

    /** The short label "(n)" of the model with this title, or the title when no model has it. */
    private static String label(List<ModelSummary> models, String title) {
        for (int m = 0; m < models.size(); m++) {
            if (models.get(m).title().equals(title)) {
                return "(" + (m + 1) + ")";
            }
        }
        return title;
    }

    static Table tests(List<ModelSummary> models) {
        Table.Builder table = Table.builder("comparison-tests", "Overidentification and cross-sectional fit",
                "model", "test", "statistic", "df", "p-value", "HJ distance", "HJ p-value", "cross-sectional R²",
                "mean |α|", "RMS α");
        for (int m = 0; m < models.size(); m++) {
            ModelSummary summary = models.get(m);
            ChiSquareTest test = summary.fit().overidentification();
            CrossSectionFit cross = summary.crossSection();
            table.row(Cell.text("(" + (m + 1) + ")"), Cell.text(test.kind()), Cell.fixed(test.statistic(), 3),
                    Cell.count(test.df()), Cell.fixed(test.pValue(), 4),
                    summary.fit().hj().map(h -> Cell.number(h.value())).orElse(Cell.text("n/a")),
                    summary.fit().hj().map(h -> Cell.fixed(h.pValue(), 4)).orElse(Cell.text("n/a")),
                    Cell.fixed(cross.r2(), 4),
                    Cell.number(cross.meanAbsolute()), Cell.number(cross.rootMeanSquare()));
        }
        return table.note("HJ distance: min over the parameters of sqrt(g' G^{-1} g), G the second moments of the "
                + "payoffs (Hansen and Jagannathan 1997); p-value from its simulated weighted chi-square limit.")
                .note("α: the pricing error in expected-return units, (E_T[m x] - price) / E_T[m]; R² = 1 - "
                + "Var(α) / Var(realised mean) across the test assets.").note(legend(models)).build();
    }

    static Table nested(List<NestedTest> tests, List<ModelSummary> models) {
        Table.Builder table = Table.builder("nested-tests", "Nested models: difference of J statistics",
                "restricted", "unrestricted", "statistic", "df", "p-value");
        for (NestedTest test : tests) {
            table.row(Cell.text(label(models, test.restricted())), Cell.text(label(models, test.unrestricted())),
                    Cell.fixed(test.test().statistic(), 3), Cell.count(test.test().df()),
                    Cell.fixed(test.test().pValue(), 4));
        }
        return table.note("Both models estimated with the unrestricted model's efficient weight (Newey and West 1987); "
                + "chi-square with the number of restrictions as degrees of freedom.").note(legend(models)).build();
    }
}
