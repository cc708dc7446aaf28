package org.orthogon.longrun;

/**
 * Work arrays of one thread, kept between long-run covariance estimates: a sup-Wald run or a bootstrap
 * forms thousands of S from series of the same size, and allocating the T x K copies afresh each time
 * makes the garbage collector grow the heap far beyond what the run holds. Only estimates whose
 * {@link Autocovariances} never leave {@link LongRunCovariance#estimate} use it, and one estimate runs
 * on one thread, so nothing is shared. The arrays are at least as long as asked for and hold
 * whatever the last use left in them.
 */
final class Workspace {
    private static final ThreadLocal<Workspace> CURRENT = ThreadLocal.withInitial(Workspace::new);

    private double[] series = new double[0];
    private double[] weighted = new double[0];
    private double[] sums = new double[0];
    private org.jtransforms.fft.DoubleFFT_1D fft;

    static Workspace current() {
        return CURRENT.get();
    }

    /** Room for the (centered) series u. */
    double[] series(int length) {
        if (series.length < length) {
            series = new double[length];
        }
        return series;
    }

    /** Room for V = WU. */
    double[] weighted(int length) {
        if (weighted.length < length) {
            weighted = new double[length];
        }
        return weighted;
    }

    /** The plan of a real FFT of length n, kept while n stays the same (its tables are costly to build). */
    org.jtransforms.fft.DoubleFFT_1D fft(int n) {
        if (fft == null || fftLength != n) {
            fft = new org.jtransforms.fft.DoubleFFT_1D(n);
            fftLength = n;
        }
        return fft;
    }

    private int fftLength;

    /** Room for the moving sums of the Bartlett route. */
    double[] sums(int length) {
        if (sums.length < length) {
            sums = new double[length];
        }
        return sums;
    }
}
