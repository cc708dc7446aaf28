package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.longrun.Kernel;

/**
 * Every estimation option a user can combine, and the edges of the stability options, on the small
 * Lumen fixture: each case runs `check` and then `fit` (or `stability`) in-process. Every case must
 * exit with 0, 2 or 3, never 1 (a bug); and `check` must agree with the command: when `check` refuses,
 * the command refuses with the same message, and when `check` passes, the command never refuses the
 * input (it succeeds, or the estimation fails with exit 3). The options are written both into the
 * model file and on the command line, since both paths are how users combine them.
 */
class OptionSweepTest {
    @TempDir
    Path root;

    /** How the bandwidth is chosen: a lag count, a fixed b, the two rules, or nothing written. */
    private static final List<List<String>> BANDWIDTHS = List.of(List.of("lags", "3"), List.of("bandwidth", "2.5"),
            List.of("bandwidth", "\"andrews\""), List.of("bandwidth", "\"newey-west\""), List.of());

    private static String estimation(EstimationMethod method, Kernel kernel, List<String> bandwidth, boolean prewhiten) {
        return "\n[estimation]\nmethod = \"" + method.id() + "\"\nkernel = \"" + kernel.id() + "\"\n"
                + (bandwidth.isEmpty() ? "" : bandwidth.get(0) + " = " + bandwidth.get(1) + "\n")
                + "prewhiten = " + prewhiten + "\n";
    }

    private static List<String> options(EstimationMethod method, Kernel kernel, List<String> bandwidth,
            boolean prewhiten) {
        List<String> args = new ArrayList<>(List.of("--method", method.id(), "--kernel", kernel.id(),
                prewhiten ? "--prewhiten" : "--no-prewhiten"));
        if (!bandwidth.isEmpty()) {
            args.add("--" + bandwidth.get(0));
            args.add(bandwidth.get(1).replace("\"", ""));
        }
        return args;
    }

    /** The model file without its [estimation] section. */
    private static String withoutEstimation(String model) {
        int at = model.indexOf("[estimation]");
        return at < 0 ? model : model.substring(0, at);
    }

    @TestFactory
    Stream<DynamicTest> everyKernelBandwidthPrewhiteningAndMethodAgreesBetweenCheckAndFit() throws IOException {
        LumenFixture.writeTo(root);
        List<DynamicTest> tests = new ArrayList<>();
        for (String base : List.of(LumenFixture.LINEAR, LumenFixture.POWER)) {
            String model = withoutEstimation(Files.readString(root.resolve(base)));
            for (EstimationMethod method : EstimationMethod.values()) {
                for (Kernel kernel : Kernel.values()) {
                    for (List<String> bandwidth : BANDWIDTHS) {
                        for (boolean prewhiten : new boolean[] {false, true}) {
                            String name = base + " " + method.id() + " " + kernel.id() + " "
                                    + String.join(" = ", bandwidth) + (prewhiten ? " prewhitened" : "");
                            tests.add(DynamicTest.dynamicTest(name + " (model file)", () -> {
                                Path file = root.resolve("models/sweep.toml");
                                Files.writeString(file, model + estimation(method, kernel, bandwidth, prewhiten));
                                agree(List.of("check", file.toString()), List.of("fit", file.toString(), "--quiet"));
                            }));
                            if (!base.equals(LumenFixture.LINEAR)) {
                                continue; // the command-line path is the same code for every family
                            }
                            tests.add(DynamicTest.dynamicTest(name + " (command line)", () -> {
                                Path file = root.resolve(base);
                                List<String> check = new ArrayList<>(List.of("check", file.toString()));
                                check.addAll(options(method, kernel, bandwidth, prewhiten));
                                List<String> fit = new ArrayList<>(List.of("fit", file.toString(), "--quiet"));
                                fit.addAll(options(method, kernel, bandwidth, prewhiten));
                                agree(check, fit);
                            }));
                        }
                    }
                }
            }
        }
        return tests.stream();
    }

    @TestFactory
    Stream<DynamicTest> stabilityWindowTrimmingAndSplitEdgesAgreeBetweenCheckAndStability() throws IOException {
        LumenFixture.writeTo(root);
        // The linear fixture: T = 60 months, K = 3 moments, so a fit needs 4 observations.
        String model = Files.readString(root.resolve(LumenFixture.LINEAR));
        // A wide trimming keeps the sup-Wald test (which `stability` runs by default) to a few dates.
        String few = "\ntrimming = 0.45";
        List<String> sections = List.of(
                "window = 2" + few, "window = 3" + few, "window = 4\nstep = 5" + few, "window = 10\nstep = 7" + few,
                "window = 59" + few, "window = 60" + few, "window = 61" + few, "window = 5000" + few,
                "window = 4\nstep = 9\nexpanding = true" + few, "window = 30\nstep = 100" + few,
                "trimming = 0.01", "trimming = 0.05", "trimming = 0.066", "trimming = 0.3", "trimming = 0.49",
                "splits = [\"1970-02\"]" + few, "splits = [\"1970-05\"]" + few, "splits = [\"1974-09\"]" + few,
                "splits = [\"1974-12\"]" + few, "splits = [\"1975-01\"]" + few, "splits = [\"1969-12\"]" + few,
                "splits = [\"1972-01\", \"1971-01\"]" + few, "splits = [\"1972-01\", \"1972-02\"]" + few,
                "splits = [\"1972\"]" + few, "splits = [\"1972Q2\"]" + few,
                "splits = [\"1972-01\"]\nwindow = 24\nstep = 12\ntrimming = 0.3");
        List<DynamicTest> tests = new ArrayList<>();
        for (String section : sections) {
            tests.add(DynamicTest.dynamicTest("[stability] " + section.replace('\n', ' '), () -> {
                Path file = root.resolve("models/stability.toml");
                Files.writeString(file, model + "\n[stability]\n" + section + "\n");
                agree(List.of("check", file.toString()), List.of("stability", file.toString(), "--quiet"));
            }));
        }
        List<List<String>> flags = List.of(List.of("--window", "1"), List.of("--window", "3"), List.of("--window", "61"),
                List.of("--window", "10", "--step", "0"), List.of("--trimming", "0.5"), List.of("--trimming", "0"),
                List.of("--trimming", "0.02"), List.of("--split", "1975-03", "--no-sup-wald"),
                List.of("--split", "1970-02", "--no-sup-wald"), List.of("--split", "not-a-date"),
                List.of("--window", "8", "--step", "6", "--expanding", "--no-sup-wald"),
                List.of("--window", "12", "--step", "12", "--trimming", "0.4"));
        for (List<String> flag : flags) {
            tests.add(DynamicTest.dynamicTest("stability " + String.join(" ", flag), () -> {
                List<String> args = new ArrayList<>(List.of("stability", root.resolve(LumenFixture.LINEAR).toString(),
                        "--quiet"));
                args.addAll(flag);
                CliHarness.Result result = CliHarness.runIn(args.toArray(String[]::new));
                assertThat(result.code()).as("%s: %s", args, result.err()).isIn(0, 2, 3);
                assertThat(result.err()).doesNotContain("internal error").doesNotContain("\tat ");
            }));
        }
        return tests.stream();
    }

    /**
     * Runs `check` and then the command: neither exits 1; a refusal by `check` is the command's refusal
     * too (same first line); after a passing `check` the command does not refuse its input.
     */
    private static void agree(List<String> check, List<String> command) {
        CliHarness.Result checked = CliHarness.runIn(check.toArray(String[]::new));
        CliHarness.Result ran = CliHarness.runIn(command.toArray(String[]::new));
        assertThat(checked.code()).as("check %s: %s", check, checked.err()).isIn(Main.EXIT_OK, Main.EXIT_INPUT);
        assertThat(ran.code()).as("%s: %s", command, ran.err()).isIn(Main.EXIT_OK, Main.EXIT_INPUT, Main.EXIT_ESTIMATION);
        assertThat(ran.err()).as("%s", command).doesNotContain("internal error").doesNotContain("\tat ");
        if (checked.code() == Main.EXIT_INPUT) {
            assertThat(ran.code()).as("check refused %s, so must %s: %s", check, command, checked.err())
                    .isEqualTo(Main.EXIT_INPUT);
            assertThat(ran.err().lines().findFirst()).as("the same refusal").isEqualTo(checked.err().lines().findFirst());
        } else {
            assertThat(ran.code()).as("check passed %s, so %s must not refuse its input: %s", check, command, ran.err())
                    .isNotEqualTo(Main.EXIT_INPUT);
        }
    }
}
