package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The launcher {@code bin/orthogon} against the packaged jar (run by Failsafe after {@code package}, so the
 * jar and its class-data-sharing archive exist): the launcher's JVM flags change how fast a run starts,
 * never what it prints or writes, and the program's exit codes pass through it unchanged.
 */
class LauncherIT {
    private static final Path HOME = Path.of("").toAbsolutePath();
    private static final Path LAUNCHER = HOME.resolve("bin/orthogon");

    @TempDir
    Path dir;

    private record Run(int code, String out, String err) {
    }

    @Test
    void aFitThroughTheLauncherWritesWhatThePlainJvmWrites() throws Exception {
        Path viaLauncher = dir.resolve("launcher.json");
        Path viaJava = dir.resolve("java.json");
        Run launched = run(Map.of(), List.of(LAUNCHER.toString(), "fit", "models/lumen-three-factor.toml", "--json",
                viaLauncher.toString()));
        Run plain = run(Map.of(), List.of(javaBinary(), "-jar", HOME.resolve("target/orthogon.jar").toString(), "fit",
                "models/lumen-three-factor.toml", "--json", viaJava.toString()));
        assertThat(launched.code()).as(launched.err()).isZero();
        assertThat(plain.code()).as(plain.err()).isZero();
        assertThat(launched.out()).isEqualTo(plain.out()).contains("J test");
        assertThat(Files.readString(viaLauncher)).isEqualTo(Files.readString(viaJava));
        assertThat(launched.err()).as("no JVM chatter about the archive").isEqualTo(plain.err());
    }

    @Test
    void exitCodesPassThrough() throws Exception {
        Run missingModel = run(Map.of(), List.of(LAUNCHER.toString(), "fit", "models/no-such-model.toml"));
        assertThat(missingModel.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(missingModel.err()).contains("no-such-model.toml").contains("fix");
        Run usage = run(Map.of(), List.of(LAUNCHER.toString(), "fit", "--no-such-option"));
        assertThat(usage.code()).isEqualTo(Main.EXIT_INPUT);
        Run version = run(Map.of(), List.of(LAUNCHER.toString(), "--version"));
        assertThat(version.code()).isZero();
        assertThat(version.out()).startsWith("Orthogon ");
    }

    @Test
    void userFlagsReplaceTheLaunchersOwn() throws Exception {
        // an impossible heap refuses to start the JVM, which shows the flags reached it
        Run refused = run(Map.of("ORTHOGON_JAVA_OPTS", "-Xmx1k"), List.of(LAUNCHER.toString(), "--version"));
        assertThat(refused.code()).isNotZero();
        Run plain = run(Map.of("ORTHOGON_JAVA_OPTS", "-Xshare:off"), List.of(LAUNCHER.toString(), "--version"));
        assertThat(plain.code()).isZero();
    }

    @Test
    void aSymbolicLinkToTheLauncherFindsTheJar() throws Exception {
        Path link = Files.createSymbolicLink(dir.resolve("orthogon"), LAUNCHER);
        Run version = run(Map.of(), List.of(link.toString(), "--version"));
        Files.delete(link); // ourselves: JUnit warns when it has to remove a link that leads out of its folder
        assertThat(version.code()).as(version.err()).isZero();
        assertThat(version.out()).startsWith("Orthogon ");
    }

    @Test
    void aLauncherWithoutItsJarSaysHowToBuildIt() throws Exception {
        Path bin = Files.createDirectories(dir.resolve("copy/bin"));
        Path copy = bin.resolve("orthogon");
        Files.copy(LAUNCHER, copy);
        Files.setPosixFilePermissions(copy, PosixFilePermissions.fromString("rwxr-xr-x"));
        Run missing = run(Map.of(), List.of(copy.toString(), "--version"));
        assertThat(missing.code()).isEqualTo(Main.EXIT_INPUT);
        assertThat(missing.err()).contains("target/orthogon.jar does not exist").contains("mvn -q -DskipTests package");
    }

    private static String javaBinary() {
        return Path.of(System.getProperty("java.home"), "bin", "java").toString();
    }

    private Run run(Map<String, String> environment, List<String> command) throws IOException, InterruptedException {
        Path out = Files.createTempFile(dir, "out", ".txt");
        Path err = Files.createTempFile(dir, "err", ".txt");
        ProcessBuilder builder = new ProcessBuilder(new ArrayList<>(command)).directory(HOME.toFile())
                .redirectOutput(out.toFile()).redirectError(err.toFile());
        // the same JVM the build runs on, so the archive (made by that JVM) applies
        builder.environment().put("JAVA_HOME", System.getProperty("java.home"));
        builder.environment().remove("ORTHOGON_JAVA_OPTS");
        builder.environment().putAll(environment);
        int code = builder.start().waitFor();
        return new Run(code, Files.readString(out, StandardCharsets.UTF_8), Files.readString(err, StandardCharsets.UTF_8));
    }
}
