package org.orthogon;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.Locale;

/**
 * Where tests put the figures they measure beside their assertions (Monte Carlo rejection rates,
 * simulated critical values, distances from reference values): appended to
 * {@code target/test-log/<Class>.txt}, so {@code mvn -q verify} stays silent and the figures are
 * still there to read after a build. With {@code -Dorthogon.test.verbose=true} they are also printed.
 */
public final class TestLog {
    /** The folder the logs are written to, relative to the project root (Surefire's working folder). */
    public static final Path FOLDER = Path.of("target", "test-log");

    private TestLog() {
    }

    /** Formats like {@link String#format} (root locale) and appends one line to the calling class's log. */
    public static void printf(Class<?> caller, String format, Object... args) {
        String line = String.format(Locale.ROOT, format, args);
        if (!line.endsWith("\n")) {
            line += System.lineSeparator();
        }
        if (Boolean.getBoolean("orthogon.test.verbose")) {
            System.out.print(line);
        }
        append(FOLDER.resolve(caller.getSimpleName() + ".txt"), line);
    }

    private static synchronized void append(Path file, String line) {
        try {
            Files.createDirectories(file.getParent());
            Files.writeString(file, line, StandardCharsets.UTF_8, StandardOpenOption.CREATE, StandardOpenOption.APPEND);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the test log " + file, e);
        }
    }
}
