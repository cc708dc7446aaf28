package org.orthogon.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import org.orthogon.data.InputException;
import org.orthogon.report.OutputFolder;

/** Writing results so that a reader never sees a half-written file. */
final class OutputFiles {
    private OutputFiles() {
    }

    /** Writes {@code text} to a temporary file beside {@code target}, then moves it into place. */
    static void writeAtomically(Path target, String text) {
        Path absolute = target.toAbsolutePath();
        Path folder = absolute.getParent();
        if (Files.isDirectory(absolute)) {
            throw InputException.in(target).problem("this is a folder, not a file name",
                    "give a file name for the JSON output, e.g. results.json");
        }
        if (folder == null || !Files.isDirectory(folder)) {
            throw InputException.in(target).problem("the folder for this output file does not exist",
                    "create the folder first or write somewhere else");
        }
        Path temporary = null;
        try {
            temporary = OutputFolder.createHidden(folder, ".orthogon-part-", false);
            Files.writeString(temporary, text, StandardCharsets.UTF_8);
            try {
                Files.move(temporary, absolute, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(temporary, absolute, StandardCopyOption.REPLACE_EXISTING);
            }
        } catch (IOException e) {
            throw InputException.in(target).problem("cannot write this file: " + e.getMessage(),
                    "check that the folder is writable and the disk is not full");
        } finally {
            if (temporary != null) {
                try {
                    Files.deleteIfExists(temporary);
                } catch (IOException ignored) {
                    // the move succeeded or the write failed; nothing more to clean
                }
            }
        }
    }
}
