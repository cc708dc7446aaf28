package org.orthogon.bootstrap;

import org.apache.commons.math3.random.RandomGenerator;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.longrun.Kernel;

/**
 * Block resampling of T rows: ceil(T/L) blocks of L consecutive rows drawn independently and
 * uniformly among the scheme's blocks, laid end to end and cut at T rows. Also the moments of the
 * bootstrap world this resampling defines, which the recentring and the Hall-Horowitz corrections need.
 *
 * @param observations T
 * @param blockLength  L, 1 ≤ L ≤ T (L = 1 is the ordinary bootstrap of rows)
 * @param scheme       moving or circular blocks
 */
public record BlockResampler(int observations, int blockLength, BlockScheme scheme) {

    public BlockResampler {
        if (observations < 2) {
            throw new IllegalArgumentException("a block bootstrap needs at least 2 observations, got " + observations);
        }
        if (blockLength < 1 || blockLength > observations) {
            throw new IllegalArgumentException("block length " + blockLength + " is outside 1.." + observations);
        }
        java.util.Objects.requireNonNull(scheme, "scheme");
    }

    /** Number of blocks a row can be drawn from: T - L + 1 moving blocks, T circular ones. */
    public int blockCount() {
        return scheme == BlockScheme.MOVING ? observations - blockLength + 1 : observations;
    }

    /**
     * One resample: the T row indices, block after block. Each block start is one draw of
     * {@code random.nextInt(blockCount())}; circular blocks wrap past the last row.
     */
    public int[] draw(RandomGenerator random) {
        int[] rows = new int[observations];
        int filled = 0;
        int starts = blockCount();
        while (filled < observations) {
            int start = random.nextInt(starts);
            for (int i = 0; i < blockLength && filled < observations; i++) {
                rows[filled++] = (start + i) % observations;
            }
        }
        return rows;
    }

    /**
     * E*[ḡ*], the bootstrap expectation of the mean of a resampled T x K series: row r of a resample
     * sits at position i = r mod L of its block, so E*[f*_r] = a_i, the mean of f_{s+i} over the block
     * starts s, and E*[ḡ*] = (1/T) Σ_r a_{r mod L}. For circular blocks every a_i is the sample mean
     * (every row is equally likely); for moving blocks rows near the ends are drawn less often.
     * Subtracting this vector recentres the bootstrap moments so that the bootstrap population satisfies
     * the moment conditions exactly (Hall and Horowitz 1996, "Bootstrap critical values for tests based
     * on generalized-method-of-moments estimators", Econometrica 64, section 3).
     */
    public double[] expectedMean(DMatrixRMaj series) {
        requireRows(series);
        int k = series.numCols;
        double[][] positionMeans = positionMeans(series);
        double[] mean = new double[k];
        for (int r = 0; r < observations; r++) {
            double[] a = positionMeans[r % blockLength];
            for (int c = 0; c < k; c++) {
                mean[c] += a[c];
            }
        }
        for (int c = 0; c < k; c++) {
            mean[c] /= observations;
        }
        return mean;
    }

    /** a_i = the mean of f_{s+i} over the block starts s, i = 0..L-1 (rows wrap for circular blocks). */
    private double[][] positionMeans(DMatrixRMaj series) {
        int k = series.numCols;
        double[][] means = new double[blockLength][k];
        if (scheme == BlockScheme.CIRCULAR) {
            double[] all = new double[k];
            for (int t = 0; t < observations; t++) {
                for (int c = 0; c < k; c++) {
                    all[c] += series.data[t * k + c];
                }
            }
            for (int c = 0; c < k; c++) {
                all[c] /= observations;
            }
            for (int i = 0; i < blockLength; i++) {
                means[i] = all.clone();
            }
            return means;
        }
        int starts = blockCount();
        double[] window = new double[k];
        for (int t = 0; t < starts; t++) {
            for (int c = 0; c < k; c++) {
                window[c] += series.data[t * k + c];
            }
        }
        for (int i = 0; i < blockLength; i++) {
            if (i > 0) {
                // slide the window of rows i..i+starts-1 by one row
                for (int c = 0; c < k; c++) {
                    window[c] += series.data[(i + starts - 1) * k + c] - series.data[(i - 1) * k + c];
                }
            }
            for (int c = 0; c < k; c++) {
                means[i][c] = window[c] / starts;
            }
        }
        return means;
    }

    /**
     * The two long-run covariances of the bootstrap world at the estimate, from the sample's
     * contributions f_t(θ̂) centred at their bootstrap mean (u_t = f_t - E*[ḡ*]):
     * <ul>
     *   <li>Σ̃ = Σ_{|j|&lt;L} (1 - |j|/L) Γ̃_j, the exact covariance of a block sum divided by L, which is
     *       the long-run covariance of the resampled series (blocks are independent draws);</li>
     *   <li>S̃ = Σ_{|j|&lt;L} k(j/b) (1 - |j|/L) Γ̃_j, what the sample's kernel estimator (kernel k,
     *       bandwidth b) estimates when it is applied to a resample: of the pairs of rows j apart, the
     *       share 1 - j/L falls inside one block and carries Γ̃_j, the rest straddles two independent
     *       blocks and carries nothing on average.</li>
     * </ul>
     * Γ̃_j is the covariance of two rows j apart inside one block: for circular blocks the circular
     * autocovariance (1/T) Σ_t u_t u_{(t+j) mod T}', for moving blocks the average of u_{s+i} u_{s+i+j}'
     * over block starts s and positions i. Hall and Horowitz (1996, section 3) compare the same two
     * matrices (for non-overlapping blocks and a truncated kernel) to correct the bootstrap t and J
     * statistics; {@link HallHorowitz} uses them.
     *
     * @return {Σ̃, S̃}, both K x K
     */
    public DMatrixRMaj[] worldCovariances(DMatrixRMaj series, Kernel kernel, double bandwidth) {
        requireRows(series);
        int k = series.numCols;
        double[] centre = expectedMean(series);
        double[] u = new double[observations * k];
        for (int t = 0; t < observations; t++) {
            for (int c = 0; c < k; c++) {
                u[t * k + c] = series.data[t * k + c] - centre[c];
            }
        }
        DMatrixRMaj blockCovariance = new DMatrixRMaj(k, k);
        DMatrixRMaj kernelCovariance = new DMatrixRMaj(k, k);
        double[] gamma = new double[k * k];
        for (int j = 0; j < blockLength; j++) {
            withinBlockCovariance(u, k, j, gamma);
            double share = 1.0 - (double) j / blockLength;
            double kernelWeight = j == 0 ? 1.0 : kernel == Kernel.NONE || bandwidth <= 0.0 ? 0.0
                    : kernel.weight(j / bandwidth);
            for (int a = 0; a < k; a++) {
                for (int b = 0; b < k; b++) {
                    // Γ_j + Γ_j' for j > 0, Γ_0 once
                    double term = j == 0 ? gamma[a * k + b] : gamma[a * k + b] + gamma[b * k + a];
                    blockCovariance.data[a * k + b] += share * term;
                    kernelCovariance.data[a * k + b] += kernelWeight * share * term;
                }
            }
        }
        return new DMatrixRMaj[] {blockCovariance, kernelCovariance};
    }

    /** Γ̃_j into {@code out} (K x K row-major): the average of u_a u_{a+j}' over within-block pairs. */
    private void withinBlockCovariance(double[] u, int k, int lag, double[] out) {
        java.util.Arrays.fill(out, 0.0);
        if (scheme == BlockScheme.CIRCULAR) {
            for (int t = 0; t < observations; t++) {
                addOuter(u, t, (t + lag) % observations, k, 1.0, out);
            }
            scale(out, 1.0 / observations);
            return;
        }
        int starts = blockCount();
        // the pair (t, t + lag) lies inside the blocks starting at s with t + lag - L + 1 <= s <= t
        for (int t = 0; t + lag < observations; t++) {
            int first = Math.max(0, t + lag - blockLength + 1);
            int last = Math.min(t, starts - 1);
            if (last >= first) {
                addOuter(u, t, t + lag, k, last - first + 1, out);
            }
        }
        scale(out, 1.0 / ((double) starts * (blockLength - lag)));
    }

    private static void addOuter(double[] u, int row, int other, int k, double weight, double[] out) {
        int at = row * k;
        int with = other * k;
        for (int a = 0; a < k; a++) {
            double left = weight * u[at + a];
            int base = a * k;
            for (int b = 0; b < k; b++) {
                out[base + b] += left * u[with + b];
            }
        }
    }

    private static void scale(double[] values, double factor) {
        for (int i = 0; i < values.length; i++) {
            values[i] *= factor;
        }
    }

    private void requireRows(DMatrixRMaj series) {
        if (series.numRows != observations) {
            throw new IllegalArgumentException("series has " + series.numRows + " rows, the resampler " + observations);
        }
    }
}
