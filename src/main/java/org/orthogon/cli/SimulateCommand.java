package org.orthogon.cli;

import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.List;
import java.util.concurrent.Callable;
import org.orthogon.data.InputException;
import org.orthogon.demo.DemoData;
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code simulate --out DIR}: write the invented Isle of Lumen data (docs/demo-scenario.md). */
@Command(name = "simulate", mixinStandardHelpOptions = true,
        description = {"Writes the Isle of Lumen demo economy: monthly returns of 12 size/tide portfolios, "
                + "a risk-free rate, the MKT, SIZE and TIDE factors, and quarterly consumption growth.",
            "With the default seed and years the files equal the shipped demo-data/."})
final class SimulateCommand implements Callable<Integer> {
    @Option(names = "--out", paramLabel = "DIR", defaultValue = "demo-data", description = "output folder (default ${DEFAULT-VALUE})")
    Path out;

    @Option(names = "--seed", paramLabel = "N", description = "random seed (default: the demo seed)")
    Long seed;

    @Option(names = "--years", paramLabel = "N", description = "number of years from 1962 (default: 63, to 2024)")
    Integer years;

    @Option(names = "--quiet", description = "print nothing on success")
    boolean quiet;

    @Option(names = "--overwrite", description = "replace demo files that already exist in the output folder")
    boolean overwrite;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec commandSpec;

    @Override
    public Integer call() {
        int count = years == null ? LumenSimulator.LAST_YEAR - LumenSimulator.FIRST_YEAR + 1 : years;
        if (count < 1 || count > 1000) {
            throw InputException.general().problem("--years " + count + " is out of range", "give 1 to 1000 years");
        }
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, LumenSimulator.FIRST_YEAR, count,
                seed == null ? LumenSimulator.DEMO_SEED : seed);
        Path folder = out == null ? Paths.get("demo-data") : out;
        refuseToOverwrite(folder);
        List<Path> files = new java.util.ArrayList<>(DemoData.write(economy, sample, folder));
        files.addAll(DemoData.writeExtensions(economy, sample, seed == null ? LumenSimulator.DEMO_SEED : seed, folder));
        if (!quiet) {
            for (Path file : files) {
                commandSpec.commandLine().getOut().println("wrote " + file);
            }
        }
        return Main.EXIT_OK;
    }

    /** Without --overwrite, existing demo files are never replaced: the folder may hold someone's edited copy. */
    private void refuseToOverwrite(Path folder) {
        if (java.nio.file.Files.exists(folder) && !java.nio.file.Files.isDirectory(folder)) {
            throw InputException.in(folder).problem("this is a file, not a folder", "give a folder with --out");
        }
        if (overwrite) {
            return;
        }
        List<String> existing = new java.util.ArrayList<>();
        for (String name : DemoData.ALL_FILES) {
            if (java.nio.file.Files.exists(folder.resolve(name))) {
                existing.add(name);
            }
        }
        if (!existing.isEmpty()) {
            throw InputException.in(folder).problem("the folder already holds " + existing.size() + " of the demo files ("
                    + String.join(", ", existing.subList(0, Math.min(3, existing.size())))
                    + (existing.size() > 3 ? ", ..." : "") + ")", "add --overwrite to replace them, or give another "
                    + "folder with --out");
        }
    }
}
