package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/** The command line's own behaviour: the version it reports and how it refuses words that are not verbs. */
class MainTest {

    /** The project's version as the pom declares it, read independently of the build's filtering. */
    private static String pomVersion() throws IOException {
        String pom = Files.readString(Path.of("pom.xml"));
        Matcher m = Pattern.compile("<artifactId>orthogon</artifactId>\\s*<version>([^<]+)</version>").matcher(pom);
        assertThat(m.find()).as("the pom declares a version").isTrue();
        return m.group(1);
    }

    @Test
    void versionIsThePomVersion() throws IOException {
        String version = pomVersion();
        assertThat(Version.current()).isEqualTo(version).doesNotContain("development");
        CliHarness.Result result = CliHarness.runIn("--version");
        assertThat(result.code()).isZero();
        assertThat(result.out().strip()).isEqualTo("Orthogon " + version);
    }

    @Test
    void theProgramNameTwiceIsAUsageErrorEvenWithHelp() {
        CliHarness.Result result = CliHarness.runIn("orthogon", "--help");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("program's own name").contains("orthogon --help")
                .doesNotContain("orthogon orthogon");
        assertThat(result.out()).isEmpty();
    }

    @Test
    void aMisspeltVerbGetsASuggestion() {
        CliHarness.Result result = CliHarness.runIn("fitt", "models/lumen-power-utility.toml");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("\"fitt\" is not a verb").contains("did you mean \"fit\"");
    }

    @Test
    void aUsageErrorOfAVerbPointsAtThatVerbsHelp() {
        CliHarness.Result result = CliHarness.runIn("fit", "--no-such-option", "models/lumen-power-utility.toml");
        assertThat(result.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(result.err()).contains("fix: see `orthogon fit --help`");
    }
}
