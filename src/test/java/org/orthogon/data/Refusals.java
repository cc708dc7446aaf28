package org.orthogon.data;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.assertj.core.api.ThrowableAssert.ThrowingCallable;

/** Helpers shared by the data tests: writing small files and checking a refusal says where and how. */
final class Refusals {
    private Refusals() {
    }

    static Path file(Path dir, String name, String content) {
        try {
            Path file = dir.resolve(name);
            Files.writeString(file, content, StandardCharsets.UTF_8);
            return file;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The refusal thrown by {@code call}, after checking it names the file and carries a fix. */
    static InputException refusal(ThrowingCallable call, Path file) {
        InputException e = catchThrowableOfType(InputException.class, call);
        assertThat(e).as("an InputException").isNotNull();
        assertThat(e.file()).contains(file);
        assertThat(e.getMessage()).startsWith(file.toString()).contains("fix: ");
        assertThat(e.fix()).isNotBlank();
        return e;
    }

    /** As {@link #refusal}, and checks the line and column, both in the fields and in the text. */
    static InputException refusalAt(ThrowingCallable call, Path file, int line, int column) {
        InputException e = refusal(call, file);
        assertThat(e.line()).as("line").isEqualTo(line);
        assertThat(e.getMessage()).contains("line " + line);
        assertThat(e.column()).as("column").isEqualTo(column);
        if (column > 0) {
            assertThat(e.getMessage()).contains("column " + column);
        }
        return e;
    }
}
