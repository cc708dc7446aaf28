package org.orthogon.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.locks.LockSupport;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Results in index order whatever the thread count and the finishing order; the lowest failure wins. */
class ParallelRunnerTest {

    /** A task whose duration varies with the index, so threads finish out of order. */
    private static long slowSquare(int i) {
        LockSupport.parkNanos((i * 7919L % 13) * 100_000L);
        return (long) i * i;
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 3, 8})
    void resultsComeInIndexOrderForEveryThreadCount(int threads) {
        List<Integer> done = Collections.synchronizedList(new ArrayList<>());
        List<Long> squares = ParallelRunner.map(40, threads, ParallelRunnerTest::slowSquare, done::add);
        for (int i = 0; i < 40; i++) {
            assertThat(squares.get(i)).isEqualTo((long) i * i);
        }
        assertThat(done).hasSize(40).containsExactlyInAnyOrderElementsOf(
                java.util.stream.IntStream.range(0, 40).boxed().toList());
    }

    @Test
    void oneThreadRunsEverythingOnTheCallerInOrder() {
        Thread caller = Thread.currentThread();
        List<Integer> order = new ArrayList<>();
        ParallelRunner.map(10, 1, i -> {
            assertThat(Thread.currentThread()).isSameAs(caller);
            order.add(i);
            return i;
        });
        assertThat(order).containsExactly(0, 1, 2, 3, 4, 5, 6, 7, 8, 9);
    }

    @Test
    void severalThreadsReallyShareTheWork() {
        Set<Thread> seen = ConcurrentHashMap.newKeySet();
        ParallelRunner.map(200, 3, i -> {
            seen.add(Thread.currentThread());
            LockSupport.parkNanos(200_000L);
            return i;
        });
        assertThat(seen).hasSizeGreaterThan(1);
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 4})
    void theFailureOfTheLowestIndexIsRethrown(int threads) {
        assertThatThrownBy(() -> ParallelRunner.map(50, threads, i -> {
            slowSquare(i);
            if (i == 17 || i == 31 || i == 44) {
                throw new IllegalStateException("task " + i);
            }
            return i;
        })).isInstanceOf(IllegalStateException.class).hasMessage("task 17");
    }

    @Test
    void emptyRunsAndBadThreadCounts() {
        assertThat(ParallelRunner.map(0, 4, i -> i)).isEmpty();
        assertThatThrownBy(() -> ParallelRunner.map(3, 0, i -> i)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> ParallelRunner.map(-1, 2, i -> i)).isInstanceOf(IllegalArgumentException.class);
        assertThat(ParallelRunner.defaultThreads()).isPositive();
    }
}
