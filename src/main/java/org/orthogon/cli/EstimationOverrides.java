package org.orthogon.cli;

import java.util.Arrays;
import java.util.List;
import java.util.stream.Collectors;
import org.orthogon.data.InputException;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.RunSpec.EstimationSpec;
import picocli.CommandLine.Option;

/** Command-line options that replace the model file's [estimation] choices (DESIGN.md section 4). */
final class EstimationOverrides {
    @Option(names = "--method", paramLabel = "METHOD",
            description = "one-step, two-step, iterated or continuously-updated")
    String method;

    @Option(names = "--kernel", paramLabel = "KERNEL",
            description = "none, truncated, bartlett, parzen, tukey-hanning or quadratic-spectral")
    String kernel;

    @Option(names = "--lags", paramLabel = "L", description = "a lag count L (Bartlett: bandwidth L + 1); over a "
            + "heteroskedasticity-consistent S without --kernel it means Bartlett")
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

    /** The spec with these options in force. */
    RunSpec apply(RunSpec spec) {
        EstimationSpec e = spec.estimation();
        EstimationMethod newMethod = method == null ? e.method() : parseMethod(method);
        Kernel newKernel = kernel == null ? e.kernel() : parseKernel(kernel);
        if (kernel == null && newKernel == Kernel.NONE && (lags != null || bandwidth != null)) {
            // Lags asked for on the command line over an S without lags (the Euler families' default): Bartlett.
            newKernel = Kernel.BARTLETT;
        }
        if (lags != null && bandwidth != null) {
            throw InputException.general().problem("--lags and --bandwidth were both given",
                    "give one of them: --lags L or --bandwidth B");
        }
        BandwidthRule rule = e.bandwidth();
        if (lags != null) {
            if (lags < 0) {
                throw InputException.general().problem("--lags " + lags + " is negative", "give a lag count >= 0");
            }
            rule = new BandwidthRule.Lags(lags);
        } else if (bandwidth != null) {
            rule = ModelFile.parseBandwidth(bandwidth, msg -> InputException.general().problem("--bandwidth: " + msg,
                    "give a positive number, andrews or newey-west"));
        }
        boolean newPrewhiten = prewhiten == null ? e.prewhiten() : prewhiten;
        boolean newCentered = centered == null ? e.centered() : centered;
        EstimationSpec updated = e.with(newMethod, newKernel, rule, newPrewhiten, newCentered);
        return spec.withEstimation(restrict == null ? updated : updated.withRestrictions(restrict));
    }

    private static EstimationMethod parseMethod(String text) {
        try {
            return EstimationMethod.fromId(text);
        } catch (IllegalArgumentException e) {
            throw InputException.general().problem("--method " + text + " is not a known estimation method",
                    "use one of " + Arrays.stream(EstimationMethod.values()).map(EstimationMethod::id)
                            .collect(Collectors.joining(", ")));
        }
    }

    private static Kernel parseKernel(String text) {
        try {
            return Kernel.fromId(text);
        } catch (IllegalArgumentException e) {
            throw InputException.general().problem("--kernel " + text + " is not a known kernel",
                    "use one of " + Arrays.stream(Kernel.values()).map(Kernel::id).collect(Collectors.joining(", ")));
        }
    }
}
