package org.orthogon.report;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Compiles the LaTeX tables with pdflatex; skipped where no TeX engine is installed. */
class LatexCompileTest {
    @TempDir
    Path folder;

    @Test
    void tablesCompileWithPdflatex() throws IOException, InterruptedException {
        assumeTrue(onPath("pdflatex"), "pdflatex is not installed");
        String document = LatexTables.standalone(List.of(LatexTables.write(Samples.parameters()),
                LatexTables.write(Samples.awkward())));
        Files.writeString(folder.resolve("tables.tex"), document);
        Process process = new ProcessBuilder("pdflatex", "-interaction=nonstopmode", "-halt-on-error",
                "-no-shell-escape", "tables.tex").directory(folder.toFile()).redirectErrorStream(true)
                .redirectOutput(folder.resolve("pdflatex.out").toFile()).start();
        assertThat(process.waitFor(120, TimeUnit.SECONDS)).as("pdflatex finished").isTrue();
        String log = Files.readString(folder.resolve("pdflatex.out"));
        assertThat(process.exitValue()).as(log).isZero();
        assertThat(log).doesNotContain("Missing character").doesNotContain("Undefined control sequence");
        assertThat(Files.size(folder.resolve("tables.pdf"))).isGreaterThan(1000);
    }

    private static boolean onPath(String program) {
        String path = System.getenv("PATH");
        if (path == null) {
            return false;
        }
        for (String dir : path.split(File.pathSeparator)) {
            if (Files.isExecutable(Path.of(dir, program))) {
                return true;
            }
        }
        return false;
    }
}
