package org.orthogon.cli;

import java.nio.file.Path;
import java.time.Instant;
import java.util.Map;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.orthogon.analysis.Stability;
import org.orthogon.analysis.SupWaldDistribution;
import org.orthogon.bootstrap.BootstrapPlan;
import org.orthogon.bootstrap.SupWaldBootstrap;
import org.orthogon.data.InputException;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmOptions;
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
import org.orthogon.spec.StabilitySpec;
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
            + SupWaldDistribution.DEFAULT_SEED + ") and of the --bootstrap draws (default "
            + BootstrapPlan.DEFAULT_SEED + ")")
    Long seed;

    @Mixin
    ResultOptions output;

    @Mixin
    ThreadsOption threads;

    @Mixin
    BootstrapOptions bootstrap;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        Instant started = Instant.now();
        String folderName = ResultOptions.stem(modelFile) + "-stability";
        output.checkEarly(folderName);
        int threadCount = threads.count();
        bootstrap.check();
        if (bootstrap.requested() && noSupWald) {
            throw InputException.general().problem("--bootstrap was given with --no-sup-wald",
                    "drop --no-sup-wald: the stability bootstrap resamples the sup-Wald statistic");
        }
        RunSpec spec = withCommandLine(overrides.apply(ModelFile.read(modelFile)));
        StabilitySpec choices = spec.stability();
        PreparedRun prepared = ModelAssembler.prepare(spec);
        StabilitySpec.Plan plan = choices.plan(spec, prepared, !noSupWald);
        List<Integer> splitIndices = plan.splitIndices();
        List<String> warnings = new ArrayList<>();
        BootstrapPlan bootstrapPlan = bootstrap.plan(prepared.sample().observations(), seed);

        GmmOptions efficient = FittedRun.options(spec, prepared);
        List<GmmOptions> variants = new ArrayList<>(List.of(efficient));
        if (efficient.method() != EstimationMethod.ONE_STEP) {
            variants.add(efficient.withMethod(EstimationMethod.ONE_STEP).withInitialWeight(new InitialWeight.Identity()));
        }
        // The beta-pricing system's stability is that of its risk premia; its first-pass a and beta are shown only.
        int tested = Stability.testedParameters(prepared.moments());
        List<StabilityReport.Variant> results = new ArrayList<>();
        for (GmmOptions options : variants) {
            String label = (options == efficient ? "model file's estimator (" + options.method().id() + ")"
                    : "fixed weight (one-step, identity weight, sandwich covariance)")
                    + (tested < prepared.moments().parameterCount() ? "; the tests compare " + String.join(", ",
                            prepared.moments().parameterNames().subList(0, tested)) + " only" : "");
            List<Stability.PeriodFit> periods = splitIndices.isEmpty() ? List.of()
                    : Stability.periods(prepared.moments(), prepared.startValues(), prepared.dates(), splitIndices, options);
            Stability.SupWald sup = null;
            if (!noSupWald) {
                try (Progress progress = Progress.start("sup-Wald, " + options.method().id(), plan.candidateCount())) {
                    sup = Stability.supWald(prepared.moments(), prepared.startValues(), prepared.dates(), options,
                            choices.trimming(), seed == null ? SupWaldDistribution.DEFAULT_SEED : seed,
                            SupWaldDistribution.DEFAULT_DRAWS, threadCount, progress);
                }
            }
            SupWaldBootstrap.Result supBootstrap = null;
            if (sup != null && bootstrapPlan != null) {
                try (Progress progress = Progress.start("sup-Wald bootstrap, " + options.method().id(),
                        bootstrapPlan.replications())) {
                    supBootstrap = SupWaldBootstrap.run(prepared.moments(), prepared.startValues(), options,
                            choices.trimming(), sup.statistic(), bootstrapPlan, threadCount, progress);
                }
            }
            List<Stability.PeriodFit> rolling = List.of();
            if (choices.window().isPresent()) {
                try (Progress progress = Progress.start("windows, " + options.method().id(), plan.windowCount())) {
                    rolling = Stability.windows(prepared.moments(), prepared.startValues(), prepared.dates(), options,
                            choices.window().get(), choices.step(), choices.expanding(), threadCount, progress);
                }
            }
            results.add(new StabilityReport.Variant(label, periods,
                    periods.isEmpty() ? null : Stability.equalityTest(periods, tested), sup, rolling, supBootstrap));
        }
        plan.warnings().forEach(warning -> warnings.add(warning.text()));
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
                            Version.current(), started, seeds(results, noSupWald ? null : simulationSeed,
                                    bootstrapPlan)),
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

    /** The sup-Wald simulation's seed (when it ran) and the HJ seed of every period and window fit. */
    private static Map<String, Long> seeds(List<StabilityReport.Variant> variants, Long supWald,
            BootstrapPlan bootstrap) {
        List<org.orthogon.gmm.GmmFit> fits = new ArrayList<>();
        for (StabilityReport.Variant variant : variants) {
            variant.periods().forEach(period -> fits.add(period.fit()));
            variant.rolling().stream().filter(window -> window.fit() != null).forEach(window -> fits.add(window.fit()));
        }
        Map<String, Long> seeds = new java.util.TreeMap<>(Manifest.seeds(fits));
        if (supWald != null) {
            seeds.put("sup_wald", supWald);
        }
        if (bootstrap != null) {
            seeds.put("bootstrap", bootstrap.seed());
        }
        return seeds;
    }

    private RunSpec withCommandLine(RunSpec spec) {
        return spec.withStability(spec.stability().withCommandLine(splits, trimming, window, step, expanding));
    }
}
