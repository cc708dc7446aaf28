package org.orthogon.data;

import java.nio.file.Path;
import java.util.Optional;

/**
 * The one error type for bad input: a data file, a model file or a command-line value that Orthogon
 * refuses. It carries where the problem is (file, line, column), what was found, and the fix, so the
 * command line can print it in one or two lines without a stack trace and exit with code 2.
 *
 * <p>Line and column numbers are 1-based; 0 means "not applicable".
 */
public final class InputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    private final Path file;
    private final int line;
    private final int column;
    private final String columnName;
    private final String problem;
    private final String fix;

    private InputException(Path file, int line, int column, String columnName, String problem, String fix) {
        super(render(file, line, column, columnName, problem, fix));
        this.file = file;
        this.line = line;
        this.column = column;
        this.columnName = columnName;
        this.problem = problem;
        this.fix = fix;
    }

    /**
     * The same error with {@code context} appended to the problem, e.g. which model-file key asked
     * for the missing column; file, line, column and fix are kept.
     */
    public InputException withContext(String context) {
        return new InputException(file, line, column, columnName, problem + " " + context, fix);
    }

    /** Starts an error about {@code file}; finish it with {@link Builder#problem} and {@link Builder#fix}. */
    public static Builder in(Path file) {
        return new Builder(file);
    }

    /** An error with no file behind it, for example a command-line value. */
    public static Builder general() {
        return new Builder(null);
    }

    public Optional<Path> file() {
        return Optional.ofNullable(file);
    }

    public int line() {
        return line;
    }

    public int column() {
        return column;
    }

    public Optional<String> columnName() {
        return Optional.ofNullable(columnName);
    }

    public String problem() {
        return problem;
    }

    public String fix() {
        return fix;
    }

    private static String render(Path file, int line, int column, String columnName, String problem, String fix) {
        StringBuilder where = new StringBuilder();
        if (file != null) {
            where.append(file);
            if (line > 0) {
                where.append(", line ").append(line);
            }
            if (column > 0) {
                where.append(", column ").append(column);
                if (columnName != null) {
                    where.append(" (\"").append(columnName).append("\")");
                }
            } else if (columnName != null) {
                where.append(", column \"").append(columnName).append('"');
            }
            where.append(": ");
        }
        return where + problem + (fix == null || fix.isBlank() ? "" : System.lineSeparator() + "  fix: " + fix);
    }

    /** Fluent construction, so call sites read as one sentence. */
    public static final class Builder {
        private final Path file;
        private int line;
        private int column;
        private String columnName;

        private Builder(Path file) {
            this.file = file;
        }

        public Builder line(int oneBasedLine) {
            this.line = oneBasedLine;
            return this;
        }

        public Builder column(int oneBasedColumn, String name) {
            this.column = oneBasedColumn;
            this.columnName = name;
            return this;
        }

        public Builder column(String name) {
            this.columnName = name;
            return this;
        }

        /** Builds the exception; {@code problem} says what was found, {@code fix} what to do about it. */
        public InputException problem(String problem, String fix) {
            return new InputException(file, line, column, columnName, problem, fix);
        }
    }
}
