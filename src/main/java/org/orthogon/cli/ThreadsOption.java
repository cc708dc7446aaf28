package org.orthogon.cli;

import org.orthogon.analysis.ParallelRunner;
import org.orthogon.data.InputException;
import picocli.CommandLine.Option;

/** {@code --threads N}: how many threads the repeated fits of a heavy verb share. */
final class ThreadsOption {
    @Option(names = "--threads", paramLabel = "N", description = "threads for the repeated fits (default: every "
            + "processor); the results are the same for any N")
    Integer threads;

    /** The thread count asked for, or every processor; refuses a count below one. */
    int count() {
        if (threads == null) {
            return ParallelRunner.defaultThreads();
        }
        if (threads < 1) {
            throw InputException.general().problem("--threads " + threads + " is below one",
                    "give a thread count of at least 1, e.g. --threads 2");
        }
        return threads;
    }
}
