package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;
import org.junit.jupiter.api.io.TempDir;

/**
 * The options of the bootstrap and of `montecarlo`, each with its edges (too few replications, blocks of
 * 0, 1, more than half the sample, unknown schemes, zero threads, the four estimators), on the small Lumen
 * fixture: every case exits 0, 2 or 3, never 1, and a refusal is one message with a fix and no stack
 * trace.
 */
class BootstrapOptionSweepTest {
    @TempDir
    Path root;

    private static final List<List<String>> EDGES = List.of(List.of(), List.of("--block-length", "0"),
            List.of("--block-length", "1"), List.of("--block-length", "3"), List.of("--block-length", "10000"),
            List.of("--block-scheme", "circular"), List.of("--block-scheme", "moving"),
            List.of("--block-scheme", "stationary"), List.of("--threads", "0"), List.of("--threads", "2"),
            List.of("--seed", "-5"), List.of("--method", "one-step"), List.of("--method", "iterated"),
            List.of("--method", "continuously-updated"), List.of("--block-length", "2", "--block-scheme", "circular",
                    "--method", "one-step"));

    @TestFactory
    Stream<DynamicTest> everyBootstrapOptionEdgeExitsZeroTwoOrThree() throws IOException {
        LumenFixture.writeTo(root);
        List<DynamicTest> tests = new ArrayList<>();
        for (String model : List.of(LumenFixture.LINEAR, LumenFixture.POWER)) {
            String file = root.resolve(model).toString();
            for (String count : List.of("5", "19")) {
                for (List<String> edge : EDGES) {
                    List<String> fit = new ArrayList<>(List.of("fit", file, "--quiet", "--bootstrap", count));
                    fit.addAll(edge);
                    tests.add(DynamicTest.dynamicTest(String.join(" ", fit.subList(2, fit.size())) + " " + model,
                            () -> exitsCleanly(fit)));
                    List<String> carlo = new ArrayList<>(List.of("montecarlo", file, "--quiet", "--replications",
                            count.equals("5") ? "5" : "12"));
                    carlo.addAll(edge);
                    tests.add(DynamicTest.dynamicTest(String.join(" ", carlo.subList(2, carlo.size())) + " " + model,
                            () -> exitsCleanly(carlo)));
                }
            }
            for (List<String> edge : List.of(List.<String>of(), List.of("--block-length", "2"),
                    List.of("--no-sup-wald"), List.of("--trimming", "0.3", "--block-scheme", "circular"))) {
                List<String> stability = new ArrayList<>(List.of("stability", file, "--quiet", "--bootstrap", "19",
                        "--threads", "2"));
                stability.addAll(edge);
                tests.add(DynamicTest.dynamicTest(String.join(" ", stability) + " " + model,
                        () -> exitsCleanly(stability)));
            }
            for (String alternative : List.of("TIDE_LO = 0.01", "b_MKT = 1, TIDE_HI = -0.002", "gamma = 2", "beta = x",
                    "TIDE_LO = 0.01, TIDE_LO = 0.02", "= 3", "")) {
                List<String> carlo = List.of("montecarlo", file, "--quiet", "--replications", "10", "--alternative",
                        alternative);
                tests.add(DynamicTest.dynamicTest("montecarlo --alternative \"" + alternative + "\" " + model,
                        () -> exitsCleanly(carlo)));
            }
        }
        return tests.stream();
    }

    private static void exitsCleanly(List<String> args) {
        CliHarness.Result result = CliHarness.runIn(args.toArray(String[]::new));
        assertThat(result.code()).as("%s: %s", args, result.err()).isIn(0, 2, 3);
        assertThat(result.err()).as("%s", args).doesNotContain("internal error").doesNotContain("\tat ");
        if (result.code() == 2) {
            assertThat(result.err()).as("%s", args).contains("fix:");
        }
    }
}
