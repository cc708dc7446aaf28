package org.orthogon.cli;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.orthogon.analysis.CommonWeightComparison;
import org.orthogon.analysis.ModelComparison;
import org.orthogon.analysis.VolatilityBound;
import org.orthogon.gmm.EstimationException;
import org.orthogon.report.CommonWeightReport;
import org.orthogon.twopass.EqualR2Test;
import org.orthogon.twopass.Weighting;
import org.orthogon.data.InputException;
import org.orthogon.report.CheckReport;
import org.orthogon.report.ComparisonDocument;
import org.orthogon.report.ComparisonReport;
import org.orthogon.report.Manifest;
import org.orthogon.report.ReportFiles;
import org.orthogon.report.JsonResults;
import org.orthogon.spec.BetaPricingSpec;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.RunSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import tools.jackson.databind.node.ObjectNode;

/** {@code compare A.toml B.toml ...}: several models on the same test assets and sample, side by side. */
@Command(name = "compare", mixinStandardHelpOptions = true,
        description = {"Fits several model files that price the same test assets over the same sample and shows "
                + "them side by side: parameters, the overidentification test, the cross-sectional R2 and pricing "
                + "errors; nested linear SDFs get the Newey-West (1987) difference test.",
            "Estimation options given here apply to every model."})
final class CompareCommand implements Callable<Integer> {
    @Parameters(arity = "2..*", paramLabel = "MODEL.toml", description = "two or more model files")
    List<Path> modelFiles;

    @Mixin
    EstimationOverrides overrides;

    @Mixin
    ResultOptions output;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        Instant started = Instant.now();
        String folderName = "compare-" + modelFiles.stream().map(ResultOptions::stem)
                .collect(java.util.stream.Collectors.joining("-"));
        output.checkEarly(folderName);
        List<FittedRun> runs = new ArrayList<>();
        for (Path file : modelFiles) {
            RunSpec spec = overrides.apply(ModelFile.read(file));
            if (spec.model() instanceof BetaPricingSpec) {
                throw InputException.in(file).line(spec.lineOf("model", "family"))
                        .problem("compare sets stochastic discount factors side by side at a common weight, but the "
                                + "beta-pricing family has none (its moments are regressions)",
                                "fit it alone with `fit`, or compare its factors as family = \"linear-factor\" models "
                                        + "(form = \"demeaned\" also estimates the risk premia)");
            }
            FittedRun run = FittedRun.of(spec);
            if (!runs.isEmpty()) {
                requireSameAssetsAndSample(runs.get(0), run);
            }
            runs.add(run);
        }
        List<ModelComparison.Entry> entries = runs.stream().map(run -> new ModelComparison.Entry(run.spec().title(),
                run.prepared().moments(), run.prepared().startValues(), run.fit())).toList();
        ModelComparison.Result result = ModelComparison.compare(entries);
        var sample = runs.get(0).prepared().sample();
        String sampleLine = sample.frequency() + " " + sample.start() + " to " + sample.end() + " (T = "
                + sample.observations() + ")";
        List<ObjectNode> fits = runs.stream()
                .map(run -> JsonResults.fit(run.spec(), run.prepared().sample(), run.fit())).toList();
        CommonWeightReport common = commonWeight(runs, entries);
        ObjectNode results = ComparisonReport.json(result, fits);
        common.addTo(results);
        if (output.json != null) {
            OutputFiles.writeAtomically(output.json, JsonResults.text(results));
        }
        Path folder = null;
        if (output.requested()) {
            folder = ReportFiles.publish(output.target(folderName), output.overwrite,
                    ComparisonDocument.build(result, sampleLine, common, folderName), results,
                    new Manifest.Run("compare", commandSpec.commandLine().getParseResult().originalArgs(),
                            Version.current(), started, seeds(runs)),
                    runs.stream().map(FittedRun::spec).toList(), runs.stream().map(run -> run.prepared().inputs()).toList());
        }
        if (!output.quiet) {
            commandSpec.commandLine().getOut().print(ComparisonReport.render(result, sampleLine, common.render()));
            if (folder != null) {
                commandSpec.commandLine().getOut().println("\nReport folder: " + CheckReport.display(folder));
            }
            commandSpec.commandLine().getOut().flush();
        }
        return Main.EXIT_OK;
    }

    /**
     * The models at the common second-moment weight with the Kan-Robotti tests, the KRS tests of equal
     * two-pass R² between linear-factor models, and the volatility bound; seeds and draws of the simulated
     * limits come from the first model file's Hansen-Jagannathan settings.
     */
    private static CommonWeightReport commonWeight(List<FittedRun> runs, List<ModelComparison.Entry> entries) {
        RunSpec first = runs.get(0).spec();
        long seed = first.estimation().hjSeed();
        int draws = first.estimation().hjDraws();
        CommonWeightComparison.Result common = CommonWeightComparison.compare(entries,
                first.estimation().longRunOptions(), seed, draws);
        List<String> notes = new ArrayList<>(common.notes());
        List<EqualR2Test.Result> r2Tests = new ArrayList<>();
        for (int i = 0; i < runs.size(); i++) {
            for (int j = i + 1; j < runs.size(); j++) {
                FittedRun a = runs.get(i);
                FittedRun b = runs.get(j);
                if (a.prepared().factorSample().isEmpty() || b.prepared().factorSample().isEmpty()
                        || !a.spec().model().instrumentColumns().isEmpty()) {
                    continue;
                }
                try {
                    r2Tests.add(EqualR2Test.compare(a.spec().title(), a.prepared().factorSample().get(),
                            b.spec().title(), b.prepared().factorSample().get(), Weighting.OLS, true, seed, draws));
                } catch (IllegalArgumentException | EstimationException e) {
                    notes.add("no test of equal R2 for " + a.spec().title() + " and " + b.spec().title() + ": "
                            + e.getMessage());
                }
            }
        }
        VolatilityBound bound = null;
        if (!common.models().isEmpty()) {
            bound = VolatilityBound.of(common.payoffModel(), common.models().get(0).estimates(),
                    common.models().stream().map(CommonWeightComparison.ModelAtCommonWeight::title).toList(),
                    common.models().stream().map(CommonWeightComparison.ModelAtCommonWeight::discountFactor).toList());
        }
        return new CommonWeightReport(common, r2Tests, bound, notes);
    }

    /**
     * Every seed the comparison drew with: each model's Hansen-Jagannathan p-value, and the simulated limits
     * of the common-weight tests, which use the first model file's HJ seed.
     */
    private static Map<String, Long> seeds(List<FittedRun> runs) {
        Map<String, Long> seeds = new java.util.TreeMap<>(Manifest.seeds(runs.stream().map(FittedRun::fit).toList()));
        seeds.put("common_weight", runs.get(0).spec().estimation().hjSeed());
        return seeds;
    }

    private static void requireSameAssetsAndSample(FittedRun first, FittedRun other) {
        if (!first.prepared().moments().momentNames().equals(other.prepared().moments().momentNames())) {
            throw InputException.in(other.spec().modelFile()).problem("this model prices the moments "
                    + other.prepared().moments().momentNames() + " but " + first.spec().modelFile().getFileName()
                    + " prices " + first.prepared().moments().momentNames(),
                    "compare models on the same test assets (and instruments)");
        }
        var a = first.prepared().sample();
        var b = other.prepared().sample();
        if (!a.equals(b)) {
            throw InputException.in(other.spec().modelFile()).problem("this model's sample is " + b.frequency() + " "
                    + b.start() + " to " + b.end() + " (T = " + b.observations() + ") but "
                    + first.spec().modelFile().getFileName() + " uses " + a.frequency() + " " + a.start() + " to "
                    + a.end() + " (T = " + a.observations() + ")",
                    "set the same start and end under [data] in both model files");
        }
    }
}
