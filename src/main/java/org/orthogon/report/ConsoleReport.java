package org.orthogon.report;

import java.util.List;
import java.util.Locale;
import org.orthogon.gmm.ChiSquareTest;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterEstimate;
import org.orthogon.gmm.PricingError;
import org.orthogon.longrun.Kernel;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.SampleInfo;

/** The console summary of one fit: a parameter table, the overidentification test and the pricing errors. */
public final class ConsoleReport {
    private ConsoleReport() {
    }

    /** Renders the summary as text, ending in a newline. */
    public static String render(RunSpec spec, SampleInfo sample, GmmFit fit, List<String> dataNotes) {
        StringBuilder out = new StringBuilder();
        out.append(spec.title()).append('\n');
        out.append(String.format(Locale.ROOT, "  %s SDF, %s GMM, %s %s to %s (T = %d), %d moments, %d parameters%n",
                spec.model().family().id(), fit.method().id(), sample.frequency(), sample.start(), sample.end(),
                sample.observations(), fit.momentCount(), fit.parameters().size()));
        out.append("  long-run covariance: ").append(describeLongRun(fit)).append("\n\n");

        out.append("Parameters\n");
        TextTable parameters = new TextTable(List.of("parameter", "estimate", "std. error", "t-stat", "p-value"));
        for (ParameterEstimate p : fit.parameters()) {
            parameters.row(List.of(p.name(), number(p.estimate()), number(p.stdError()), fixed(p.tStat(), 2),
                    fixed(p.pValue(), 4)));
        }
        out.append(parameters.render("  ")).append('\n');

        ChiSquareTest over = fit.overidentification();
        out.append(over.kind().equals("hansen-j") ? "Overidentifying restrictions: Hansen J test\n"
                : "Overidentifying restrictions: joint test of the pricing errors (one-step weight)\n");
        out.append(String.format(Locale.ROOT, "  statistic %s, %d degrees of freedom, p-value %s%n%n",
                fixed(over.statistic(), 3), over.df(), fixed(over.pValue(), 4)));

        out.append("Pricing errors (sample mean of each moment at the estimate)\n");
        TextTable errors = new TextTable(List.of("moment", "error", "std. error", "t-stat"));
        for (PricingError e : fit.pricingErrors()) {
            errors.row(List.of(e.asset(), number(e.error()), number(e.stdError()), fixed(e.tStat(), 2)));
        }
        out.append(errors.render("  "));
        ChiSquareTest joint = fit.pricingErrorsJoint();
        out.append(String.format(Locale.ROOT, "  all errors zero: chi-square %s, %d degrees of freedom, p-value %s%n",
                fixed(joint.statistic(), 3), joint.df(), fixed(joint.pValue(), 4)));

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

    static String describeLongRun(GmmFit fit) {
        var lr = fit.longRun();
        String centering = lr.centered() ? "centered" : "uncentered";
        if (lr.kernel() == Kernel.NONE) {
            return "heteroskedasticity-consistent (no kernel), " + centering;
        }
        return String.format(Locale.ROOT, "%s kernel, bandwidth %s, %s%s", lr.kernel().id(), fixed(lr.bandwidth(), 2),
                centering, lr.prewhitened() ? ", VAR(1) prewhitened" : "");
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
