package org.orthogon.cli;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.util.Properties;
import picocli.CommandLine.IVersionProvider;

/**
 * The version printed by --version and written to every manifest: the pom's version, which Maven's
 * resource filtering writes into {@code version.properties} beside this class at build time, so it is
 * the same whether Orthogon runs from the jar, from target/classes or inside the tests.
 */
public final class Version implements IVersionProvider {
    private static final String RESOURCE = "version.properties";

    /** The Orthogon version string, e.g. "0.1.0-SNAPSHOT". */
    public static String current() {
        Properties properties = new Properties();
        try (InputStream in = Version.class.getResourceAsStream(RESOURCE)) {
            if (in == null) {
                throw new IllegalStateException(RESOURCE + " is missing from the build; rebuild with Maven");
            }
            properties.load(in);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + RESOURCE, e);
        }
        String version = properties.getProperty("version", "");
        if (version.isBlank() || version.contains("${")) {
            throw new IllegalStateException(RESOURCE + " was not filtered by Maven (found \"" + version
                    + "\"); rebuild with Maven");
        }
        return version;
    }

    @Override
    public String[] getVersion() {
        return new String[] {"Orthogon " + current()};
    }
}
