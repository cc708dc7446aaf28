package org.orthogon.cli;

import java.nio.file.Path;
import java.time.Instant;
import java.util.Map;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.concurrent.Callable;
import java.util.function.IntConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;
import org.orthogon.analysis.Stability;
import org.orthogon.analysis.SupWaldDistribution;
import org.orthogon.data.Frequency;
import org.orthogon.data.InputException;
import org.orthogon.data.Period;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.ManyMoments;
import org.orthogon.gmm.InitialWeight;
import org.orthogon.report.CheckReport;
import org.orthogon.report.JsonResults;
import org.orthogon.report.Manifest;
import org.orthogon.report.ReportFiles;
import org.orthogon.report.StabilityDocument;
import org.orthogon.report.StabilityReport;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import tools.jackson.databind.node.ObjectNode;

/** {@code stability MODEL.toml}: does the model's verdict hold across sample periods? */
@Command(name = "stability", mixinStandardHelpOptions = true,
        description = {"Fits one model in separate sample periods and tests whether its parameters change: "
                + "known break dates (--split, or [stability] splits in the model file) with the Andrews-Fair "
                + "Wald test, an unknown break date with the sup-Wald test (Andrews 1993), and rolling or "
                + "expanding windows (--window, --step).",
            "Every result is shown for the model file's estimator and, beside it, for a fixed (one-step, identity) "
                + "weight, whose subsample tests are much closer to their nominal size in samples of this kind."})
final class StabilityCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL.toml", description = "the model file")
    Path modelFile;

    @Mixin
    EstimationOverrides overrides;

    @Option(names = "--split", paramLabel = "DATE", description = "first date of a later period, e.g. 1995-01 (repeatable)")
    List<String> splits;

    @Option(names = "--trimming", paramLabel = "SHARE", description = "least share of the sample on each side of an unknown break (default 0.15)")
    Double trimming;

    @Option(names = "--no-sup-wald", description = "skip the unknown-break test")
    boolean noSupWald;

    @Option(names = "--window", paramLabel = "N", description = "rolling windows of N observations")
    Integer window;

    @Option(names = "--step", paramLabel = "N", description = "observations between window ends (default 1)")
    Integer step;

    @Option(names = "--expanding", description = "expanding windows from the first observation instead of rolling ones")
    boolean expanding;

    @Option(names = "--seed", paramLabel = "N", description = "seed of the sup-Wald null simulation (default "
            + SupWaldDistribution.DEFAULT_SEED + ")")
    Long seed;

    @Mixin
    ResultOptions output;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        Instant started = Instant.now();
        String folderName = ResultOptions.stem(modelFile) + "-stability";
        output.checkEarly(folderName);
        RunSpec spec = withCommandLine(overrides.apply(ModelFile.read(modelFile)));
        RunSpec.StabilitySpec choices = spec.stability();
        PreparedRun prepared = ModelAssembler.prepare(spec);
        List<Integer> splitIndices = splitIndices(spec, prepared);
        List<String> warnings = new ArrayList<>();

        GmmOptions efficient = FittedRun.options(spec, prepared);
        List<GmmOptions> variants = new ArrayList<>(List.of(efficient));
        if (efficient.method() != EstimationMethod.ONE_STEP) {
            variants.add(efficient.withMethod(EstimationMethod.ONE_STEP).withInitialWeight(new InitialWeight.Identity()));
        }
        List<StabilityReport.Variant> results = new ArrayList<>();
        for (GmmOptions options : variants) {
            String label = options == efficient ? "model file's estimator (" + options.method().id() + ")"
                    : "fixed weight (one-step, identity weight, sandwich covariance)";
            List<Stability.PeriodFit> periods = splitIndices.isEmpty() ? List.of()
                    : Stability.periods(prepared.moments(), prepared.startValues(), prepared.dates(), splitIndices, options);
            Stability.SupWald sup = null;
            if (!noSupWald) {
                int candidates = Stability.candidateBreaks(prepared.moments().observations(), choices.trimming()).size();
                try (Progress progress = Progress.start("sup-Wald, " + options.method().id(), candidates)) {
                    sup = Stability.supWald(prepared.moments(), prepared.startValues(), prepared.dates(), options,
                            choices.trimming(), seed == null ? SupWaldDistribution.DEFAULT_SEED : seed,
                            SupWaldDistribution.DEFAULT_DRAWS, progress);
                }
            }
            List<Stability.PeriodFit> rolling = List.of();
            if (choices.window().isPresent()) {
                int windowCount = (prepared.moments().observations() - choices.window().get()) / choices.step() + 1;
                try (Progress progress = Progress.start("windows, " + options.method().id(), windowCount)) {
                    rolling = Stability.windows(prepared.moments(), prepared.startValues(), prepared.dates(), options,
                            choices.window().get(), choices.step(), choices.expanding(), progress);
                }
            }
            results.add(new StabilityReport.Variant(label, periods,
                    periods.isEmpty() ? null : Stability.equalityTest(periods), sup, rolling));
        }
        warnings.addAll(sizeWarnings(prepared, splitIndices, choices, spec.estimation().longRunOptions()));
        ObjectNode json = StabilityReport.json(spec, prepared.sample(), results);
        if (output.json != null) {
            OutputFiles.writeAtomically(output.json, JsonResults.text(json));
        }
        Path folder = null;
        if (output.requested()) {
            long simulationSeed = seed == null ? SupWaldDistribution.DEFAULT_SEED : seed;
            folder = ReportFiles.publish(output.target(folderName), output.overwrite,
                    StabilityDocument.build(spec, prepared.sample(), results, warnings), json,
                    new Manifest.Run("stability", commandSpec.commandLine().getParseResult().originalArgs(),
                            Version.current(), started, noSupWald ? Map.of() : Map.of("sup_wald", simulationSeed)),
                    List.of(spec), List.of(prepared.inputs()));
        }
        if (!output.quiet) {
            commandSpec.commandLine().getOut().print(StabilityReport.render(spec, prepared.sample(), results, warnings));
            if (folder != null) {
                commandSpec.commandLine().getOut().println("\nReport folder: " + CheckReport.display(folder));
            }
            commandSpec.commandLine().getOut().flush();
        }
        return Main.EXIT_OK;
    }

    private RunSpec withCommandLine(RunSpec spec) {
        RunSpec.StabilitySpec s = spec.stability();
        if (trimming != null && !(trimming > 0 && trimming < 0.5)) {
            throw InputException.general().problem("--trimming " + trimming + " is outside (0, 0.5)",
                    "give a share such as 0.15");
        }
        if (window != null && window < 2 || step != null && step < 1) {
            throw InputException.general().problem("--window must be at least 2 and --step at least 1",
                    "e.g. --window 120 --step 12");
        }
        return spec.withStability(new RunSpec.StabilitySpec(splits == null ? s.splits() : splits,
                trimming == null ? s.trimming() : trimming, window == null ? s.window() : Optional.of(window),
                step == null ? s.step() : step, expanding || s.expanding()));
    }

    private List<Integer> splitIndices(RunSpec spec, PreparedRun prepared) {
        Frequency frequency = Period.parse(prepared.dates().get(0)).frequency();
        List<Integer> indices = new ArrayList<>();
        for (String text : spec.stability().splits()) {
            String label = Period.parseStart(text, frequency).label();
            int index = prepared.dates().indexOf(label);
            if (index <= 0) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("stability", "splits"))
                        .problem("the split " + text + " is not inside the sample " + prepared.sample().start() + " to "
                                + prepared.sample().end() + " (a split is the first date of a later period)",
                                "choose a split after " + prepared.sample().start() + " and up to "
                                        + prepared.sample().end());
            }
            if (!indices.isEmpty() && index <= indices.get(indices.size() - 1)) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("stability", "splits"))
                        .problem("the splits are not in increasing date order: " + spec.stability().splits(),
                                "list the split dates from earliest to latest");
            }
            indices.add(index);
        }
        return indices;
    }

    /**
     * The many-moments warning ({@link ManyMoments}) for the shortest subsample with the model file's long-run
     * choices: the subsample fits are where K² v / T is largest.
     */
    private static List<String> sizeWarnings(PreparedRun prepared, List<Integer> splits, RunSpec.StabilitySpec choices,
            org.orthogon.longrun.LongRunOptions longRun) {
        List<String> warnings = new ArrayList<>();
        int k = prepared.moments().momentCount();
        int t = prepared.moments().observations();
        int smallest = (int) Math.ceil(choices.trimming() * t);
        List<Integer> bounds = new ArrayList<>(List.of(0));
        bounds.addAll(splits);
        bounds.add(t);
        for (int i = 0; i + 1 < bounds.size(); i++) {
            smallest = Math.min(smallest, bounds.get(i + 1) - bounds.get(i));
        }
        int shortest = smallest;
        ManyMoments.warning(k, shortest, longRun).ifPresent(w -> warnings.add(
                String.format(Locale.ROOT, "subsamples as short as %d observations: %s; efficient-weight subsample "
                        + "fits make the Wald and sup-Wald statistics far larger than their limits suggest "
                        + "(over-rejection), so read the fixed-weight rows and treat the p-values as rough", shortest,
                        w)));
        return warnings;
    }

    /** A progress bar on standard error, only when a person is watching a terminal. */
    private static final class Progress implements IntConsumer, AutoCloseable {
        private final ProgressBar bar;

        private Progress(ProgressBar bar) {
            this.bar = bar;
        }

        static Progress start(String task, int total) {
            if (System.console() == null || total < 20) {
                return new Progress(null);
            }
            return new Progress(new ProgressBarBuilder().setTaskName(task).setInitialMax(total)
                    .setStyle(ProgressBarStyle.ASCII).continuousUpdate().build());
        }

        @Override
        public void accept(int ignored) {
            if (bar != null) {
                bar.step();
            }
        }

        @Override
        public void close() {
            if (bar != null) {
                bar.close();
            }
        }
    }
}
