package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermission;
import java.util.Set;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/** What a new user meets on a first run, each a defect once: wording, files, permissions and seeds. */
class FirstRunTest {
    private static final JsonMapper JSON = JsonMapper.builder().build();

    @TempDir
    Path root;
    CliHarness cli;

    @BeforeEach
    void copyProject() throws IOException {
        cli = new CliHarness(root);
    }

    @Test
    void oneParameterIsNotPlural() {
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-market-only.toml").toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("12 moments, 1 parameter\n").doesNotContain("1 parameters");
        CliHarness.Result check = cli.run("check", cli.models.resolve("lumen-market-only.toml").toString());
        assertThat(check.out()).contains("P = 1 parameter,").contains("K - P = 11 overidentifying restrictions");
    }

    @Test
    void reportFoldersAndJsonFilesTakeTheUsersUsualPermissions() throws IOException {
        Path out = root.resolve("report");
        Path json = root.resolve("fit.json");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-market-only.toml").toString(), "--out",
                out.toString(), "--json", json.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        // What the user's umask gives a new folder and file here, whatever the umask is (022 gives 0755, 0644).
        Set<PosixFilePermission> folderMode = Files.getPosixFilePermissions(Files.createDirectory(root.resolve("probe")));
        Set<PosixFilePermission> fileMode = Files.getPosixFilePermissions(Files.createFile(root.resolve("probe.txt")));
        assertThat(Files.getPosixFilePermissions(out)).isEqualTo(folderMode);
        assertThat(Files.getPosixFilePermissions(out.resolve("tables"))).isEqualTo(folderMode);
        assertThat(Files.getPosixFilePermissions(out.resolve("results.json"))).isEqualTo(fileMode);
        assertThat(Files.getPosixFilePermissions(json)).isEqualTo(fileMode);
    }

    @Test
    void theManifestListsTheSeedOfTheHansenJagannathanPValue() throws IOException {
        Path out = root.resolve("report");
        cli.edit(cli.models.resolve("lumen-market-only.toml"), "lags = 4", "lags = 4\nhj_seed = 777");
        CliHarness.Result result = cli.run("fit", cli.models.resolve("lumen-market-only.toml").toString(), "--out",
                out.toString(), "--quiet");
        assertThat(result.code()).as(result.err()).isZero();
        JsonNode manifest = JSON.readTree(out.resolve("manifest.json").toFile());
        JsonNode results = JSON.readTree(out.resolve("results.json").toFile());
        assertThat(results.at("/hj_distance/seed").asLong()).isEqualTo(777);
        assertThat(manifest.at("/seeds/hj_distance").asLong()).isEqualTo(777);
    }

    @Test
    void expandingWindowsAreNotCalledRolling() throws IOException {
        Path out = root.resolve("expanding");
        CliHarness.Result result = cli.run("stability", cli.models.resolve("lumen-market-only.toml").toString(),
                "--no-sup-wald", "--window", "360", "--step", "120", "--expanding", "--out", out.toString());
        assertThat(result.code()).as(result.err()).isZero();
        assertThat(result.out()).contains("expanding windows (estimate").doesNotContain("rolling");
        JsonNode results = JSON.readTree(out.resolve("results.json").toFile());
        assertThat(results.get("expanding").asBoolean()).isTrue();
        assertThat(results.at("/rolling/0/start").asString()).isEqualTo(results.at("/rolling/3/start").asString());
        assertThat(Files.readString(out.resolve("tables/windows.md"))).contains("Estimates over expanding windows");
        assertThat(Files.readString(out.resolve("report.html"))).contains("over expanding windows")
                .doesNotContain("rolling windows");
    }

    @Test
    void simulateDoesNotOverwriteWithoutBeingAsked() throws IOException {
        Path data = root.resolve("sim");
        assertThat(cli.run("simulate", "--out", data.toString(), "--years", "2", "--quiet").code()).isZero();
        Path factors = data.resolve("lumen-factors-monthly.csv");
        Files.writeString(factors, "edited by hand\n");
        CliHarness.Result again = cli.run("simulate", "--out", data.toString(), "--years", "2", "--quiet");
        assertThat(again.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(again.err()).contains("already holds").contains("--overwrite");
        assertThat(Files.readString(factors)).isEqualTo("edited by hand\n");
        assertThat(cli.run("simulate", "--out", data.toString(), "--years", "2", "--quiet", "--overwrite").code())
                .isZero();
        assertThat(Files.readString(factors)).startsWith("date,MKT,SIZE,TIDE");
    }

    @Test
    void theRiskFreeColumnSuggestionNamesTheRateNotTheMarket() throws IOException {
        // A risk-free file that also carries the market: the fix must propose RF, never MKT.
        Path riskfree = cli.data.resolve("lumen-riskfree-monthly.csv");
        Path factors = cli.data.resolve("lumen-factors-monthly.csv");
        var rates = Files.readAllLines(riskfree);
        var market = Files.readAllLines(factors);
        StringBuilder both = new StringBuilder("date,MKT,RF\n");
        for (int i = 1; i < rates.size(); i++) {
            both.append(rates.get(i).split(",")[0]).append(',').append(market.get(i).split(",")[1]).append(',')
                    .append(rates.get(i).split(",")[1]).append('\n');
        }
        Files.writeString(riskfree, both.toString());
        CliHarness.Result result = cli.run("check", cli.models.resolve("lumen-market-only.toml").toString());
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("riskfree_column = \"RF\"").doesNotContain("riskfree_column = \"MKT\"");
        // Renamed so the name says nothing, the values still tell the rate (positive, smooth) from the market.
        Files.writeString(riskfree, both.toString().replace("date,MKT,RF", "date,A,B"));
        result = cli.run("check", cli.models.resolve("lumen-market-only.toml").toString());
        assertThat(result.err()).contains("riskfree_column = \"B\"").doesNotContain("riskfree_column = \"A\"");
    }
}
