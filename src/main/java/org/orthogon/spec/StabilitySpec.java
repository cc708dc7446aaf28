package org.orthogon.spec;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.Set;
import org.orthogon.data.Frequency;
import org.orthogon.data.InputException;
import org.orthogon.data.Period;
import org.orthogon.gmm.ManyMoments;
import org.orthogon.longrun.LongRunOptions;

/**
 * Sample-period choices for `stability` ([stability] section; the command line may replace them), and
 * the rules they must meet, held here once: the values on their own when they are read
 * ({@link #trimmingProblem}, {@link #windowProblem}, {@link #stepProblem}), and against the data when a
 * run is planned ({@link #plan}). `check` plans the model file's [stability] section the way
 * `stability` does, so a model file that passes `check` is never refused by `stability` for its
 * [stability] values.
 *
 * @param splits          first dates of the later periods of known breaks, as written ("1995-01")
 * @param trimming        share of the sample each side of an unknown break must hold, in (0, 0.5)
 * @param window          rolling-window length in observations, if windows are wanted
 * @param step            observations between window ends, at least 1
 * @param expanding       windows all start at the first observation
 * @param fromCommandLine the keys ("splits", "trimming", "window", "step") the command line set, so a
 *                        refusal names the option instead of a model-file line
 */
public record StabilitySpec(List<String> splits, double trimming, Optional<Integer> window, int step,
        boolean expanding, Set<String> fromCommandLine) {
    /** Default trimming: each side of a break holds at least 15% of the sample (Andrews 1993). */
    public static final double DEFAULT_TRIMMING = 0.15;

    public StabilitySpec {
        splits = List.copyOf(splits);
        fromCommandLine = Set.copyOf(fromCommandLine);
    }

    /** No splits, 15% trimming, no rolling windows. */
    public static StabilitySpec defaults() {
        return new StabilitySpec(List.of(), DEFAULT_TRIMMING, Optional.empty(), 1, false, Set.of());
    }

    /** Why a trimming share is unusable, or empty. */
    public static Optional<String> trimmingProblem(double trimming) {
        return trimming > 0 && trimming < 0.5 ? Optional.empty()
                : Optional.of("trimming must be a share between 0 and 0.5, found " + trimming);
    }

    /** Why a window length is unusable on its own, or empty (the sample decides the rest). */
    public static Optional<String> windowProblem(long window) {
        return window >= 2 && window <= Integer.MAX_VALUE ? Optional.empty()
                : Optional.of("window must be a whole number of at least 2 observations, found " + window);
    }

    /** Why a step is unusable, or empty. */
    public static Optional<String> stepProblem(long step) {
        return step >= 1 && step <= Integer.MAX_VALUE ? Optional.empty()
                : Optional.of("step must be a whole number of at least 1, found " + step);
    }

    /**
     * These choices with the command line's in force; null leaves the model file's value.
     *
     * @throws InputException naming the option when a value is unusable on its own
     */
    public StabilitySpec withCommandLine(List<String> newSplits, Double newTrimming, Integer newWindow, Integer newStep,
            boolean newExpanding) {
        Set<String> set = new HashSet<>(fromCommandLine);
        if (newTrimming != null) {
            trimmingProblem(newTrimming).ifPresent(p -> {
                throw InputException.general().problem("--trimming " + newTrimming + ": " + p, "give a share such as 0.15");
            });
            set.add("trimming");
        }
        if (newWindow != null) {
            windowProblem(newWindow).ifPresent(p -> {
                throw InputException.general().problem("--window " + newWindow + ": " + p, "e.g. --window 120");
            });
            set.add("window");
        }
        if (newStep != null) {
            stepProblem(newStep).ifPresent(p -> {
                throw InputException.general().problem("--step " + newStep + ": " + p, "e.g. --step 12");
            });
            set.add("step");
        }
        if (newSplits != null) {
            set.add("splits");
        }
        return new StabilitySpec(newSplits == null ? splits : newSplits, newTrimming == null ? trimming : newTrimming,
                newWindow == null ? window : Optional.of(newWindow), newStep == null ? step : newStep,
                newExpanding || expanding, set);
    }

    /**
     * A stability run checked against the data: the row index where each later period starts, the
     * number of candidate break dates of the sup-Wald test (0 when it is not run), the number of
     * windows, and warnings about subsample sizes.
     */
    public record Plan(List<Integer> splitIndices, int candidateCount, int windowCount, List<Warning> warnings) {
        public Plan {
            splitIndices = List.copyOf(splitIndices);
            warnings = List.copyOf(warnings);
        }
    }

    /**
     * Checks these choices against the prepared sample and returns the run they describe. Every
     * subsample fit (each period between splits, each side of every candidate break, each window)
     * must hold at least {@link ModelAssembler#minimumObservations} observations, and a window cannot
     * be longer than the sample.
     *
     * @param supWald whether the unknown-break test will run
     * @throws InputException naming the model-file line or the command-line option and the fix
     */
    public Plan plan(RunSpec spec, PreparedRun prepared, boolean supWald) {
        List<String> dates = prepared.dates();
        int t = dates.size();
        int k = prepared.moments().momentCount();
        int need = ModelAssembler.minimumObservations(spec, k);
        String fitNeeds = need + " observations (more than the K = " + k + " moments"
                + (need > k + 1 ? ", and what the long-run covariance options need" : "") + ")";
        List<Integer> indices = splitIndices(spec, prepared);
        List<Integer> bounds = new ArrayList<>(List.of(0));
        bounds.addAll(indices);
        bounds.add(t);
        for (int i = 0; i + 1 < bounds.size(); i++) {
            int length = bounds.get(i + 1) - bounds.get(i);
            if (!indices.isEmpty() && length < need) {
                throw refusal(spec, "splits", "the period " + dates.get(bounds.get(i)) + " to "
                        + dates.get(bounds.get(i + 1) - 1) + " has " + length + " observations, but a fit needs at least "
                        + fitNeeds, "move the split dates so that every period holds at least " + need + " observations");
            }
        }
        int candidates = 0;
        if (supWald) {
            int side = (int) Math.ceil(trimming * t);
            if (side < need) {
                double least = Math.ceil(1000.0 * need / t) / 1000.0;
                throw refusal(spec, "trimming", String.format(Locale.ROOT, "with trimming %s and T = %d a candidate "
                        + "break leaves as few as %d observations on one side, but a fit needs at least %s", trimming, t,
                        side, fitNeeds), least < 0.5
                        ? String.format(Locale.ROOT, "raise trimming to at least %s, or leave out the unknown-break test "
                                + "(--no-sup-wald)", least)
                        : "use a longer sample, or leave out the unknown-break test (--no-sup-wald)");
            }
            // Candidate breaks: i >= ceil(π0 T) and T - i >= ceil(π0 T) (Andrews 1993).
            candidates = Math.max(0, t - 2 * side + 1);
            if (candidates < 1) {
                throw refusal(spec, "trimming", String.format(Locale.ROOT, "with trimming %s and T = %d no break date "
                        + "leaves %d observations on both sides", trimming, t, side),
                        "lower trimming, or leave out the unknown-break test (--no-sup-wald)");
            }
        }
        int windowCount = 0;
        if (window.isPresent()) {
            int length = window.get();
            if (length > t) {
                throw refusal(spec, "window", "the window of " + length + " observations is longer than the sample ("
                        + prepared.sample().start() + " to " + prepared.sample().end() + ", T = " + t + ")",
                        "choose a window of at most " + t + " observations");
            }
            if (length < need) {
                throw refusal(spec, "window", "a window of " + length + " observations is too short: a fit needs at "
                        + "least " + fitNeeds, "choose a window of at least " + need + " observations (several times "
                        + "K gives usable estimates)");
            }
            windowCount = (t - length) / step + 1;
        }
        return new Plan(indices, candidates, windowCount, sizeWarnings(k, t, indices, supWald,
                spec.estimation().longRunOptions()));
    }

    private List<Integer> splitIndices(RunSpec spec, PreparedRun prepared) {
        Frequency frequency = Period.parse(prepared.dates().get(0)).frequency();
        List<Integer> indices = new ArrayList<>();
        for (String text : splits) {
            String label;
            try {
                label = Period.parseStart(text, frequency).label();
            } catch (InputException e) {
                throw refusal(spec, "splits", "the split \"" + text + "\" cannot be used: " + e.problem(), e.fix());
            }
            int index = prepared.dates().indexOf(label);
            if (index <= 0) {
                throw refusal(spec, "splits", "the split " + text + " is not inside the sample " + prepared.sample().start()
                        + " to " + prepared.sample().end() + " (a split is the first date of a later period)",
                        "choose a split after " + prepared.sample().start() + " and up to " + prepared.sample().end());
            }
            if (!indices.isEmpty() && index <= indices.get(indices.size() - 1)) {
                throw refusal(spec, "splits", "the splits are not in increasing date order: " + splits,
                        "list the split dates from earliest to latest");
            }
            indices.add(index);
        }
        return indices;
    }

    /**
     * The many-moments warning ({@link ManyMoments}) judged at the shortest subsample or window, where K² v / T
     * is largest, with the model file's long-run choices.
     */
    private List<Warning> sizeWarnings(int k, int t, List<Integer> splitIndices, boolean supWald,
            LongRunOptions longRun) {
        List<Warning> warnings = new ArrayList<>();
        int smallest = supWald ? (int) Math.ceil(trimming * t) : t;
        List<Integer> bounds = new ArrayList<>(List.of(0));
        bounds.addAll(splitIndices);
        bounds.add(t);
        for (int i = 0; i + 1 < bounds.size(); i++) {
            smallest = Math.min(smallest, bounds.get(i + 1) - bounds.get(i));
        }
        if (window.isPresent()) {
            smallest = Math.min(smallest, window.get());
        }
        int shortest = smallest;
        ManyMoments.warning(k, shortest, longRun).ifPresent(w -> warnings.add(new Warning("many-moments-subsample",
                String.format(Locale.ROOT, "subsamples as short as %d observations: %s; efficient-weight subsample "
                        + "fits make the Wald and sup-Wald statistics far larger than their limits suggest "
                        + "(over-rejection), so read the fixed-weight rows and treat the p-values as rough", shortest,
                        w))));
        return warnings;
    }

    /** A refusal naming where the value came from: the command-line option or the model-file line. */
    private InputException refusal(RunSpec spec, String key, String problem, String fix) {
        if (fromCommandLine.contains(key)) {
            return InputException.general().problem("--" + (key.equals("splits") ? "split" : key) + ": " + problem, fix);
        }
        int line = spec.lineOf("stability", key);
        String where = spec.keyLines().containsKey("stability." + key) ? "" : "the default " + key + ": ";
        return InputException.in(spec.modelFile()).line(line).problem(where + problem, fix);
    }
}
