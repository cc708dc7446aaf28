package org.orthogon.analysis;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntConsumer;
import java.util.function.IntFunction;

/**
 * Runs numbered, independent tasks 0..n-1 on a fixed number of threads and returns their results in
 * index order: the repeated fits of sup-Wald break dates, rolling windows, sensitivity rows and
 * bootstrap draws. Each task must be a pure function of its index (its own random stream, no shared
 * mutable state), so the results, and everything written from them, are the same bytes for every
 * thread count and every schedule.
 *
 * <p>Threads pick the next unclaimed index from a shared counter, so slow tasks do not hold back the
 * others; the calling thread works too, so {@code threads = 1} runs everything in order on the
 * caller, with no thread started. When tasks fail, the failure of the lowest index is rethrown (every
 * lower index was claimed before it, so which one that is does not depend on the schedule), after the
 * tasks already running have finished; no new task starts after a failure.
 */
public final class ParallelRunner {
    private ParallelRunner() {
    }

    /** The default thread count: every processor the JVM may use. */
    public static int defaultThreads() {
        return Runtime.getRuntime().availableProcessors();
    }

    /** {@code task(0), ..., task(count - 1)} on {@code threads} threads, in index order. */
    public static <T> List<T> map(int count, int threads, IntFunction<T> task) {
        return map(count, threads, task, index -> {
        });
    }

    /**
     * {@code task(0), ..., task(count - 1)} on {@code threads} threads, in index order.
     *
     * @param done told each finished index, one call at a time (for a progress bar); the order of
     *             the calls follows the schedule, so it must not feed into results
     * @throws IllegalArgumentException for a negative count or fewer than one thread
     */
    public static <T> List<T> map(int count, int threads, IntFunction<T> task, IntConsumer done) {
        if (count < 0 || threads < 1) {
            throw new IllegalArgumentException("need count >= 0 and threads >= 1, got " + count + " and " + threads);
        }
        Object[] results = new Object[count];
        int workers = Math.min(threads, count);
        if (workers <= 1) {
            for (int i = 0; i < count; i++) {
                results[i] = task.apply(i);
                done.accept(i);
            }
            return listOf(results);
        }
        Shared shared = new Shared(count, task, done, results);
        List<Thread> started = new ArrayList<>(workers - 1);
        for (int w = 1; w < workers; w++) {
            Thread thread = new Thread(shared::work, "orthogon-worker-" + w);
            thread.setDaemon(true);
            thread.start();
            started.add(thread);
        }
        shared.work();
        boolean interrupted = false;
        for (Thread thread : started) {
            while (true) {
                try {
                    thread.join();
                    break;
                } catch (InterruptedException e) {
                    interrupted = true;
                }
            }
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        if (shared.failure != null) {
            rethrow(shared.failure);
        }
        return listOf(results);
    }

    @SuppressWarnings("unchecked")
    private static <T> List<T> listOf(Object[] results) {
        return (List<T>) Arrays.asList(results);
    }

    private static void rethrow(Throwable failure) {
        if (failure instanceof RuntimeException runtime) {
            throw runtime;
        }
        if (failure instanceof Error error) {
            throw error;
        }
        throw new IllegalStateException(failure);
    }

    /** The counter, the results and the first failure, shared by the threads of one call. */
    private static final class Shared {
        private final int count;
        private final IntFunction<?> task;
        private final IntConsumer done;
        private final Object[] results;
        private final AtomicInteger next = new AtomicInteger();
        private volatile boolean stopped;
        private Throwable failure;
        private int failedIndex = Integer.MAX_VALUE;

        Shared(int count, IntFunction<?> task, IntConsumer done, Object[] results) {
            this.count = count;
            this.task = task;
            this.done = done;
            this.results = results;
        }

        void work() {
            while (!stopped) {
                int i = next.getAndIncrement();
                if (i >= count) {
                    return;
                }
                try {
                    // distinct indices: the array stores need no lock, and Thread.join publishes them
                    results[i] = task.apply(i);
                    synchronized (this) {
                        done.accept(i);
                    }
                } catch (Throwable t) {
                    synchronized (this) {
                        if (i < failedIndex) {
                            failedIndex = i;
                            failure = t;
                        }
                    }
                    stopped = true;
                }
            }
        }
    }
}
