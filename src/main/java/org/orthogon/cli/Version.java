package org.orthogon.cli;

import picocli.CommandLine.IVersionProvider;

/** The version printed by --version: the jar's implementation version, or "development". */
public final class Version implements IVersionProvider {
    /** The Orthogon version string. */
    public static String current() {
        String version = Version.class.getPackage().getImplementationVersion();
        return version == null ? "development" : version;
    }

    @Override
    public String[] getVersion() {
        return new String[] {"Orthogon " + current()};
    }
}
