package org.orthogon.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.stream.Stream;

/** Runs the command line in-process on a private copy of models/ and demo-data/. */
final class CliHarness {
    final Path root;
    final Path models;
    final Path data;

    CliHarness(Path root) throws IOException {
        this.root = root;
        this.models = root.resolve("models");
        this.data = root.resolve("demo-data");
        copyFolder(Paths.get("models"), models);
        copyFolder(Paths.get("demo-data"), data);
    }

    private static void copyFolder(Path from, Path to) throws IOException {
        Files.createDirectories(to);
        try (Stream<Path> files = Files.list(from)) {
            for (Path file : (Iterable<Path>) files::iterator) {
                Files.copy(file, to.resolve(file.getFileName()));
            }
        }
    }

    Result run(String... args) {
        return runIn(args);
    }

    /** Runs the command line in-process with no project copy behind it. */
    static Result runIn(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new PrintWriter(out), new PrintWriter(err), args);
        return new Result(code, out.toString(), err.toString());
    }

    /** Replaces the first occurrence of {@code from} in a file by {@code to}. */
    void edit(Path file, String from, String to) throws IOException {
        String text = Files.readString(file);
        int at = text.indexOf(from);
        if (at < 0) {
            throw new IllegalStateException(from + " not in " + file);
        }
        Files.writeString(file, text.substring(0, at) + to + text.substring(at + from.length()));
    }

    record Result(int code, String out, String err) {
    }
}
