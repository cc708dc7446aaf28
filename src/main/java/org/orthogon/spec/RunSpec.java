package org.orthogon.spec;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.orthogon.data.InputException;
import org.orthogon.data.ReturnKind;
import org.orthogon.data.Units;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.InitialWeight;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunOptions;

/**
 * A validated model file: every path resolved against the model file's folder, every choice typed.
 * Built by {@link ModelFile#read(Path)}; command-line options replace parts with the {@code with...}
 * methods, so one record describes exactly what a run did.
 *
 * @param keyLines the 1-based line of every key written, as "section.key", and of every section
 *                 header written, as "section"
 */
public record RunSpec(Path modelFile, String title, DataSpec data, ModelSpec model, EstimationSpec estimation,
        StabilitySpec stability, Map<String, Integer> keyLines) {

    public RunSpec {
        keyLines = Map.copyOf(keyLines);
    }

    /**
     * The 1-based line of "section.key" in the model file; the section's header line when the key is
     * not written (where a missing key belongs); 0 when neither is written.
     */
    public int lineOf(String section, String key) {
        return keyLines.getOrDefault(section + "." + key, keyLines.getOrDefault(section, 0));
    }

    /** Whether the model file writes "section.key". */
    public boolean writes(String section, String key) {
        return keyLines.containsKey(section + "." + key);
    }

    /** Paths and conventions of the input files ([data] section). */
    public record DataSpec(
            Path returns,
            List<String> assets,
            ReturnKind returnsKind,
            Units units,
            Optional<Path> riskfree,
            Optional<String> riskfreeColumn,
            Optional<Path> factors,
            Optional<Path> macro,
            Optional<Path> instruments,
            Optional<Path> wealth,
            Optional<String> start,
            Optional<String> end,
            Optional<String> returnsTable,
            Optional<Path> deflator,
            Optional<String> deflatorColumn,
            Map<String, Integer> instrumentLags) {
        public DataSpec {
            assets = List.copyOf(assets);
            instrumentLags = Map.copyOf(instrumentLags);
        }
    }

    /**
     * Estimation choices ([estimation] section). The kernel and the bandwidth rule always go together
     * ({@link LongRunOptions#conflict}); the record cannot be built otherwise.
     *
     * @param bandwidthGiven   whether the bandwidth (or lag count) was written, in the model file or on the
     *                         command line, rather than taken from the kernel's default
     * @param restrictions     linear restrictions to test by Wald statistics, e.g. "b_SIZE = 0, b_TIDE = 0"
     * @param confidenceLevel  level of the reported confidence intervals
     * @param maxIterations    cap on the weight updates of iterated GMM
     * @param hjSeed           seed of the simulated p-value of the Hansen-Jagannathan distance
     * @param hjDraws          draws of that simulation
     * @param smallSample      multiply S by T/(T - P) for the reported inference (off by default)
     */
    public record EstimationSpec(EstimationMethod method, InitialWeight initialWeight, Kernel kernel,
            BandwidthRule bandwidth, boolean bandwidthGiven, boolean prewhiten, boolean centered,
            List<String> restrictions, double confidenceLevel, int maxIterations, long hjSeed, int hjDraws,
            boolean smallSample) {

        public EstimationSpec {
            restrictions = List.copyOf(restrictions);
            new LongRunOptions(kernel, bandwidth, centered, prewhiten);
        }

        /** The same choices with more restrictions to test. */
        public EstimationSpec withRestrictions(List<String> more) {
            List<String> all = new ArrayList<>(restrictions);
            all.addAll(more);
            return new EstimationSpec(method, initialWeight, kernel, bandwidth, bandwidthGiven, prewhiten, centered, all,
                    confidenceLevel, maxIterations, hjSeed, hjDraws, smallSample);
        }

        /** The same choices with another method and long-run covariance estimator. */
        public EstimationSpec with(EstimationMethod newMethod, LongRunOptions options, boolean newBandwidthGiven) {
            return new EstimationSpec(newMethod, initialWeight, options.kernel(), options.bandwidth(), newBandwidthGiven,
                    options.prewhiten(), options.centered(), restrictions, confidenceLevel, maxIterations, hjSeed,
                    hjDraws, smallSample);
        }

        /** The long-run covariance options these choices imply. */
        public LongRunOptions longRunOptions() {
            return new LongRunOptions(kernel, bandwidth, centered, prewhiten);
        }

        /** The same choices with another long-run covariance estimator (the sensitivity grid's rows). */
        public EstimationSpec withLongRun(LongRunOptions options) {
            return with(method, options, true);
        }

        /** A human-readable bandwidth choice: "lags 4", "b = 5.0", "andrews", "newey-west", "no bandwidth". */
        public String bandwidthLabel() {
            if (!kernel.usesBandwidth()) {
                return "no bandwidth";
            }
            if (bandwidth instanceof BandwidthRule.Lags lags) {
                return "lags " + lags.lags();
            }
            if (bandwidth instanceof BandwidthRule.Fixed fixed) {
                return "b = " + fixed.bandwidth();
            }
            return bandwidth instanceof BandwidthRule.Andrews ? "andrews" : "newey-west";
        }
    }

    /**
     * The spec with the command line's estimation choices in force; null leaves the model file's. A
     * kernel given alone keeps the model file's bandwidth when the new kernel can use it, takes the
     * new kernel's default when the model file wrote none, and is refused when the model file's
     * bandwidth cannot go with it; a bandwidth given for a kernel that cannot use it is refused.
     *
     * @param bandwidthOption how the bandwidth was written ("--lags 4", "--bandwidth andrews"), for messages
     * @throws InputException naming the options (and the model-file line) and the fix
     */
    public RunSpec withCommandLine(EstimationMethod method, Kernel kernel, BandwidthRule bandwidth,
            String bandwidthOption, Boolean prewhiten, Boolean centered, List<String> restrictions) {
        EstimationSpec e = estimation;
        if (method != null) {
            model.refusal(method).ifPresent(refusal -> {
                throw InputException.general().problem("--method " + method.id() + " cannot be used with the "
                        + model.family().id() + " family of " + modelFile.getFileName() + ": " + refusal.problem(),
                        refusal.fix());
            });
        }
        Kernel newKernel = kernel == null ? e.kernel() : kernel;
        String kernelSource = kernel != null ? "--kernel " + kernel.id()
                : "kernel \"" + e.kernel().id() + "\"" + (writes("estimation", "kernel")
                        ? " (" + modelFile.getFileName() + ", line " + lineOf("estimation", "kernel") + ")" : "");
        BandwidthRule newBandwidth;
        boolean given;
        if (bandwidth != null) {
            if (!newKernel.usesBandwidth() && !(bandwidth instanceof BandwidthRule.Lags lags && lags.lags() == 0)) {
                throw InputException.general().problem(bandwidthOption + " cannot be used with " + kernelSource
                        + ": that kernel uses no lags", "leave out " + bandwidthOption + ", or choose a kernel that uses lags ("
                        + Kernel.idsWithBandwidth() + ")");
            }
            String conflict = LongRunOptions.conflict(newKernel, bandwidth).orElse(null);
            if (conflict != null) {
                throw InputException.general().problem(bandwidthOption + " cannot be used with " + kernelSource + ": "
                        + conflict, "give " + commandLineChoices(newKernel));
            }
            newBandwidth = bandwidth;
            given = true;
        } else if (kernel == null || kernel == e.kernel()) {
            newBandwidth = e.bandwidth();
            given = e.bandwidthGiven();
        } else if (!newKernel.usesBandwidth() || !e.bandwidthGiven()) {
            newBandwidth = newKernel.defaultBandwidth();
            given = false;
        } else {
            String conflict = LongRunOptions.conflict(newKernel, e.bandwidth()).orElse(null);
            if (conflict != null) {
                String key = writes("estimation", "lags") ? "lags" : "bandwidth";
                throw InputException.general().problem("--kernel " + newKernel.id() + " cannot use the model file's "
                        + e.bandwidthLabel().replace("lags ", "lags = ") + " (" + modelFile.getFileName() + ", line "
                        + lineOf("estimation", key) + "): " + conflict,
                        "add " + commandLineChoices(newKernel) + " to the command");
            }
            newBandwidth = e.bandwidth();
            given = true;
        }
        LongRunOptions options = new LongRunOptions(newKernel, newBandwidth,
                centered == null ? e.centered() : centered, prewhiten == null ? e.prewhiten() : prewhiten);
        EstimationSpec updated = e.with(method == null ? e.method() : method, options, given);
        return withEstimation(restrictions == null ? updated : updated.withRestrictions(restrictions));
    }

    /** The bandwidth options {@code kernel} accepts, in command-line words. */
    private static String commandLineChoices(Kernel kernel) {
        List<String> choices = new ArrayList<>();
        for (String choice : LongRunOptions.acceptedChoices(kernel)) {
            choices.add(choice.replace("lags = L", "--lags L").replace("bandwidth = b", "--bandwidth B")
                    .replace("bandwidth = \"", "--bandwidth ").replace("\"", ""));
        }
        return choices.size() < 2 ? String.join("", choices)
                : String.join(", ", choices.subList(0, choices.size() - 1)) + " or " + choices.get(choices.size() - 1);
    }

    public RunSpec withEstimation(EstimationSpec replacement) {
        return new RunSpec(modelFile, title, data, model, replacement, stability, keyLines);
    }

    public RunSpec withStability(StabilitySpec replacement) {
        return new RunSpec(modelFile, title, data, model, estimation, replacement, keyLines);
    }
}
