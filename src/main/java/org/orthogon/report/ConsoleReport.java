package org.orthogon.report;

import java.util.List;
import java.util.Locale;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.ConfidenceInterval;
import org.orthogon.gmm.GmmDiagnostics;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.gmm.PricingError;
import org.orthogon.longrun.Kernel;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.SampleInfo;

/** The console summary of one fit: a parameter table, the overidentification test and the pricing errors. */
public final class ConsoleReport {
    private ConsoleReport() {
    }

    /** Renders the summary as text, ending in a newline. */
    public static String render(RunSpec spec, SampleInfo sample, GmmFit fit, List<String> dataNotes) {
        return render(spec, sample, fit, dataNotes, List.of());
    }

    /** As {@link #render(RunSpec, SampleInfo, GmmFit, List)}, with the Wald tests of the restrictions. */
    public static String render(RunSpec spec, SampleInfo sample, GmmFit fit, List<String> dataNotes,
            List<FittedRun.RestrictionTest> restrictions) {
        return render(spec, sample, fit, dataNotes, restrictions, null);
    }

    /**
     * As above, with Windmeijer's (2005) corrected standard errors in a column beside the usual ones when
     * {@code windmeijer} is not null.
     */
    public static String render(RunSpec spec, SampleInfo sample, GmmFit fit, List<String> dataNotes,
            List<FittedRun.RestrictionTest> restrictions, double[] windmeijer) {
        StringBuilder out = new StringBuilder();
        out.append(spec.title()).append('\n');
        out.append(String.format(Locale.ROOT, "  %s SDF, %s GMM, %s %s to %s (T = %d), %s, %s%n",
                spec.model().family().id(), fit.method().id(), sample.frequency(), sample.start(), sample.end(),
                sample.observations(), count(fit.momentCount(), "moment"), count(fit.parameters().size(), "parameter")));
        out.append("  long-run covariance: ").append(describeLongRun(fit)).append("\n\n");

        out.append("Parameters\n");
        String level = String.format(Locale.ROOT, "%.0f%%", 100 * fit.confidenceLevel());
        List<String> header = new java.util.ArrayList<>(List.of("parameter", "estimate", "std. error", "t-stat",
                "p-value", level + " low", level + " high"));
        if (windmeijer != null) {
            header.add(3, "Windmeijer s.e.");
        }
        TextTable parameters = new TextTable(header);
        List<ConfidenceInterval> intervals = fit.confidenceIntervals();
        for (int i = 0; i < fit.parameters().size(); i++) {
            ParameterEstimate p = fit.parameters().get(i);
            List<String> row = new java.util.ArrayList<>(List.of(p.name(), number(p.estimate()), number(p.stdError()),
                    fixed(p.tStat(), 2), fixed(p.pValue(), 4), number(intervals.get(i).lower()),
                    number(intervals.get(i).upper())));
            if (windmeijer != null) {
                row.add(3, number(windmeijer[i]));
            }
            parameters.row(row);
        }
        out.append(parameters.render("  "));
        if (windmeijer != null) {
            out.append("  Windmeijer s.e.: corrected for the estimated weight of two-step GMM (Windmeijer 2005); "
                    + "t-stat, p-value and interval use the usual s.e.\n");
        }
        out.append('\n');

        ChiSquareTest over = fit.overidentification();
        out.append(over.kind().equals("hansen-j") ? "Overidentifying restrictions: Hansen J test\n"
                : "Overidentifying restrictions: joint test of the pricing errors (one-step weight)\n");
        out.append(String.format(Locale.ROOT, "  statistic %s, %d degrees of freedom, p-value %s%n",
                fixed(over.statistic(), 3), over.df(), fixed(over.pValue(), 4)));
        fit.hj().ifPresent(hj -> out.append(String.format(Locale.ROOT, "Hansen-Jagannathan distance %s, p-value %s "
                + "(%s)%n", number(hj.value()), fixed(hj.pValue(), 4), hj.pValueSource())));
        out.append('\n');

        out.append("Pricing errors (sample mean of each moment at the estimate)\n");
        TextTable errors = new TextTable(List.of("moment", "error", "std. error", "t-stat"));
        for (PricingError e : fit.pricingErrors()) {
            errors.row(List.of(e.asset(), number(e.error()), number(e.stdError()), fixed(e.tStat(), 2)));
        }
        out.append(errors.render("  "));
        ChiSquareTest joint = fit.pricingErrorsJoint();
        out.append(String.format(Locale.ROOT, "  all errors zero: chi-square %s, %d degrees of freedom, p-value %s%n",
                fixed(joint.statistic(), 3), joint.df(), fixed(joint.pValue(), 4)));

        out.append(renderRestrictions(restrictions));
        GmmDiagnostics d = fit.diagnostics();
        out.append(String.format(Locale.ROOT, "%ndiagnostics: condition number of S %s, of D'WD %s; smallest singular "
                + "value of the scaled D %s; %d solver iterations, %d weight updates, %s%n", number(d.conditionS()),
                number(d.conditionDWD()), fixed(d.smallestSingularValue(), 3), d.solverIterations(), d.weightUpdates(),
                d.clean() ? "converged" : "NOT CLEAN"));
        if (!fit.warnings().isEmpty() || !dataNotes.isEmpty()) {
            out.append('\n');
            for (String note : dataNotes) {
                out.append("note: ").append(note).append('\n');
            }
            for (String warning : fit.warnings()) {
                out.append("WARNING: ").append(warning).append('\n');
            }
        }
        out.append('\n').append(Caution.TEXT).append('\n');
        return out.toString();
    }

    /**
     * The summary of a fit of prepared moments: the data-preparation notes and the warnings found while
     * preparing (many moments, exact identification) come with it.
     */
    public static String render(RunSpec spec, PreparedRun prepared, GmmFit fit,
            List<FittedRun.RestrictionTest> restrictions) {
        return render(spec, prepared, fit, restrictions, null);
    }

    /** As above, with Windmeijer's corrected standard errors in a column when {@code windmeijer} is not null. */
    public static String render(RunSpec spec, PreparedRun prepared, GmmFit fit,
            List<FittedRun.RestrictionTest> restrictions, double[] windmeijer) {
        String text = render(spec, prepared.sample(), fit, prepared.notes(), restrictions, windmeijer);
        if (prepared.warnings().isEmpty()) {
            return text;
        }
        StringBuilder warnings = new StringBuilder();
        prepared.warnings().forEach(w -> warnings.append("WARNING ").append(w).append('\n'));
        int caution = text.lastIndexOf(Caution.TEXT);
        return text.substring(0, caution) + warnings + "\n" + text.substring(caution);
    }

    /** The risk premia of the demeaned linear SDF, λ = Σ_F b, ending in a newline. */
    public static String renderRiskPremia(FittedRun.RiskPremiumEstimates premia) {
        TextTable table = new TextTable(List.of("factor", "risk premium", "std. error", "t-stat"));
        for (int k = 0; k < premia.factors().size(); k++) {
            table.row(List.of(premia.factors().get(k), number(premia.estimates()[k]), number(premia.stdErrors()[k]),
                    fixed(premia.estimates()[k] / premia.stdErrors()[k], 2)));
        }
        return "\nRisk premia lambda = Cov(F, F') b (delta method, covariance of the factors estimated jointly)\n"
                + table.render("  ");
    }

    /** The Wald tests of the model file's (and the command line's) linear restrictions. */
    static String renderRestrictions(List<FittedRun.RestrictionTest> tests) {
        if (tests.isEmpty()) {
            return "";
        }
        TextTable table = new TextTable(List.of("restrictions", "Wald statistic", "df", "p-value"));
        for (FittedRun.RestrictionTest test : tests) {
            table.row(List.of(test.restrictions(), fixed(test.test().statistic(), 3), Integer.toString(test.test().df()),
                    fixed(test.test().pValue(), 4)));
        }
        return "\nLinear restrictions (Wald tests with the reported covariance)\n" + table.render("  ");
    }

    static String describeLongRun(GmmFit fit) {
        var lr = fit.longRun();
        String centering = lr.centered() ? "centered" : "uncentered";
        if (lr.kernel() == Kernel.NONE) {
            return "heteroskedasticity-consistent (no kernel), " + centering;
        }
        return String.format(Locale.ROOT, "%s kernel, bandwidth %s, %s%s", lr.kernel().id(), fixed(lr.bandwidth(), 2),
                centering, lr.prewhitened() ? ", VAR(1) prewhitened" : "");
    }

    /** "1 parameter", "2 parameters": a count with its noun in the right number. */
    static String count(long n, String noun) {
        return n + " " + noun + (n == 1 ? "" : "s");
    }

    /** Six significant digits, plain notation where it stays readable. */
    static String number(double value) {
        if (!Double.isFinite(value)) {
            return "n/a";
        }
        double magnitude = Math.abs(value);
        if (magnitude != 0 && (magnitude < 1e-4 || magnitude >= 1e6)) {
            return String.format(Locale.ROOT, "%.5e", value);
        }
        return String.format(Locale.ROOT, "%.6f", value);
    }

    static String fixed(double value, int decimals) {
        if (!Double.isFinite(value)) {
            return "n/a";
        }
        return String.format(Locale.ROOT, "%." + decimals + "f", value);
    }
}
