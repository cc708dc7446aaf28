package org.orthogon.report;

import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.spec.InputSummary;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.StabilitySpec;
import org.orthogon.spec.Warning;

/** What `check` prints: the sample, the sizes T, N, K, P, the inputs and every warning, without estimating. */
public final class CheckReport {
    private CheckReport() {
    }

    /**
     * The check's report; {@code stability} is the planned [stability] run, or null when the model file
     * has no [stability] section.
     */
    public static String render(RunSpec spec, PreparedRun prepared, StabilitySpec.Plan stability) {
        var e = spec.estimation();
        int k = prepared.moments().momentCount();
        int p = prepared.moments().parameterCount();
        StringBuilder out = new StringBuilder();
        out.append("Checked ").append(display(spec.modelFile())).append(": the model file and its data are usable\n");
        out.append("  title       ").append(spec.title()).append('\n');
        List<String> names = prepared.moments().parameterNames();
        String parameters = String.join(", ", names);
        if (spec.model() instanceof org.orthogon.spec.BetaPricingSpec beta) {
            int q = beta.crossSectionCoefficients();
            parameters = String.join(", ", names.subList(0, q)) + ", and a and the betas of the "
                    + prepared.assets().size() + " assets (" + (names.size() - q) + " time-series parameters)";
        }
        out.append("  family      ").append(spec.model().family().id()).append(", parameters ").append(parameters)
                .append('\n');
        out.append(String.format(Locale.ROOT, "  sample      %s to %s, T = %d %s observations%n", prepared.sample().start(),
                prepared.sample().end(), prepared.sample().observations(), prepared.sample().frequency()));
        out.append(String.format(Locale.ROOT, "  sizes       N = %s, K = %s, P = %s, K - P = %s%n",
                ConsoleReport.count(prepared.assets().size(), "test asset"), ConsoleReport.count(k, "moment"),
                ConsoleReport.count(p, "parameter"), ConsoleReport.count(k - p, "overidentifying restriction")));
        out.append("  returns     ").append(spec.data().returnsKind().id()).append(", units ")
                .append(spec.data().units().id()).append(" (every return-like series passed the unit and kind checks)\n");
        out.append("  estimation  ").append(e.method().id()).append(", kernel ").append(e.kernel().id()).append(", ")
                .append(e.bandwidthLabel()).append(e.centered() ? ", centered" : ", uncentered")
                .append(e.prewhiten() ? ", prewhitened" : "").append("\n");
        if (stability != null) {
            StabilitySpec s = spec.stability();
            out.append(String.format(Locale.ROOT, "  stability   %d split%s, %d candidate break dates (trimming %s)%s%n",
                    stability.splitIndices().size(), stability.splitIndices().size() == 1 ? "" : "s",
                    stability.candidateCount(), s.trimming(), s.window().map(w -> String.format(Locale.ROOT,
                            ", %d %s windows of %d observations", stability.windowCount(),
                            s.expanding() ? "expanding" : "rolling", w)).orElse("")));
        }
        out.append('\n');
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
        List<Warning> warnings = new ArrayList<>(prepared.warnings());
        if (stability != null) {
            warnings.addAll(stability.warnings());
        }
        for (Warning warning : warnings) {
            out.append("WARNING ").append(warning).append('\n');
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
