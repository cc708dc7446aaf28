package org.orthogon.report;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.orthogon.data.InputException;

/**
 * An output folder that appears complete or not at all. Files are written into a hidden temporary
 * folder beside the target; {@link #publish()} renames it to the target name in one step. Closing
 * without publishing deletes the temporary folder, so an error never leaves a partial report.
 *
 * <p>Refused with an {@link InputException}: a target that is a file; a folder that already holds
 * a report (a {@value #MANIFEST} or {@value #HTML}) unless overwriting was asked for; a folder that
 * holds anything else, since publishing replaces the whole folder.
 */
public final class OutputFolder implements AutoCloseable {
    /** The manifest's file name; its presence marks a folder as an Orthogon report. */
    public static final String MANIFEST = "manifest.json";
    /** The HTML report's file name. */
    public static final String HTML = "report.html";

    private final Path target;
    private final boolean overwrite;
    private final Path staging;
    private final Map<String, String> written = new LinkedHashMap<>();
    private boolean published;

    private OutputFolder(Path target, boolean overwrite, Path staging) {
        this.target = target;
        this.overwrite = overwrite;
        this.staging = staging;
    }

    /**
     * Checks {@code target} and opens a temporary folder beside it (creating the parent folders).
     *
     * @param target    the folder the report will have when complete
     * @param overwrite true to replace a folder that holds an earlier report
     */
    public static OutputFolder create(Path target, boolean overwrite) {
        Path absolute = target.toAbsolutePath().normalize();
        refuseUnusable(target, absolute, overwrite);
        Path parent = absolute.getParent();
        try {
            Files.createDirectories(parent);
            Path staging = createHidden(parent, "." + absolute.getFileName() + ".orthogon-", true);
            return new OutputFolder(absolute, overwrite, staging);
        } catch (IOException e) {
            throw InputException.in(target).problem("cannot create the output folder: " + e.getMessage(),
                    "check that " + parent + " is writable, or give another --out folder");
        }
    }

    /**
     * Creates a new file or folder named {@code prefix} plus a random suffix in {@code parent}. Unlike
     * {@link Files#createTempDirectory} (mode 0700) and {@link Files#createTempFile} (0600), it takes the
     * permissions the user's umask gives any new file, so a published report reads like every other
     * folder the user writes (0755 and 0644 under umask 022).
     */
    public static Path createHidden(Path parent, String prefix, boolean folder) throws IOException {
        java.security.SecureRandom random = new java.security.SecureRandom();
        for (int attempt = 0; ; attempt++) {
            Path candidate = parent.resolve(prefix + Long.toUnsignedString(random.nextLong()));
            try {
                return folder ? Files.createDirectory(candidate) : Files.createFile(candidate);
            } catch (java.nio.file.FileAlreadyExistsException e) {
                if (attempt > 100) {
                    throw e;
                }
            }
        }
    }

    /** Refuses an unusable target now, before a long computation, with the same rules as {@link #create}. */
    public static void check(Path target, boolean overwrite) {
        refuseUnusable(target, target.toAbsolutePath().normalize(), overwrite);
    }

    private static void refuseUnusable(Path given, Path absolute, boolean overwrite) {
        if (absolute.getParent() == null) {
            throw InputException.in(given).problem("the output folder cannot be a file-system root",
                    "give a folder below it, e.g. --out out/run1");
        }
        if (Files.exists(absolute) && !Files.isDirectory(absolute)) {
            throw InputException.in(given).problem("this is a file, not a folder; the report needs a folder",
                    "give a folder name with --out (it is created), or remove the file");
        }
        if (!Files.isDirectory(absolute)) {
            return;
        }
        boolean report = Files.exists(absolute.resolve(MANIFEST)) || Files.exists(absolute.resolve(HTML));
        if (report && !overwrite) {
            throw InputException.in(given).problem("this folder already holds a report",
                    "add --overwrite to replace it, or give another folder with --out");
        }
        if (!report && !isEmpty(given, absolute)) {
            throw InputException.in(given).problem("this folder holds files that are not an Orthogon report, "
                    + "and writing the report replaces the whole folder",
                    "give a new or empty folder with --out");
        }
    }

    private static boolean isEmpty(Path given, Path folder) {
        try (Stream<Path> entries = Files.list(folder)) {
            return entries.findAny().isEmpty();
        } catch (IOException e) {
            throw InputException.in(given).problem("cannot read the output folder: " + e.getMessage(),
                    "check its permissions, or give another folder with --out");
        }
    }

    /** The final folder. */
    public Path target() {
        return target;
    }

    /** Writes a text file (UTF-8) at {@code name}, a path relative to the folder such as "tables/x.csv". */
    public void write(String name, String text) {
        write(name, text.getBytes(StandardCharsets.UTF_8));
    }

    /** Writes a binary file at {@code name}, relative to the folder. */
    public void write(String name, byte[] bytes) {
        if (published) {
            throw new IllegalStateException("the folder was already published");
        }
        Path file = staging.resolve(name).normalize();
        if (!file.startsWith(staging) || file.equals(staging)) {
            throw new IllegalArgumentException("\"" + name + "\" is not a file inside the output folder");
        }
        try {
            Files.createDirectories(file.getParent());
            Files.write(file, bytes);
        } catch (IOException e) {
            throw InputException.in(target).problem("cannot write " + name + ": " + e.getMessage(),
                    "check that the disk is not full and the folder is writable");
        }
        written.put(name, Hashes.sha256(bytes));
    }

    /** Every file written so far with its SHA-256 (lower-case hex), in the order written. */
    public Map<String, String> written() {
        return java.util.Collections.unmodifiableMap(new LinkedHashMap<>(written));
    }

    /** The names written so far, in the order they were written. */
    public List<String> names() {
        return List.copyOf(written.keySet());
    }

    /**
     * Moves the complete folder to its final name. An earlier report there (allowed by overwrite) is
     * first moved aside and deleted only after the new one is in place.
     */
    public Path publish() {
        refuseUnusable(target, target, overwrite);
        Path aside = null;
        try {
            if (Files.isDirectory(target)) {
                aside = Files.createTempDirectory(target.getParent(), "." + target.getFileName() + ".old-");
                Files.delete(aside);
                move(target, aside);
            }
            try {
                move(staging, target);
            } catch (IOException e) {
                if (aside != null) {
                    move(aside, target);
                    aside = null;
                }
                throw e;
            }
            published = true;
        } catch (IOException e) {
            throw InputException.in(target).problem("cannot move the finished report into place: " + e.getMessage(),
                    "check that the folder is writable and not open in another program");
        } finally {
            if (aside != null) {
                deleteTree(aside);
            }
        }
        return target;
    }

    /** Deletes the temporary folder unless the report was published. */
    @Override
    public void close() {
        if (!published) {
            deleteTree(staging);
        }
    }

    private static void move(Path from, Path to) throws IOException {
        try {
            Files.move(from, to, StandardCopyOption.ATOMIC_MOVE);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(from, to);
        }
    }

    private static void deleteTree(Path root) {
        if (!Files.exists(root)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(root)) {
            for (Path path : (Iterable<Path>) paths.sorted(Comparator.reverseOrder())::iterator) {
                Files.deleteIfExists(path);
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot remove the temporary folder " + root, e);
        }
    }
}
