package org.orthogon.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/**
 * The run that writes the class-data-sharing archive at package time (the build runs it under
 * {@code -XX:ArchiveClassesAtExit}): the everyday verbs, each once, on the bundled demo models, in one
 * JVM, so that the archive holds the classes of a fit with a report folder, a comparison, the two-pass
 * regressions, a stability run and a model check, and not only those of a bare fit. Not a verb: it is the
 * build's, and it fails the build (exit 1) if any of those runs does not succeed, because then the archive
 * would be trained on an error path.
 */
public final class ClassDataTraining {
    private ClassDataTraining() {
    }

    /** args[0]: a scratch folder for the runs' outputs (created; its content is replaced). */
    public static void main(String[] args) throws IOException {
        System.setProperty("java.awt.headless", "true");
        Path scratch = Files.createDirectories(Path.of(args[0]));
        List<String[]> runs = List.of(
                new String[] {"check", "models/lumen-power-utility.toml"},
                new String[] {"fit", "models/lumen-three-factor.toml", "--json", scratch.resolve("fit.json").toString()},
                new String[] {"fit", "models/lumen-power-utility.toml", "--out", scratch.resolve("report").toString(),
                    "--overwrite"},
                new String[] {"compare", "models/lumen-three-factor.toml", "models/lumen-market-only.toml"},
                new String[] {"two-pass", "models/lumen-two-pass.toml"},
                new String[] {"stability", "models/lumen-three-factor.toml", "--window", "240", "--step", "120"});
        PrintWriter console = new PrintWriter(Writer.nullWriter()); // formatted, so its classes are archived too
        for (String[] run : runs) {
            StringWriter errors = new StringWriter();
            int code = Main.run(console, new PrintWriter(errors), run);
            if (code != Main.EXIT_OK) {
                System.err.println("class-data training: `orthogon " + String.join(" ", run) + "` exited " + code
                        + ":\n" + errors);
                System.exit(Main.EXIT_BUG);
            }
        }
    }
}
