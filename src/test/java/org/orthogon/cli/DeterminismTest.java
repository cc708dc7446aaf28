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
 * time (and the --threads argument itself): twice in one JVM, and in fresh JVMs with --threads 1 and
 * --threads 2 for the parallel parts, the sensitivity grid of a fit and the sup-Wald dates, the null
 * simulation and the rolling windows of stability.
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
        Outcome one = child(out, "fit", model.toString(), "--sensitivity", "--threads", "1");
        Outcome two = child(out, "fit", model.toString(), "--sensitivity", "--threads", "2");
        assertSame(one, two);
        assertThat(new String(one.results(), StandardCharsets.UTF_8)).contains("\"sensitivity\"");
    }

    @Test
    void supWaldAndRollingWindowsOnOneAndTwoThreadsGiveTheSameBytes() throws IOException, InterruptedException {
        // the linear three-factor model (windows from running sums), and power utility (windows through the
        // model's own rows, solved by Levenberg-Marquardt); the simulation of the sup-Wald null on several
        // threads is checked draw for draw in SupWaldSimulationTest
        for (String[] run : new String[][] {{"lumen-three-factor.toml", "--window", "120", "--step", "60"},
            {"lumen-power-utility.toml", "--window", "80", "--step", "40", "--no-sup-wald"}}) {
            Path out = root.resolve("C");
            List<String> args = new ArrayList<>(List.of("stability", cli.models.resolve(run[0]).toString()));
            args.addAll(List.of(run).subList(1, run.length));
            Outcome one = child(out, concat(args, "--threads", "1"));
            Outcome two = child(out, concat(args, "--threads", "2"));
            assertSame(one, two);
            String text = new String(one.results(), StandardCharsets.UTF_8);
            assertThat(text).contains("\"rolling\"").contains("\"fixed_weight\"");
            assertThat(text.contains("\"sup_wald\"")).isEqualTo(!List.of(run).contains("--no-sup-wald"));
        }
    }

    private static String[] concat(List<String> args, String... more) {
        List<String> all = new ArrayList<>(args);
        all.addAll(List.of(more));
        return all.toArray(String[]::new);
    }

    private static void assertSame(Outcome first, Outcome second) {
        assertThat(second.results()).isEqualTo(first.results());
        assertThat(second.manifestWithoutStart()).isEqualTo(first.manifestWithoutStart());
    }

    /** Runs the command line in a fresh JVM with the test's own class path, writing the folder {@code out}. */
    private Outcome child(Path out, String... args) throws IOException, InterruptedException {
        Path java = Path.of(System.getProperty("java.home"), "bin", "java");
        List<String> command = new ArrayList<>(List.of(java.toString(), "-Djava.awt.headless=true", "-cp",
                System.getProperty("java.class.path"), Main.class.getName()));
        command.addAll(List.of(args));
        command.addAll(List.of("--quiet", "--out", out.toString()));
        Path log = root.resolve("child.log");
        Process process = new ProcessBuilder(command).redirectErrorStream(true).redirectOutput(log.toFile()).start();
        assertThat(process.waitFor()).as(Files.readString(log)).isZero();
        return takeAndRemove(out);
    }

    private static Outcome takeAndRemove(Path out) throws IOException {
        byte[] results = Files.readAllBytes(out.resolve("results.json"));
        ObjectNode manifest = (ObjectNode) JsonMapper.builder().build().readTree(out.resolve("manifest.json").toFile());
        assertThat(manifest.has("started")).isTrue();
        manifest.remove("started");
        // the arguments name the thread count, the one thing that differs between the runs compared
        tools.jackson.databind.node.ArrayNode arguments = (tools.jackson.databind.node.ArrayNode) manifest.get("arguments");
        for (int i = arguments.size() - 1; i >= 0; i--) {
            if (arguments.get(i).asString().equals("--threads")) {
                arguments.remove(i + 1);
                arguments.remove(i);
            }
        }
        FuzzTest.deleteTree(out);
        return new Outcome(results, manifest.toString());
    }
}
