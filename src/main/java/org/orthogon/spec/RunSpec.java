package org.orthogon.spec;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunOptions;

/**
 * A validated model file: every path resolved against the model file's folder, every choice typed.
 * Built by {@link ModelFile#read(Path)}; command-line options replace parts with the {@code with...}
 * methods, so one record describes exactly what a run did.
 */
public record RunSpec(Path modelFile, String title, DataSpec data, ModelSpec model, EstimationSpec estimation,
        StabilitySpec stability, Map<String, Integer> keyLines) {

    public RunSpec {
        keyLines = Map.copyOf(keyLines);
    }

    /** The 1-based line of "section.key" in the model file, 0 when the key was not written there. */
    public int lineOf(String section, String key) {
        return keyLines.getOrDefault(section + "." + key, 0);
    }

    /** Paths and conventions of the input files ([data] section). */
    public record DataSpec(
            Path returns,
            List<String> assets,
            String returnsKind,
            String units,
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
     * The SDF family and its columns ([model] section).
     *
     * @param form              linear-factor only: "excess" (m = 1 - b'F on excess returns), "demeaned"
     *                          (m = 1 - b'(F - mu), mu estimated) or "gross" (m = a - b'F on gross returns)
     * @param wealthColumn      recursive-utility: the wealth-return proxy column of the [data] wealth file
     * @param sdf               expression: the SDF formula over data columns and parameters
     * @param parameters        expression: the parameter names, in order
     * @param payoff            expression: "gross" (E[m R] = 1) or "excess" (E[m R^e] = 0)
     * @param factorInstruments linear-factor: instruments that scale the factors, F_t ⊗ z_{t-1}
     * @param bounds            closed bounds [lower, upper] per parameter name
     * @param consumptionLevelColumn power/recursive utility: consumption levels instead of growth
     * @param populationColumn  with levels: population, for per-capita growth
     * @param priceColumn       with levels: a price level, for real growth of nominal consumption
     */
    public record ModelSpec(
            Family family,
            Optional<String> consumptionColumn,
            List<String> factorColumns,
            List<String> instrumentColumns,
            Map<String, Double> startValues,
            String form,
            Optional<String> wealthColumn,
            Optional<String> sdf,
            List<String> parameters,
            String payoff,
            List<String> factorInstruments,
            Map<String, double[]> bounds,
            Optional<String> consumptionLevelColumn,
            Optional<String> populationColumn,
            Optional<String> priceColumn) {
        public ModelSpec {
            factorColumns = List.copyOf(factorColumns);
            instrumentColumns = List.copyOf(instrumentColumns);
            startValues = Map.copyOf(startValues);
            parameters = List.copyOf(parameters);
            factorInstruments = List.copyOf(factorInstruments);
            bounds = Map.copyOf(bounds);
        }
    }

    /**
     * Estimation choices ([estimation] section).
     *
     * @param restrictions     linear restrictions to test by Wald statistics, e.g. "b_SIZE = 0, b_TIDE = 0"
     * @param confidenceLevel  level of the reported confidence intervals
     * @param maxIterations    cap on the weight updates of iterated GMM
     * @param hjSeed           seed of the simulated p-value of the Hansen-Jagannathan distance
     * @param hjDraws          draws of that simulation
     * @param smallSample      multiply S by T/(T - P) for the reported inference (off by default)
     */
    public record EstimationSpec(EstimationMethod method, String initialWeight, Kernel kernel, BandwidthRule bandwidth,
            boolean prewhiten, boolean centered, List<String> restrictions, double confidenceLevel, int maxIterations,
            long hjSeed, int hjDraws, boolean smallSample) {

        public EstimationSpec {
            restrictions = List.copyOf(restrictions);
        }

        /** The same choices with more restrictions to test. */
        public EstimationSpec withRestrictions(List<String> more) {
            List<String> all = new java.util.ArrayList<>(restrictions);
            all.addAll(more);
            return new EstimationSpec(method, initialWeight, kernel, bandwidth, prewhiten, centered, all, confidenceLevel,
                    maxIterations, hjSeed, hjDraws, smallSample);
        }

        /** The same choices with another method, kernel, bandwidth rule, prewhitening and centering. */
        public EstimationSpec with(EstimationMethod newMethod, Kernel newKernel, BandwidthRule newBandwidth,
                boolean newPrewhiten, boolean newCentered) {
            return new EstimationSpec(newMethod, initialWeight, newKernel, newBandwidth, newPrewhiten, newCentered,
                    restrictions, confidenceLevel, maxIterations, hjSeed, hjDraws, smallSample);
        }

        /** The long-run covariance options these choices imply. */
        public LongRunOptions longRunOptions() {
            return new LongRunOptions(kernel, bandwidth, centered, prewhiten);
        }

        /** The same choices with another long-run covariance estimator. */
        public EstimationSpec withLongRun(LongRunOptions options) {
            return with(method, options.kernel(), options.bandwidth(), options.prewhiten(), options.centered());
        }

        /** A human-readable bandwidth choice: "lags 4", "b = 5.0", "andrews", "newey-west". */
        public String bandwidthLabel() {
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
     * Sample-period choices for `stability` ([stability] section; the command line may replace them).
     *
     * @param splits    first dates of the later periods of known breaks, as written ("1995-01")
     * @param trimming  share of the sample each side of an unknown break must hold
     * @param window    rolling-window length in observations, if rolling windows are wanted
     * @param step      observations between window ends
     * @param expanding windows all start at the first observation
     */
    public record StabilitySpec(List<String> splits, double trimming, Optional<Integer> window, int step,
            boolean expanding) {
        public StabilitySpec {
            splits = List.copyOf(splits);
        }

        /** No splits, 15% trimming, no rolling windows. */
        public static StabilitySpec defaults() {
            return new StabilitySpec(List.of(), 0.15, Optional.empty(), 1, false);
        }
    }

    /** The model families this version knows (docs/model-file.md). */
    public enum Family {
        POWER_UTILITY("power-utility"),
        RECURSIVE_UTILITY("recursive-utility"),
        LINEAR_FACTOR("linear-factor"),
        EXPRESSION("expression");

        private final String id;

        Family(String id) {
            this.id = id;
        }

        public String id() {
            return id;
        }

        /** The family with this id, or empty. */
        public static Optional<Family> fromId(String id) {
            for (Family family : values()) {
                if (family.id.equals(id)) {
                    return Optional.of(family);
                }
            }
            return Optional.empty();
        }
    }

    public RunSpec withEstimation(EstimationSpec replacement) {
        return new RunSpec(modelFile, title, data, model, replacement, stability, keyLines);
    }

    public RunSpec withStability(StabilitySpec replacement) {
        return new RunSpec(modelFile, title, data, model, estimation, replacement, keyLines);
    }
}
