package org.orthogon.cli;

import java.util.function.IntConsumer;
import me.tongfei.progressbar.ProgressBar;
import me.tongfei.progressbar.ProgressBarBuilder;
import me.tongfei.progressbar.ProgressBarStyle;

/** A progress bar on standard error, only when a person is watching a terminal. */
final class Progress implements IntConsumer, AutoCloseable {
    private final ProgressBar bar;

    private Progress(ProgressBar bar) {
        this.bar = bar;
    }

    /** A bar for {@code total} steps, or a silent counter when no terminal is attached or the job is short. */
    static Progress start(String task, int total) {
        if (System.console() == null || total < 20) {
            return new Progress(null);
        }
        return new Progress(new ProgressBarBuilder().setTaskName(task).setInitialMax(total)
                .setStyle(ProgressBarStyle.ASCII).continuousUpdate().build());
    }

    @Override
    public void accept(int ignored) {
        if (bar != null) {
            bar.step();
        }
    }

    @Override
    public void close() {
        if (bar != null) {
            bar.close();
        }
    }
}
