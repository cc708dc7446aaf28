package org.orthogon.cli;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.Iterator;
import java.util.List;
import java.util.stream.Collectors;
import org.orthogon.data.InputException;
import org.orthogon.data.Suggestions;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.RunSpec;
import picocli.CommandLine.Option;

/**
 * Command-line options that replace the model file's [estimation] choices (docs/model-file.md). The
 * rules that pair a kernel with a bandwidth are the model file's ({@link RunSpec#withCommandLine}).
 */
final class EstimationOverrides {
    @Option(names = "--method", paramLabel = "METHOD", completionCandidates = MethodIds.class,
            description = "${COMPLETION-CANDIDATES}")
    String method;

    @Option(names = "--kernel", paramLabel = "KERNEL", completionCandidates = KernelIds.class,
            description = "${COMPLETION-CANDIDATES}; each kernel's bandwidth choices are in docs/model-file.md")
    String kernel;

    @Option(names = "--lags", paramLabel = "L",
            description = "a lag count L: weights on lags 1..L (b = L + 1 for bartlett, parzen, tukey-hanning; "
                    + "b = L for truncated); not for kernels that weight every lag. Over the heteroskedasticity-"
                    + "consistent S a model file gets by default (no kernel written), it means bartlett")
    Integer lags;

    @Option(names = "--bandwidth", paramLabel = "B", description = "a bandwidth b, \"andrews\" or \"newey-west\"")
    String bandwidth;

    @Option(names = "--prewhiten", negatable = true, description = "VAR(1) prewhitening of the moments")
    Boolean prewhiten;

    @Option(names = "--centered", negatable = true,
            description = "demean the moments before estimating S (--no-centered: use f_t as it is)")
    Boolean centered;

    @Option(names = "--restrict", paramLabel = "RESTRICTIONS",
            description = "linear restrictions to test by a Wald statistic, e.g. \"b_SIZE = 0, b_TIDE = 0\" (repeatable)")
    List<String> restrict;

    /** The kernel ids, in declaration order, for the help text. */
    static final class KernelIds implements Iterable<String> {
        @Override
        public Iterator<String> iterator() {
            return Arrays.stream(Kernel.values()).map(Kernel::id).iterator();
        }
    }

    /** The estimation method ids, for the help text. */
    static final class MethodIds implements Iterable<String> {
        @Override
        public Iterator<String> iterator() {
            return Arrays.stream(EstimationMethod.values()).map(EstimationMethod::id).iterator();
        }
    }

    /** The spec with these options in force. */
    RunSpec apply(RunSpec spec) {
        EstimationMethod newMethod = method == null ? null : parseMethod(method);
        Kernel newKernel = kernel == null ? null : parseKernel(kernel);
        if (newKernel == null && (lags != null || bandwidth != null) && spec.estimation().kernel() == Kernel.NONE
                && !spec.writes("estimation", "kernel")) {
            // Lags over the S without lags that the Euler families get by default: they mean Bartlett.
            newKernel = Kernel.BARTLETT;
        }
        if (lags != null && bandwidth != null) {
            throw InputException.general().problem("--lags and --bandwidth were both given",
                    "give one of them: --lags L or --bandwidth B");
        }
        BandwidthRule rule = null;
        String written = null;
        if (lags != null) {
            if (lags < 0) {
                throw InputException.general().problem("--lags " + lags + " is negative", "give a lag count >= 0");
            }
            rule = new BandwidthRule.Lags(lags);
            written = "--lags " + lags;
        } else if (bandwidth != null) {
            rule = ModelFile.parseBandwidth(bandwidth, msg -> InputException.general().problem("--bandwidth: " + msg,
                    "give a positive number, andrews or newey-west"));
            written = "--bandwidth " + bandwidth;
        }
        return spec.withCommandLine(newMethod, newKernel, rule, written, prewhiten, centered,
                restrict == null ? null : new ArrayList<>(restrict));
    }

    private static EstimationMethod parseMethod(String text) {
        try {
            return EstimationMethod.fromId(text);
        } catch (IllegalArgumentException e) {
            List<String> ids = Arrays.stream(EstimationMethod.values()).map(EstimationMethod::id).toList();
            throw InputException.general().problem("--method " + text + " is not a known estimation method",
                    "use one of " + String.join(", ", ids) + Suggestions.didYouMean(text, ids));
        }
    }

    private static Kernel parseKernel(String text) {
        try {
            return Kernel.fromId(text);
        } catch (IllegalArgumentException e) {
            List<String> ids = Arrays.stream(Kernel.values()).map(Kernel::id).collect(Collectors.toList());
            throw InputException.general().problem("--kernel " + text + " is not a known kernel",
                    "use one of " + Kernel.ids() + Suggestions.didYouMean(text, ids));
        }
    }
}
