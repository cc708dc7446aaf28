package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.nio.channels.ServerSocketChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.orthogon.report.Hashes;

/**
 * A model file cannot reach outside Orthogon: output goes only under the --out folder, a formula SDF
 * cannot name Java, a data path is a file path and never a network address, and text cells that a
 * spreadsheet would run as formulas are escaped in the CSV tables. Also: a write that fails half-way
 * through the output folder leaves nothing behind.
 */
class SafetyTest {
    @TempDir
    Path root;
    CliHarness cli;

    @BeforeEach
    void copyProject() throws IOException {
        cli = new CliHarness(root);
    }

    @Test
    void fitWritesOnlyUnderTheOutputFolder() throws IOException {
        Map<String, String> before = snapshot(root);
        Path out = root.resolve("reports").resolve("three");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(), "--out",
                out.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        Map<String, String> after = snapshot(root);
        Map<String, String> unchanged = new TreeMap<>(after);
        unchanged.keySet().removeIf(name -> name.startsWith("reports/three/"));
        assertThat(unchanged).isEqualTo(before);
        assertThat(after.keySet()).filteredOn(name -> name.startsWith("reports/three/")).hasSize(16)
                .contains("reports/three/results.json", "reports/three/manifest.json");
        try (Stream<Path> reports = Files.list(root.resolve("reports"))) {
            assertThat(reports.map(p -> p.getFileName().toString())).containsExactly("three");
        }
    }

    @ParameterizedTest
    @ValueSource(strings = {"java.lang.System.exit(1)", "Runtime.getRuntime().exec(\"touch pwned\")",
        "beta * cons_growth^(-gamma) + java.lang.Runtime", "T(java.lang.System).exit(1)", "exec(\"touch pwned\")",
        "beta * cons_growth^(-gamma); System.exit(1)", "${jndi:ldap://127.0.0.1:1/x}", "#{7*7}",
        "new java.io.File(\"pwned\")", "`touch pwned`"})
    void formulaSdfThatNamesCodeIsRefused(String formula) throws IOException {
        Path model = cli.models.resolve("lumen-expression-power.toml");
        cli.edit(model, "sdf = \"beta * cons_growth^(-gamma)\"", "sdf = '''" + formula + "'''");
        Map<String, String> before = snapshot(root);
        Path out = root.resolve("out");
        CliHarness.Result result = cli.run("fit", model.toString(), "--out", out.toString());
        FuzzTest.assertClean(result, result.err());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains(model.toString()).contains("sdf");
        assertThat(snapshot(root)).isEqualTo(before);
    }

    @Test
    void dataPathThatIsAUrlOpensNoConnection() throws IOException {
        try (ServerSocketChannel server = ServerSocketChannel.open()) {
            server.bind(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0));
            server.configureBlocking(false);
            int port = ((InetSocketAddress) server.getLocalAddress()).getPort();
            Path model = cli.models.resolve("lumen-three-factor.toml");
            cli.edit(model, "\"../demo-data/lumen-factors-monthly.csv\"",
                    "\"http://127.0.0.1:" + port + "/lumen-factors-monthly.csv\"");
            CliHarness.Result result = cli.run("check", model.toString());
            FuzzTest.assertClean(result, result.err());
            assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
            assertThat(result.err()).contains("lumen-factors-monthly.csv");
            // The run is over, so a connection it made would be waiting in the backlog by now.
            assertThat(server.accept()).isNull();
        }
    }

    @Test
    void textCellsThatSpreadsheetsWouldRunAreEscaped() throws IOException {
        List<String> names = List.of("=SUM(A1)", "+1", "-2", "@cmd");
        Path portfolios = cli.data.resolve("lumen-portfolios-monthly.csv");
        cli.edit(portfolios, "S1T1,S1T2,S1T3,S1T4,", String.join(",", names) + ",");
        Path out = root.resolve("three");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(), "--out",
                out.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        List<String> rows = Files.readAllLines(out.resolve("tables/pricing-errors.csv"));
        assertThat(rows.subList(1, 5)).extracting(row -> row.split(",")[0])
                .containsExactly("'=SUM(A1)", "'+1", "'-2", "'@cmd");
        // Numbers keep their sign: only text is escaped.
        assertThat(rows.subList(1, rows.size())).anySatisfy(row -> assertThat(row).contains(",-"));
        assertThat(rows.subList(1, rows.size())).allSatisfy(row -> assertThat(row).doesNotContain(",'"));
    }

    /**
     * Fails the output write half-way without touching Orthogon's code: the temporary folder is put so
     * deep that results.json (the first file, 12 characters) still fits under the system's 4095-character
     * path limit and tables/parameters.csv (21 characters, the second) does not. The temporary folder's
     * name ends in 1 to 20 random digits; the depth is chosen so that 14 to 20 digits give that split,
     * and fewer than 14 digits come up about once in two million runs.
     */
    @Test
    void writeThatFailsHalfWayLeavesNoFolder() throws IOException {
        String name = "run";
        int parentLength = 4060 - ("/.".length() + name.length() + ".orthogon-".length());
        Path parent = deepFolder(root.toAbsolutePath().resolve("deep"), parentLength);
        Path out = parent.resolve(name);
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-three-factor.toml").toString(), "--out",
                out.toString(), "--quiet");
        FuzzTest.assertClean(result, result.err());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("cannot write tables/parameters.csv");
        try (Stream<Path> left = Files.list(parent)) {
            assertThat(left).isEmpty();
        }
    }

    /** Creates a folder whose absolute path has exactly {@code length} characters. */
    private static Path deepFolder(Path start, int length) throws IOException {
        StringBuilder path = new StringBuilder(start.toString());
        while (length - path.length() > 256) {
            path.append('/').append("d".repeat(200));
        }
        int rest = length - path.length() - 1;
        path.append('/').append("e".repeat(rest));
        Path folder = Path.of(path.toString());
        assertThat(folder.toString()).hasSize(length);
        return Files.createDirectories(folder);
    }

    /** Every file under {@code folder}, by relative path, with its SHA-256. */
    private static Map<String, String> snapshot(Path folder) throws IOException {
        Map<String, String> files = new TreeMap<>();
        try (Stream<Path> paths = Files.walk(folder)) {
            for (Path path : (Iterable<Path>) paths.filter(Files::isRegularFile)::iterator) {
                files.put(folder.relativize(path).toString(), Hashes.sha256(path));
            }
        }
        return files;
    }
}
