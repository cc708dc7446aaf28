package org.orthogon.report;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.data.InputException;

class OutputFolderTest {
    @TempDir
    Path root;

    @Test
    void nothingIsVisibleUntilPublishedAndAnAbandonedFolderLeavesNoTrace() throws IOException {
        Path target = root.resolve("reports/tide");
        try (OutputFolder folder = OutputFolder.create(target, false)) {
            folder.write("tables/a.csv", "x\n1\n");
            assertThat(Files.exists(target)).isFalse();
        }
        assertThat(Files.exists(target)).isFalse();
        assertThat(list(root.resolve("reports"))).isEmpty();
    }

    @Test
    void publishedFilesCarryTheHashesRecordedForThem() throws IOException {
        Path target = root.resolve("tide");
        try (OutputFolder folder = OutputFolder.create(target, false)) {
            folder.write("b.txt", "ebb");
            folder.write("a.txt", "flood");
            assertThat(folder.names()).containsExactly("b.txt", "a.txt");
            assertThat(folder.written().get("a.txt"))
                    .isEqualTo(Hashes.sha256("flood".getBytes(StandardCharsets.UTF_8)));
            // SHA-256 of "ebb", computed outside Java: printf ebb | sha256sum
            assertThat(folder.written().get("b.txt"))
                    .isEqualTo("79571a56229fead48072831402cf3d9c05d9663c177d30e9468fba9ce05fd56e");
            assertThat(folder.publish()).isEqualTo(target.toAbsolutePath());
        }
        assertThat(Files.readString(target.resolve("a.txt"))).isEqualTo("flood");
        assertThat(list(root)).containsExactly("tide");
    }

    @Test
    void anEmptyFolderIsUsedAndNamesOutsideTheFolderAreRefused() throws IOException {
        Path target = Files.createDirectories(root.resolve("empty"));
        try (OutputFolder folder = OutputFolder.create(target, false)) {
            assertThatThrownBy(() -> folder.write("../escape.txt", "x")).isInstanceOf(IllegalArgumentException.class);
            folder.write("report.html", "<p>tide</p>");
            folder.publish();
        }
        assertThat(list(target)).containsExactly("report.html");
        assertThatThrownBy(() -> OutputFolder.check(target, false)).isInstanceOf(InputException.class)
                .hasMessageContaining("already holds a report");
        OutputFolder.check(target, true);
    }

    private static List<String> list(Path folder) throws IOException {
        try (Stream<Path> files = Files.list(folder)) {
            return files.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }
}
