package org.orthogon.cli;

import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.orthogon.data.InputException;
import org.orthogon.report.CheckReport;
import org.orthogon.report.JsonResults;
import org.orthogon.report.Manifest;
import org.orthogon.report.ReportFiles;
import org.orthogon.report.TwoPassReport;
import org.orthogon.spec.BetaPricingSpec;
import org.orthogon.spec.LinearFactorSpec;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import org.orthogon.twopass.FactorSample;
import org.orthogon.twopass.TwoPassResult;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import tools.jackson.databind.node.ObjectNode;

/** {@code two-pass MODEL.toml}: time-series and cross-sectional regressions of a linear factor model. */
@Command(name = "two-pass", mixinStandardHelpOptions = true,
        description = {"Runs the two-pass regressions of a linear-factor model file: one time-series regression per "
                + "test asset (alphas and the GRS test that all are zero), then the cross-sectional regressions of "
                + "mean excess returns on the full-sample betas, by OLS and GLS, with Fama-MacBeth, Shanken and "
                + "misspecification-robust standard errors and the cross-sectional R2.",
            "Reads the [data] and [model] sections of an ordinary linear-factor model file; [estimation] is not used."})
final class TwoPassCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL.toml", description = "a linear-factor model file")
    Path modelFile;

    @Mixin
    ResultOptions output;

    @Option(names = "--no-intercept", description = "leave out the zero-beta rate: the cross section passes "
            + "through the origin, so the model must also price the level of excess returns")
    boolean noIntercept;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        Instant started = Instant.now();
        String folderName = ResultOptions.stem(modelFile) + "-two-pass";
        output.checkEarly(folderName);
        RunSpec spec = ModelFile.read(modelFile);
        requireLinearFactor(spec);
        PreparedRun prepared = ModelAssembler.prepare(spec);
        FactorSample sample = prepared.factorSample().orElseThrow();
        requireSizes(spec, sample);
        TwoPassResult result = TwoPassResult.of(sample, !noIntercept);
        ObjectNode results = TwoPassReport.json(spec, prepared.sample(), result);
        if (output.json != null) {
            OutputFiles.writeAtomically(output.json, JsonResults.text(results));
        }
        Path folder = null;
        if (output.requested()) {
            folder = ReportFiles.publish(output.target(folderName), output.overwrite,
                    TwoPassReport.build(spec, prepared.sample(), result, prepared.notes()), results,
                    new Manifest.Run("two-pass", commandSpec.commandLine().getParseResult().originalArgs(),
                            Version.current(), started, Map.of()),
                    List.of(spec), List.of(prepared.inputs()));
        }
        if (!output.quiet) {
            var out = commandSpec.commandLine().getOut();
            out.print(TwoPassReport.render(spec, prepared.sample(), result, prepared.notes()));
            if (folder != null) {
                out.println("\nReport folder: " + CheckReport.display(folder));
            }
            out.flush();
        }
        return Main.EXIT_OK;
    }

    private static void requireLinearFactor(RunSpec spec) {
        if (!(spec.model() instanceof LinearFactorSpec) && !(spec.model() instanceof BetaPricingSpec)) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "family"))
                    .problem("two-pass regressions need a linear factor model, but this file has family = \""
                            + spec.model().family().id() + "\"",
                            "use a model file with family = \"linear-factor\" (or \"beta-pricing\") and factor_columns, "
                                    + "or run `fit`");
        }
        if (!spec.model().instrumentColumns().isEmpty()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "instrument_columns"))
                    .problem("two-pass regressions use the unscaled excess returns, but instrument_columns scales "
                            + "the moments", "remove instrument_columns for this command (factor_instruments may stay)");
        }
    }

    private static void requireSizes(RunSpec spec, FactorSample sample) {
        int t = sample.periods();
        int n = sample.assetCount();
        int k = sample.factorCount();
        if (n < k + 2) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "factor_columns"))
                    .problem("the cross-sectional regression has " + n + " test assets for " + k + " factors and an "
                            + "intercept, so nothing is left to test", "use at least K + 2 test assets");
        }
        if (t <= n + k) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", spec.data().start().isPresent()
                    ? "start" : "returns")).problem("the sample has T = " + t + " periods for N = " + n
                    + " test assets and K = " + k + " factors; the GRS test needs T > N + K",
                    "widen the sample (start/end under [data]) or use fewer test assets");
        }
    }
}
