package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.stream.IntStream;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestFactory;
import org.junit.jupiter.api.io.TempDir;

/**
 * Mutates valid CSV and model files at random (seeded) and runs {@code check}, and for some cases
 * {@code fit --out}, on the result. Whatever the mutation, the run must end in 0, 2 or 3, never in a
 * stack trace; a refusal must be the one-message form with a fix; and a failed run leaves no output
 * folder nor the hidden temporary folder beside it.
 *
 * <p>{@code -Dorthogon.fuzz.cases=N} sets the number of cases (default 10000),
 * {@code -Dorthogon.fuzz.seed=S} the seed and {@code -Dorthogon.fuzz.case=N} replays one case.
 * Case n draws from its own generator seeded by (seed, n), so a single case replays without the
 * cases before it.
 */
class FuzzTest {
    private static final long SEED = Long.getLong("orthogon.fuzz.seed", 7L);
    private static final int CASES = Integer.getInteger("orthogon.fuzz.cases", 10_000);
    private static final Integer ONLY = Integer.getInteger("orthogon.fuzz.case");
    /** One case in this many also fits and writes an output folder; charts make a fit ~100 times dearer. */
    private static final int FIT_EVERY = 40;

    private static final String LONG = "9".repeat(400) + "x".repeat(4000);
    private static final List<String> CELL_TOKENS = List.of("", "NaN", "abc", "1e999", "-99.99", "1,5", "\"", "2024-13",
            LONG, "-Infinity", "1e-400", "0x1F", " 0.01 ", "\u22120.01", "1970Q5", "1970-01", "\"\"", "NA", "-", ".",
            "1.5.2", "99999999999999999999999", "\u0000", "=1+2", "0.01\"", "\"0.01");
    private static final List<String> TOML_VALUES = List.of("\"\"", "\"NaN\"", "nan", "inf", "-inf", "1e999", "-99.99",
            "\"abc\"", "true", "[]", "{}", "[1, \"a\"]", "\"2024-13\"", "\"" + LONG + "\"", "\"../data\"",
            "\"../data/none.csv\"", "\"/\"", "0", "-1", "1.5", "\"1,5\"", "{ beta = \"x\" }", "[\"MKT\", \"MKT\"]",
            "\"beta *\"", "\"beta * nothing\"", "\"1970-01\"", "\"2100-01\"", "'''x'''", "\"\\u0000\"", "\"");
    private static final byte[] BYTES = {0x00, (byte) 0xFF, (byte) 0xC3, (byte) 0x80, (byte) 0xE2, (byte) 0xFE, ',', '"',
        '\n', '\r', '=', '[', ']', '{', '#', '.', '-', ' ', '\t', ';'};

    @TempDir
    Path root;

    private record Model(String file, List<String> data) {
    }

    private static final List<Model> MODELS = List.of(
            new Model(LumenFixture.LINEAR, List.of(LumenFixture.RETURNS, LumenFixture.RISKFREE, LumenFixture.FACTORS)),
            new Model(LumenFixture.POWER, List.of(LumenFixture.RETURNS, LumenFixture.CONSUMPTION)),
            new Model(LumenFixture.EXPRESSION, List.of(LumenFixture.RETURNS, LumenFixture.CONSUMPTION)));

    @Test
    void unmutatedFixtureChecksAndFits() throws IOException {
        LumenFixture.writeTo(root);
        for (Model model : MODELS) {
            Path out = root.resolve("runs").resolve("out");
            CliHarness.Result check = run("check", root.resolve(model.file()).toString());
            assertThat(check.code()).as(check.err()).isZero();
            assertThat(check.out()).contains("T = ");
            CliHarness.Result fit = run("fit", root.resolve(model.file()).toString(), "--out", out.toString(), "--quiet");
            assertThat(fit.code()).as(model.file() + ": " + fit.err()).isZero();
            assertThat(out.resolve("results.json")).exists();
            deleteTree(out);
        }
    }

    /** Found by seed 7, cases 9085 and 9548: a NUL in a path value escaped as an internal error. */
    @Test
    void nulCharacterInADataPathIsRefused() throws IOException {
        LumenFixture.writeTo(root);
        Path model = root.resolve(LumenFixture.LINEAR);
        Files.writeString(model, Files.readString(model).replace("\"../data/factors-monthly.csv\"", "\"\\u0000\""));
        CliHarness.Result result = run("check", model.toString());
        assertClean(result, result.err());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).startsWith("error: " + model + ", line 9: factors is not a usable path");
    }

    @TestFactory
    Stream<DynamicTest> mutatedInputsAreRefusedCleanly() throws IOException {
        Map<String, String> originals = LumenFixture.writeTo(root);
        Path runs = Files.createDirectories(root.resolve("runs"));
        IntStream numbers = ONLY != null ? IntStream.of(ONLY) : IntStream.range(0, CASES);
        return numbers.mapToObj(n -> DynamicTest.dynamicTest("case " + n + " of seed " + SEED,
                () -> runCase(SEED, n, originals, runs)));
    }

    /**
     * Cases of seed 7 that the 10^5 run found exiting with 1, kept as regressions: a formula the formula
     * library rejects with an empty-stack error (63895) and consumption data that make the solver's
     * Jacobian lose rank in its QR step (61613, 67771, 99272). Both now give exit 2 or 3.
     */
    @TestFactory
    Stream<DynamicTest> casesTheHundredThousandRunFound() throws IOException {
        Map<String, String> originals = LumenFixture.writeTo(root);
        Path runs = Files.createDirectories(root.resolve("regression-runs"));
        return IntStream.of(61613, 63895, 67771, 99272).mapToObj(n -> DynamicTest.dynamicTest("case " + n + " of seed 7",
                () -> runCase(7L, n, originals, runs)));
    }

    private void runCase(long seed, int n, Map<String, String> originals, Path runs) throws IOException {
        Random random = new Random(seed * 1_000_003L + n);
        Model model = MODELS.get(random.nextInt(MODELS.size()));
        List<String> files = new ArrayList<>(model.data());
        files.add(model.file());
        String target = files.get(random.nextInt(files.size()));
        boolean isModel = target.endsWith(".toml");
        byte[] bytes = originals.get(target).getBytes(StandardCharsets.UTF_8);
        List<String> applied = new ArrayList<>();
        int mutations = 1 + random.nextInt(3);
        for (int i = 0; i < mutations; i++) {
            Mutation mutation = isModel ? Mutation.MODEL.get(random.nextInt(Mutation.MODEL.size()))
                    : Mutation.CSV.get(random.nextInt(Mutation.CSV.size()));
            bytes = mutation.apply(bytes, random);
            applied.add(mutation.name);
        }
        boolean fit = random.nextInt(FIT_EVERY) == 0;
        Path file = root.resolve(target);
        Path out = runs.resolve("out");
        Files.write(file, bytes);
        try {
            CliHarness.Result result = fit
                    ? run("fit", root.resolve(model.file()).toString(), "--out", out.toString(), "--quiet")
                    : run("check", root.resolve(model.file()).toString());
            String replay = String.format("seed %d case %d (%s, %s %s on %s); replay with mvn -q test -Dtest=FuzzTest "
                    + "-Dorthogon.fuzz.seed=%d -Dorthogon.fuzz.case=%d%nexit %d, stderr:%n%s", seed, n,
                    model.file(), fit ? "fit --out" : "check", applied, target, seed, n, result.code(), result.err());
            assertClean(result, replay);
            List<String> left = list(runs);
            if (result.code() == Main.EXIT_OK && fit) {
                assertThat(left).as(replay).containsExactly("out");
                deleteTree(out);
            } else {
                assertThat(left).as("no output folder after a failed run: " + replay).isEmpty();
            }
        } finally {
            Files.writeString(file, originals.get(target));
        }
    }

    /** The assertions every run must pass, whatever its input. */
    static void assertClean(CliHarness.Result result, String context) {
        assertThat(result.code()).as(context).isIn(Main.EXIT_OK, Main.EXIT_INPUT, Main.EXIT_ESTIMATION);
        assertThat(result.err()).as(context).doesNotContain("\tat ").doesNotContain("Exception");
        if (result.code() == Main.EXIT_INPUT) {
            assertThat(result.err()).as(context).startsWith("error: ");
            assertThat(result.err().lines().anyMatch(line -> line.strip().startsWith("fix:"))).as(context).isTrue();
        }
    }

    private static CliHarness.Result run(String... args) {
        return CliHarness.runIn(args);
    }

    private static List<String> list(Path folder) throws IOException {
        try (Stream<Path> entries = Files.list(folder)) {
            return entries.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }

    static void deleteTree(Path folder) throws IOException {
        if (!Files.exists(folder)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(folder)) {
            for (Path path : (Iterable<Path>) paths.sorted(Comparator.reverseOrder())::iterator) {
                Files.delete(path);
            }
        }
    }

    /** One way to damage a file; works on bytes so that invalid UTF-8 can be produced too. */
    private record Mutation(String name, Change change) {
        @FunctionalInterface
        interface Change {
            byte[] apply(byte[] bytes, Random random);
        }

        byte[] apply(byte[] bytes, Random random) {
            return change.apply(bytes, random);
        }

        static final List<Mutation> SHARED = List.of(
                lines("insert-line", (lines, r) -> lines.add(r.nextInt(lines.size() + 1), randomLine(lines, r))),
                lines("delete-line", (lines, r) -> {
                    if (!lines.isEmpty()) {
                        lines.remove(r.nextInt(lines.size()));
                    }
                }),
                lines("duplicate-line", (lines, r) -> {
                    if (!lines.isEmpty()) {
                        int i = r.nextInt(lines.size());
                        lines.add(i + r.nextInt(2) * (lines.size() - i), lines.get(i));
                    }
                }),
                lines("swap-lines", (lines, r) -> {
                    if (lines.size() > 1) {
                        java.util.Collections.swap(lines, r.nextInt(lines.size()), r.nextInt(lines.size()));
                    }
                }),
                new Mutation("corrupt-bytes", (bytes, r) -> {
                    byte[] copy = bytes.clone();
                    for (int k = 1 + r.nextInt(4); k > 0 && copy.length > 0; k--) {
                        copy[r.nextInt(copy.length)] = r.nextBoolean() ? BYTES[r.nextInt(BYTES.length)]
                                : (byte) r.nextInt(256);
                    }
                    return copy;
                }),
                new Mutation("truncate", (bytes, r) -> java.util.Arrays.copyOf(bytes, r.nextInt(bytes.length + 1))));

        static final List<Mutation> CSV = concat(SHARED, List.of(
                lines("replace-cell", (lines, r) -> {
                    int i = r.nextInt(lines.size());
                    String[] cells = lines.get(i).split(",", -1);
                    cells[r.nextInt(cells.length)] = CELL_TOKENS.get(r.nextInt(CELL_TOKENS.size()));
                    lines.set(i, String.join(",", cells));
                }),
                lines("replace-number", (lines, r) -> {
                    if (lines.size() < 2) {
                        return;
                    }
                    int i = 1 + r.nextInt(lines.size() - 1);
                    String[] cells = lines.get(i).split(",", -1);
                    if (cells.length > 1) {
                        cells[1 + r.nextInt(cells.length - 1)] = CELL_TOKENS.get(r.nextInt(CELL_TOKENS.size()));
                        lines.set(i, String.join(",", cells));
                    }
                }),
                lines("delete-cell", (lines, r) -> {
                    int i = r.nextInt(lines.size());
                    List<String> cells = new ArrayList<>(List.of(lines.get(i).split(",", -1)));
                    cells.remove(r.nextInt(cells.size()));
                    lines.set(i, String.join(",", cells));
                })));

        static final List<Mutation> MODEL = concat(SHARED, List.of(
                lines("delete-key", (lines, r) -> withKey(lines, r, i -> lines.remove((int) i))),
                lines("duplicate-key", (lines, r) -> withKey(lines, r, i -> lines.add(i + 1, lines.get(i)))),
                lines("misspell-key", (lines, r) -> withKey(lines, r, i -> {
                    String line = lines.get(i);
                    int at = r.nextInt(line.indexOf('=') + 1);
                    lines.set(i, line.substring(0, at) + (char) ('a' + r.nextInt(26)) + line.substring(at + 1));
                })),
                lines("replace-value", (lines, r) -> withKey(lines, r, i -> {
                    String line = lines.get(i);
                    lines.set(i, line.substring(0, line.indexOf('=') + 1) + " "
                            + TOML_VALUES.get(r.nextInt(TOML_VALUES.size())));
                })),
                lines("misspell-value", (lines, r) -> withKey(lines, r, i -> {
                    String line = lines.get(i);
                    int from = line.indexOf('=') + 2;
                    if (from < line.length()) {
                        int at = from + r.nextInt(line.length() - from);
                        lines.set(i, line.substring(0, at) + (char) ('a' + r.nextInt(26)) + line.substring(at + 1));
                    }
                })),
                lines("rename-section", (lines, r) -> {
                    for (int i = 0; i < lines.size(); i++) {
                        if (lines.get(i).startsWith("[") && r.nextInt(3) == 0) {
                            lines.set(i, List.of("[dat]", "[model]", "[data]", "[estimation]", "[stability]", "[]",
                                    "[[data]]").get(r.nextInt(7)));
                        }
                    }
                })));

        private static Mutation lines(String name, java.util.function.BiConsumer<List<String>, Random> edit) {
            return new Mutation(name, (bytes, r) -> {
                String text = new String(bytes, StandardCharsets.UTF_8);
                List<String> lines = new ArrayList<>(List.of(text.split("\n", -1)));
                edit.accept(lines, r);
                return String.join("\n", lines).getBytes(StandardCharsets.UTF_8);
            });
        }

        private static String randomLine(List<String> lines, Random r) {
            return switch (r.nextInt(4)) {
                case 0 -> lines.isEmpty() ? "" : lines.get(r.nextInt(lines.size()));
                case 1 -> "";
                case 2 -> CELL_TOKENS.get(r.nextInt(CELL_TOKENS.size()));
                default -> "1970-01," + CELL_TOKENS.get(r.nextInt(CELL_TOKENS.size())) + ",0.01,0.02";
            };
        }

        /** Calls {@code edit} with the index of a random "key = value" line, if there is one. */
        private static void withKey(List<String> lines, Random r, java.util.function.IntConsumer edit) {
            List<Integer> keys = IntStream.range(0, lines.size()).filter(i -> lines.get(i).contains("=")
                    && !lines.get(i).startsWith("#")).boxed().toList();
            if (!keys.isEmpty()) {
                edit.accept(keys.get(r.nextInt(keys.size())));
            }
        }

        private static List<Mutation> concat(List<Mutation> a, List<Mutation> b) {
            List<Mutation> all = new ArrayList<>(a);
            all.addAll(b);
            return List.copyOf(all);
        }
    }
}
