package org.orthogon.analysis;

/**
 * The 32-bit output words of the Mersenne Twister MT19937 (Matsumoto and Nishimura 1998, "Mersenne
 * twister: a 623-dimensionally equidistributed uniform pseudo-random number generator", ACM TOMACS 8),
 * seeded as the reference code's init_by_array with the two halves of a long seed, high word first:
 * the same sequence as Commons Math's {@code MersenneTwister(long)} gives through {@code nextInt()}, a
 * word at a time, here written into arrays in bulk so a simulation can hand blocks of it to several
 * threads. Not thread-safe.
 */
final class MersenneTwisterWords {
    private static final int N = 624;
    private static final int M = 397;
    private static final int MATRIX_A = 0x9908b0df;
    private final int[] mt = new int[N];
    private int index = N;

    MersenneTwisterWords(long seed) {
        int[] key = {(int) (seed >>> 32), (int) (seed & 0xffffffffL)};
        initialise(19650218);
        int i = 1;
        int j = 0;
        for (int k = Math.max(N, key.length); k != 0; k--) {
            long previous = mt[i - 1] & 0xffffffffL;
            long l = ((mt[i] & 0xffffffffL) ^ ((previous ^ (previous >>> 30)) * 1664525L)) + key[j] + j;
            mt[i] = (int) l;
            i++;
            j++;
            if (i >= N) {
                mt[0] = mt[N - 1];
                i = 1;
            }
            if (j >= key.length) {
                j = 0;
            }
        }
        for (int k = N - 1; k != 0; k--) {
            long previous = mt[i - 1] & 0xffffffffL;
            long l = ((mt[i] & 0xffffffffL) ^ ((previous ^ (previous >>> 30)) * 1566083941L)) - i;
            mt[i] = (int) l;
            i++;
            if (i >= N) {
                mt[0] = mt[N - 1];
                i = 1;
            }
        }
        mt[0] = 0x80000000;
    }

    private void initialise(int seed) {
        long value = seed;
        mt[0] = (int) value;
        for (int i = 1; i < N; i++) {
            value = (1812433253L * (value ^ (value >>> 30)) + i) & 0xffffffffL;
            mt[i] = (int) value;
        }
    }

    /** The next {@code count} tempered words, into {@code out[0..count)}. */
    void fill(int[] out, int count) {
        int n = 0;
        while (n < count) {
            if (index >= N) {
                regenerate();
            }
            int take = Math.min(N - index, count - n);
            for (int i = 0; i < take; i++) {
                int y = mt[index + i];
                y ^= y >>> 11;
                y ^= (y << 7) & 0x9d2c5680;
                y ^= (y << 15) & 0xefc60000;
                y ^= y >>> 18;
                out[n + i] = y;
            }
            index += take;
            n += take;
        }
    }

    /** The next N words of the state, in place (the reference code's three loops). */
    private void regenerate() {
        int k = 0;
        for (; k < N - M; k++) {
            int y = (mt[k] & 0x80000000) | (mt[k + 1] & 0x7fffffff);
            mt[k] = mt[k + M] ^ (y >>> 1) ^ (-(y & 1) & MATRIX_A);
        }
        for (; k < N - 1; k++) {
            int y = (mt[k] & 0x80000000) | (mt[k + 1] & 0x7fffffff);
            mt[k] = mt[k + M - N] ^ (y >>> 1) ^ (-(y & 1) & MATRIX_A);
        }
        int y = (mt[N - 1] & 0x80000000) | (mt[0] & 0x7fffffff);
        mt[N - 1] = mt[M - 1] ^ (y >>> 1) ^ (-(y & 1) & MATRIX_A);
        index = 0;
    }
}
