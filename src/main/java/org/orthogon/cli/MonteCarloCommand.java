package org.orthogon.cli;

import java.nio.file.Path;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.orthogon.bootstrap.Alternative;
import org.orthogon.bootstrap.BootstrapPlan;
import org.orthogon.bootstrap.MonteCarlo;
import org.orthogon.data.InputException;
import org.orthogon.data.Suggestions;
import org.orthogon.gmm.GmmFit;
import org.orthogon.report.CheckReport;
import org.orthogon.report.JsonResults;
import org.orthogon.report.Manifest;
import org.orthogon.report.MonteCarloReport;
import org.orthogon.report.ReportFiles;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import tools.jackson.databind.node.ObjectNode;

/** {@code montecarlo MODEL.toml}: how often do the asymptotic tests reject in samples like this one? */
@Command(name = "montecarlo", mixinStandardHelpOptions = true,
        description = {"Simulates samples like the model file's (same T, the same moments, the serial dependence "
                + "kept in blocks) from the recentred block bootstrap of the fitted model, so that the fitted "
                + "parameters are the truth and the moment conditions hold; fits each with the model file's "
                + "estimator and reports how often the J test, the joint pricing-error test and each parameter's "
                + "t test reject at 1, 5 and 10%, with Monte Carlo standard errors.",
            "--alternative turns the rates into power against stated pricing errors or parameter values."})
final class MonteCarloCommand implements Callable<Integer> {
    /** Replications when none are given. */
    static final int DEFAULT_REPLICATIONS = 1000;
    /** Fewest replications accepted: fewer give rates with Monte Carlo standard errors near 0.1. */
    static final int MIN_REPLICATIONS = 10;

    @Parameters(index = "0", paramLabel = "MODEL.toml", description = "the model file")
    Path modelFile;

    @Mixin
    EstimationOverrides overrides;

    @Option(names = "--replications", paramLabel = "R", description = "simulated samples (default "
            + DEFAULT_REPLICATIONS + ")")
    Integer replications;

    @Option(names = "--seed", paramLabel = "S", description = "seed of the draws (default "
            + BootstrapPlan.DEFAULT_SEED + ")")
    Long seed;

    @Option(names = "--block-length", paramLabel = "L", description = "rows per block (default: the Politis-White "
            + "2004 rule on the moment contributions)")
    Integer blockLength;

    @Option(names = "--block-scheme", paramLabel = "SCHEME", description = "moving (the default) or circular blocks")
    String scheme;

    @Option(names = "--alternative", paramLabel = "TEXT", description = "power against an alternative: "
            + "\"MOMENT = e\" adds a pricing error e (decimals per period) to a moment of the simulated population, "
            + "\"PARAMETER = d\" tests that parameter at its truth + d; several joined by commas, e.g. "
            + "\"P01 = 0.002, gamma = 1\"")
    String alternative;

    @Mixin
    ResultOptions output;

    @Mixin
    ThreadsOption threads;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        Instant started = Instant.now();
        String folderName = ResultOptions.stem(modelFile) + "-montecarlo";
        output.checkEarly(folderName);
        int threadCount = threads.count();
        int draws = replications == null ? DEFAULT_REPLICATIONS : replications;
        if (draws < MIN_REPLICATIONS || draws > BootstrapPlan.MAX_REPLICATIONS) {
            throw InputException.general().problem("--replications " + draws + " is outside " + MIN_REPLICATIONS
                    + ".." + BootstrapPlan.MAX_REPLICATIONS, "give at least " + MIN_REPLICATIONS
                    + " replications, e.g. --replications 1000 (Monte Carlo standard error of a 5% rate: 0.007)");
        }
        BootstrapOptions.blockLength(blockLength, Integer.MAX_VALUE);
        BootstrapOptions.scheme(scheme);
        RunSpec spec = overrides.apply(ModelFile.read(modelFile));
        FittedRun run = FittedRun.of(spec);
        PreparedRun prepared = run.prepared();
        GmmFit fit = run.fit();
        int observations = prepared.sample().observations();
        BootstrapPlan plan = new BootstrapPlan(draws, BootstrapOptions.blockLength(blockLength, observations),
                BootstrapOptions.scheme(scheme), seed == null ? BootstrapPlan.DEFAULT_SEED : seed);
        Alternative stated = alternative == null ? Alternative.none()
                : parseAlternative(alternative, prepared.moments().momentNames(), prepared.moments().parameterNames());
        MonteCarlo.Result result;
        try (Progress progress = Progress.start("Monte Carlo", draws)) {
            result = MonteCarlo.run(prepared.moments(), fit, FittedRun.options(spec, prepared), plan, stated,
                    threadCount, progress);
        }
        ObjectNode json = MonteCarloReport.json(spec, prepared.sample(), fit, result);
        if (output.json != null) {
            OutputFiles.writeAtomically(output.json, JsonResults.text(json));
        }
        Path folder = null;
        if (output.requested()) {
            folder = ReportFiles.publish(output.target(folderName), output.overwrite,
                    MonteCarloReport.document(spec, prepared.sample(), fit, result), json,
                    new Manifest.Run("montecarlo", commandSpec.commandLine().getParseResult().originalArgs(),
                            Version.current(), started, Map.of("montecarlo", plan.seed())),
                    List.of(spec), List.of(prepared.inputs()));
        }
        if (!output.quiet) {
            commandSpec.commandLine().getOut().print(MonteCarloReport.render(spec, prepared.sample(), fit, result));
            if (folder != null) {
                commandSpec.commandLine().getOut().println("\nReport folder: " + CheckReport.display(folder));
            }
            commandSpec.commandLine().getOut().flush();
        }
        return Main.EXIT_OK;
    }

    /**
     * "NAME = VALUE, NAME = VALUE": a moment's name adds a pricing error, a parameter's name shifts the value
     * its t test tests. Refuses unknown or ambiguous names, repeated names and values that are not finite
     * numbers.
     */
    static Alternative parseAlternative(String text, List<String> moments, List<String> parameters) {
        Map<String, Double> errors = new LinkedHashMap<>();
        Map<String, Double> shifts = new LinkedHashMap<>();
        for (String part : text.split(",")) {
            String[] sides = part.split("=", -1);
            if (sides.length != 2 || sides[0].isBlank()) {
                throw InputException.general().problem("--alternative \"" + part.trim() + "\" is not NAME = VALUE",
                        "write each part as NAME = VALUE, parts joined by commas, e.g. --alternative \""
                                + moments.get(0) + " = 0.002\"");
            }
            String name = sides[0].trim();
            double value;
            try {
                value = Double.parseDouble(sides[1].trim());
            } catch (NumberFormatException e) {
                value = Double.NaN;
            }
            if (!Double.isFinite(value)) {
                throw InputException.general().problem("--alternative: the value of " + name + ", \"" + sides[1].trim()
                        + "\", is not a finite number", "give a number in decimals, e.g. " + name + " = 0.002");
            }
            boolean moment = moments.contains(name);
            boolean parameter = parameters.contains(name);
            if (moment && parameter) {
                throw InputException.general().problem("--alternative: \"" + name + "\" names both a moment and a "
                        + "parameter", "rename the test asset or the parameter in the model file so the two differ");
            }
            if (!moment && !parameter) {
                List<String> known = new java.util.ArrayList<>(moments);
                known.addAll(parameters);
                throw InputException.general().problem("--alternative: \"" + name + "\" is neither a moment nor a "
                        + "parameter" + Suggestions.didYouMean(name, known), "use a moment name (" + moments.get(0)
                        + ", ...) or a parameter name (" + String.join(", ", parameters) + ")");
            }
            Map<String, Double> target = moment ? errors : shifts;
            if (target.put(name, value) != null) {
                throw InputException.general().problem("--alternative names " + name + " twice",
                        "give each name once");
            }
        }
        return new Alternative(errors, shifts);
    }
}
