package org.orthogon.cli;

import java.nio.file.Path;
import org.orthogon.report.OutputFolder;
import picocli.CommandLine.Option;

/** Where a command's results go (--json, --out, --overwrite) and how loud it is (--quiet, --debug). */
final class ResultOptions {
    @Option(names = "--json", paramLabel = "FILE", description = "also write the results as JSON to FILE")
    Path json;

    @Option(names = "--quiet", description = "print nothing on success (errors still go to standard error)")
    boolean quiet;

    @Option(names = "--debug", description = "show a stack trace when Orthogon itself fails")
    boolean debug;

    @Option(names = "--out", paramLabel = "DIR", arity = "0..1", fallbackValue = "",
            description = "also write the output folder (results.json, tables, charts, report.html, manifest.json) "
                    + "to DIR; --out alone writes out/<name>/ (put it after the model files)")
    Path out;

    @Option(names = "--overwrite", description = "let --out replace a folder that already holds a report")
    boolean overwrite;

    boolean requested() {
        return out != null;
    }

    /** The folder to write: the one given, or out/{@code defaultName}. */
    Path target(String defaultName) {
        return out.toString().isEmpty() ? Path.of("out", defaultName) : out;
    }

    /** Refuses an unusable folder before any estimation, so a bad --out costs nothing. */
    void checkEarly(String defaultName) {
        if (requested()) {
            OutputFolder.check(target(defaultName), overwrite);
        }
    }

    /** A model file's name without ".toml", the default folder name. */
    static String stem(Path modelFile) {
        String name = modelFile.getFileName().toString();
        return name.endsWith(".toml") ? name.substring(0, name.length() - 5) : name;
    }
}
