package org.orthogon.report;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import org.orthogon.data.InputException;

/** SHA-256 digests for the manifest. */
public final class Hashes {
    private Hashes() {
    }

    /** The SHA-256 of {@code bytes} as 64 lower-case hex digits. */
    public static String sha256(byte[] bytes) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java runtime provides SHA-256", e);
        }
    }

    /** The SHA-256 of a file's bytes; an {@link InputException} when it cannot be read. */
    public static String sha256(Path file) {
        try {
            return sha256(Files.readAllBytes(file));
        } catch (IOException e) {
            throw InputException.in(file).problem("cannot read this input file again to record its hash: "
                    + e.getMessage(), "check that it was not moved or locked while the run was going on");
        }
    }
}
