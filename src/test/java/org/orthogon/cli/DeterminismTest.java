package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/**
 * The same inputs give byte-identical results.json, and the same manifest apart from its start
 * time: twice in one JVM, and in two JVMs that run the sensitivity grid (the one parallel part of a
 * fit) on one and on two worker threads.
 */
class DeterminismTest {
    @TempDir
    Path root;
    CliHarness cli;
    Path model;

    @BeforeEach
    void copyProject() throws IOException {
        cli = new CliHarness(root);
        model = cli.models.resolve("lumen-power-utility.toml");
    }

    /** The two files of one run, read before the folder is removed for the next run. */
    private record Outcome(byte[] results, String manifestWithoutStart) {
    }

    @Test
    void fitTwiceInOneJvmGivesTheSameBytes() throws IOException {
        Path out = root.resolve("A");
        List<Outcome> outcomes = new ArrayList<>();
        for (int run = 0; run < 2; run++) {
            CliHarness.Result result = cli.run("fit", model.toString(), "--out", out.toString(), "--quiet");
            assertThat(result.code()).as(result.err()).isZero();
            outcomes.add(takeAndRemove(out));
        }
        assertSame(outcomes.get(0), outcomes.get(1));
        assertThat(new String(outcomes.get(0).results(), StandardCharsets.UTF_8)).contains("\"gamma\"");
    }

    @Test
    void sensitivityGridOnOneAndTwoThreadsGivesTheSameBytes() throws IOException, InterruptedException {
        Path out = root.resolve("B");
        Outcome one = childFit(1, out);
        Outcome two = childFit(2, out);
        assertSame(one, two);
        assertThat(new String(one.results(), StandardCharsets.UTF_8)).contains("\"sensitivity\"");
    }

    private static void assertSame(Outcome first, Outcome second) {
        assertThat(second.results()).isEqualTo(first.results());
        assertThat(second.manifestWithoutStart()).isEqualTo(first.manifestWithoutStart());
    }

    /**
     * Runs {@code fit --sensitivity} in a fresh JVM. ActiveProcessorCount alone does not change the
     * thread count (the common pool keeps one worker for both 1 and 2 processors), so the pool's
     * parallelism is set too: 0 leaves every grid point to the calling thread, 2 adds two workers.
     */
    private Outcome childFit(int threads, Path out) throws IOException, InterruptedException {
        Path java = Path.of(System.getProperty("java.home"), "bin", "java");
        List<String> command = List.of(java.toString(), "-XX:ActiveProcessorCount=" + threads,
                "-Djava.util.concurrent.ForkJoinPool.common.parallelism=" + (threads == 1 ? 0 : threads),
                "-Djava.awt.headless=true", "-cp", System.getProperty("java.class.path"), Main.class.getName(), "fit",
                model.toString(), "--sensitivity", "--quiet", "--out", out.toString());
        Path log = root.resolve("child-" + threads + ".log");
        Process process = new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(log.toFile()).start();
        assertThat(process.waitFor()).as(Files.readString(log)).isZero();
        return takeAndRemove(out);
    }

    private static Outcome takeAndRemove(Path out) throws IOException {
        byte[] results = Files.readAllBytes(out.resolve("results.json"));
        ObjectNode manifest = (ObjectNode) JsonMapper.builder().build().readTree(out.resolve("manifest.json").toFile());
        assertThat(manifest.has("started")).isTrue();
        manifest.remove("started");
        FuzzTest.deleteTree(out);
        return new Outcome(results, manifest.toString());
    }
}
