package org.orthogon.report;

import org.orthogon.gmm.ManyMoments;

import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.spec.InputSummary;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;

/** What `check` prints: the sample, the sizes T, N, K, P, the inputs and every warning, without estimating. */
public final class CheckReport {
    private CheckReport() {
    }

    /**
     * The warnings a check can give before any estimation, among them the many-moments rule of
     * {@link ManyMoments} with the model file's long-run choices.
     */
    public static List<String> warnings(RunSpec spec, PreparedRun prepared) {
        List<String> warnings = new ArrayList<>();
        int k = prepared.moments().momentCount();
        int t = prepared.sample().observations();
        ManyMoments.warning(k, t, spec.estimation().longRunOptions()).ifPresent(warnings::add);
        if (k == prepared.moments().parameterCount()) {
            warnings.add("the model is exactly identified (K = P): there will be no overidentifying restrictions to test");
        }
        return warnings;
    }

    public static String render(RunSpec spec, PreparedRun prepared) {
        var e = spec.estimation();
        int k = prepared.moments().momentCount();
        int p = prepared.moments().parameterCount();
        StringBuilder out = new StringBuilder();
        out.append("Checked ").append(display(spec.modelFile())).append(": the model file and its data are usable\n");
        out.append("  title       ").append(spec.title()).append('\n');
        out.append("  family      ").append(spec.model().family().id()).append(", parameters ")
                .append(String.join(", ", prepared.moments().parameterNames())).append('\n');
        out.append(String.format(Locale.ROOT, "  sample      %s to %s, T = %d %s observations%n", prepared.sample().start(),
                prepared.sample().end(), prepared.sample().observations(), prepared.sample().frequency()));
        out.append(String.format(Locale.ROOT, "  sizes       N = %d test assets, K = %d moments, P = %d parameters, "
                + "K - P = %d overidentifying restrictions%n", prepared.assets().size(), k, p, k - p));
        out.append("  returns     ").append(spec.data().returnsKind()).append(", units ").append(spec.data().units())
                .append(" (every return-like series passed the unit and kind checks)\n");
        out.append("  estimation  ").append(e.method().id()).append(", kernel ").append(e.kernel().id()).append(", ")
                .append(e.bandwidthLabel()).append(e.centered() ? ", centered" : ", uncentered")
                .append(e.prewhiten() ? ", prewhitened" : "").append("\n\n");
        TextTable inputs = new TextTable(List.of("role", "file", "frequency", "first", "last", "rows", "columns",
                "missing"));
        for (InputSummary input : prepared.inputs()) {
            inputs.row(List.of(input.role(), display(input.file()), input.frequency(), input.first(), input.last(),
                    Integer.toString(input.rows()), Integer.toString(input.columns().size()), "0"));
        }
        out.append("Inputs (missing cells are refused, so every count is 0)\n").append(inputs.render("  "));
        for (String note : prepared.notes()) {
            out.append("note: ").append(note).append('\n');
        }
        for (String warning : warnings(spec, prepared)) {
            out.append("WARNING: ").append(warning).append('\n');
        }
        return out.toString();
    }

    /** A path relative to the working folder when it lies below it, for shorter messages. */
    public static String display(Path path) {
        Path here = Paths.get("").toAbsolutePath();
        Path absolute = path.toAbsolutePath().normalize();
        return absolute.startsWith(here) ? here.relativize(absolute).toString() : absolute.toString();
    }
}
