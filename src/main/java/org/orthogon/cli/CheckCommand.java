package org.orthogon.cli;

import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.orthogon.report.CheckReport;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;
import org.orthogon.spec.StabilitySpec;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;

/** {@code check MODEL.toml}: validate the model file and its data, estimate nothing. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Reads the model file and every data file it names, aligns them and builds the moment "
                + "conditions without estimating: prints the sample, T, N, K, P, the inputs and every warning.",
            "Everything `fit` (and, for a [stability] section, `stability`) would refuse about the model file and "
                + "its data is refused here.",
            "Exits with 2 and one message naming the file, line and fix at the first problem."})
final class CheckCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL.toml", description = "the model file")
    Path modelFile;

    @Mixin
    EstimationOverrides overrides;

    @picocli.CommandLine.Option(names = "--debug", description = "show a stack trace when Orthogon itself fails")
    boolean debug;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        RunSpec spec = overrides.apply(ModelFile.read(modelFile));
        PreparedRun prepared = ModelAssembler.prepare(spec);
        // A [stability] section is checked the way `stability MODEL.toml` would run it.
        StabilitySpec.Plan stability = spec.keyLines().containsKey("stability")
                ? spec.stability().plan(spec, prepared, true) : null;
        commandSpec.commandLine().getOut().print(CheckReport.render(spec, prepared, stability));
        commandSpec.commandLine().getOut().flush();
        return Main.EXIT_OK;
    }
}
