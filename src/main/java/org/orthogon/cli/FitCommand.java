package org.orthogon.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.concurrent.Callable;
import org.orthogon.analysis.SensitivityGrid;
import org.orthogon.bootstrap.BootstrapPlan;
import org.orthogon.bootstrap.FitBootstrap;
import org.orthogon.report.BootstrapReport;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.WindmeijerCorrection;
import org.orthogon.report.RobustSetsReport;
import org.orthogon.robust.RobustSetOptions;
import org.orthogon.robust.RobustSets;
import java.util.Optional;
import org.orthogon.report.CheckReport;
import org.orthogon.report.ConsoleReport;
import org.orthogon.report.FitReport;
import org.orthogon.report.Manifest;
import org.orthogon.report.JsonResults;
import org.orthogon.report.SensitivityReport;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import picocli.CommandLine.Command;
import tools.jackson.databind.node.ObjectNode;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code fit MODEL.toml}: estimate one model and report parameters, the J test and the pricing errors. */
@Command(name = "fit", mixinStandardHelpOptions = true,
        description = {"Estimates the SDF parameters of one model file by GMM and prints the parameter table, "
                + "the test of the overidentifying restrictions and one pricing error per test asset.",
            "Options given here replace the model file's [estimation] choices for this run only."})
final class FitCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL.toml", description = "the model file")
    Path modelFile;

    @Mixin
    EstimationOverrides overrides;

    @Mixin
    ResultOptions output;

    @Mixin
    ThreadsOption threads;

    @Option(names = "--sensitivity", description = "also refit under every kernel and bandwidth choice of the "
            + "sensitivity grid (HC; Bartlett, Parzen, Tukey-Hanning lags 0-12; QS b = 1-13; Andrews and Newey-West "
            + "rules; with and without prewhitening) and flag verdicts that differ at 5%%")
    boolean sensitivity;

    @Mixin
    BootstrapOptions bootstrap;

    @Option(names = "--seed", paramLabel = "S", description = "seed of the bootstrap's random draws (default "
            + org.orthogon.bootstrap.BootstrapPlan.DEFAULT_SEED + ")")
    Long seed;

    @Mixin
    RobustSetArguments robustSets;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        Instant started = Instant.now();
        String folderName = ResultOptions.stem(modelFile);
        output.checkEarly(folderName);
        int threadCount = threads.count();
        bootstrap.check();
        RunSpec spec = overrides.apply(ModelFile.read(modelFile));
        RobustSetOptions robustOptions = robustSets.options(spec.estimation().confidenceLevel());
        if (robustOptions != null && spec.model() instanceof org.orthogon.spec.BetaPricingSpec) {
            throw org.orthogon.data.InputException.general().problem("--s-sets cannot be used with the beta-pricing "
                    + "family of " + modelFile.getFileName() + ": the S and K statistics invert S at every parameter "
                    + "value, and the S of this system is singular by construction",
                    "leave out --s-sets; the family's GMM standard errors use S but never its inverse");
        }
        FittedRun run = FittedRun.of(spec);
        PreparedRun prepared = run.prepared();
        GmmOptions gmmOptions = FittedRun.options(spec, prepared);
        RobustSetArguments.checkNames(robustOptions, prepared.moments().parameterNames(), gmmOptions.bounds());
        GmmFit fit = run.fit();
        Optional<WindmeijerCorrection.Result> windmeijer = WindmeijerCorrection.of(prepared.moments(),
                prepared.startValues(), gmmOptions, fit);
        RobustSets.Analysis robust = robustOptions == null ? null : RobustSets.compute(prepared.moments(), fit,
                gmmOptions.longRun(), gmmOptions.smallSample(), gmmOptions.bounds(), robustOptions, threadCount);
        List<SensitivityGrid.SensitivityRow> grid = sensitivity
                ? SensitivityGrid.run(prepared.moments(), prepared.startValues(), fit, spec.estimation().centered(),
                        choice -> FittedRun.options(spec.withEstimation(spec.estimation().withLongRun(choice)), prepared),
                        threadCount)
                : List.of();
        BootstrapPlan plan = bootstrap.plan(prepared.sample().observations(), seed);
        FitBootstrap.Result resampled = null;
        if (plan != null) {
            try (Progress progress = Progress.start("bootstrap", plan.replications())) {
                resampled = FitBootstrap.run(prepared.moments(), fit, gmmOptions, plan, threadCount, progress);
            }
        }
        FitBootstrap.Result bootstrapResult = resampled;
        List<FittedRun.RestrictionTest> restrictions = run.restrictionTests();
        ObjectNode results = JsonResults.fit(spec, prepared.sample(), fit);
        JsonResults.addInputWarnings(results, prepared.warnings());
        JsonResults.addWindmeijer(results, fit, windmeijer);
        if (robust != null) {
            RobustSetsReport.addTo(results, robust);
        }
        if (!restrictions.isEmpty()) {
            JsonResults.addRestrictions(results, restrictions);
        }
        if (sensitivity) {
            SensitivityReport.addTo(results, grid, FitReport.mainParameters(spec, prepared.moments().parameterNames()));
        }
        if (bootstrapResult != null) {
            BootstrapReport.addTo(results, bootstrapResult);
        }
        var premia = run.riskPremia();
        premia.ifPresent(p -> JsonResults.addRiskPremia(results, p));
        if (output.json != null) {
            OutputFiles.writeAtomically(output.json, JsonResults.text(results));
        }
        Path folder = null;
        if (output.requested()) {
            folder = FitReport.writeFolder(output.target(folderName), output.overwrite, results, spec, prepared, fit,
                    premia.orElse(null), restrictions, grid,
                    new FitReport.Extras(windmeijer.orElse(null), robust, bootstrapResult),
                    new Manifest.Run("fit", commandSpec.commandLine().getParseResult().originalArgs(),
                            Version.current(), started, seeds(fit, bootstrapResult)));
        }
        if (!output.quiet) {
            PrintWriter out = commandSpec.commandLine().getOut();
            out.print(ConsoleReport.render(spec, prepared, fit, restrictions,
                    windmeijer.map(WindmeijerCorrection.Result::stdErrors).orElse(null)));
            premia.ifPresent(p -> out.print(ConsoleReport.renderRiskPremia(p)));
            if (robust != null) {
                out.print(RobustSetsReport.render(robust));
            }
            if (sensitivity) {
                out.print("\n" + SensitivityReport.render(grid, FitReport.mainParameters(spec,
                        prepared.moments().parameterNames())));
            }
            if (bootstrapResult != null) {
                out.print(BootstrapReport.render(bootstrapResult));
            }
            if (folder != null) {
                out.println("\nReport folder: " + CheckReport.display(folder));
            }
            out.flush();
        }
        return Main.EXIT_OK;
    }

    /** The HJ seed of the fit and, with --bootstrap, the bootstrap's seed. */
    private static java.util.Map<String, Long> seeds(GmmFit fit, FitBootstrap.Result bootstrap) {
        java.util.Map<String, Long> seeds = new java.util.TreeMap<>(Manifest.seeds(fit));
        if (bootstrap != null) {
            seeds.put("bootstrap", bootstrap.seed());
        }
        return seeds;
    }
}
