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
        Table.Builder wide = Table.builder("wide", "Ten columns of long numbers", "model", "test", "statistic", "df",
                "p-value", "HJ distance", "HJ p-value", "cross-sectional R²", "mean |α|", "RMS α");
        Table.Builder symbols = Table.builder("symbols", "Parameters", "parameter", "estimate");
        for (String name : List.of("beta", "gamma", "psi", "a", "b_MKT", "mu_SIZE", "b_MKT*z_growth")) {
            symbols.row(Cell.parameter(name), Cell.number(1.25));
        }
        Table.Builder long_ = Table.builder("long", "Sixty-nine rows", "kernel", "bandwidth", "p-value");
        for (int i = 0; i < 60; i++) {
            wide.row(Cell.text("(" + i + ") a fairly long model label"), Cell.text("hansen-j"), Cell.fixed(123.456789, 3),
                    Cell.count(10), Cell.fixed(0.1234, 4), Cell.number(0.123456), Cell.fixed(0.5, 4),
                    Cell.fixed(0.4321, 4), Cell.number(0.00123456), Cell.number(0.00234567));
            long_.row(Cell.text("quadratic-spectral"), Cell.text("b = " + i), Cell.fixed(i / 60.0, 4));
            if (i == 8) {
                break;
            }
        }
        for (int i = 0; i < 60; i++) {
            long_.row(Cell.text("bartlett"), Cell.text("lags " + i), Cell.fixed(i / 60.0, 4));
        }
        String document = LatexTables.standalone(List.of(LatexTables.write(Samples.parameters(), "run"),
                LatexTables.write(Samples.awkward(), "run"), LatexTables.write(wide.build(), "run"),
                LatexTables.write(symbols.build(), "run"), LatexTables.write(long_.build(), "run")));
        Files.writeString(folder.resolve("tables.tex"), document);
        Process process = new ProcessBuilder("pdflatex", "-interaction=nonstopmode", "-halt-on-error",
                "-no-shell-escape", "tables.tex").directory(folder.toFile()).redirectErrorStream(true)
                .redirectOutput(folder.resolve("pdflatex.out").toFile()).start();
        assertThat(process.waitFor(120, TimeUnit.SECONDS)).as("pdflatex finished").isTrue();
        String log = Files.readString(folder.resolve("pdflatex.out"));
        assertThat(process.exitValue()).as(log).isZero();
        assertThat(log).doesNotContain("Missing character").doesNotContain("Undefined control sequence")
                .as("every table fits the text width").doesNotContain("Overfull \\hbox");
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
