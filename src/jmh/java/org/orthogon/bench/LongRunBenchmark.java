package org.orthogon.bench;

import java.util.Random;
import java.util.concurrent.TimeUnit;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.orthogon.longrun.Autocovariances;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunEstimate;
import org.orthogon.longrun.LongRunOptions;

/**
 * Time per long-run covariance estimate for K = 100 moments and T = 1200 observations, beside
 * the yardstick of issue 3: an EJML product with the T K² (L + 1) multiply-adds of forming
 * Γ_0..Γ_12 lag by lag (multTransA of the T x K moments by themselves, L + 1 = 13 times).
 * Every estimate starts from the raw moment matrix, as it does inside a GMM iteration.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 5, time = 1)
@Measurement(iterations = 10, time = 1)
@Fork(value = 1, jvmArgsAppend = {"-Xms1g", "-Xmx1g"})
public class LongRunBenchmark {

    static final int T = 1200;
    static final int K = 100;
    static final int LAGS = 12;

    DMatrixRMaj moments;
    DMatrixRMaj product;
    LongRunOptions bartlett;
    LongRunOptions quadraticSpectral;
    LongRunOptions prewhitenedQuadraticSpectral;

    @Setup
    public void setUp() {
        // AR(1) columns with coefficient 0.5 around a common factor: serial and cross correlation as in
        // pricing errors of portfolios, seeded so every run times the same numbers
        Random rng = new Random(20240611L);
        moments = new DMatrixRMaj(T, K);
        double[] state = new double[K];
        double common = 0;
        for (int t = 0; t < T; t++) {
            common = 0.5 * common + rng.nextGaussian();
            for (int k = 0; k < K; k++) {
                state[k] = 0.5 * state[k] + rng.nextGaussian();
                moments.set(t, k, 0.6 * common + state[k]);
            }
        }
        product = new DMatrixRMaj(K, K);
        bartlett = LongRunOptions.bartlettLags(LAGS);
        quadraticSpectral = new LongRunOptions(Kernel.QUADRATIC_SPECTRAL, new BandwidthRule.Andrews(), true, false);
        prewhitenedQuadraticSpectral = quadraticSpectral.withPrewhiten(true);
    }

    /** Bartlett, L = 12 (b = 13, Newey-West 1987). */
    @Benchmark
    public LongRunEstimate bartlettLags12() {
        return LongRunCovariance.estimate(moments, bartlett);
    }

    /** Quadratic spectral with the Andrews (1991) AR(1) bandwidth: every one of the T - 1 lags weighted. */
    @Benchmark
    public LongRunEstimate quadraticSpectralAndrews() {
        return LongRunCovariance.estimate(moments, quadraticSpectral);
    }

    /** The same after VAR(1) prewhitening (Andrews-Monahan 1992), bandwidth chosen on the residuals. */
    @Benchmark
    public LongRunEstimate quadraticSpectralAndrewsPrewhitened() {
        return LongRunCovariance.estimate(moments, prewhitenedQuadraticSpectral);
    }

    /** The lag-by-lag route for comparison: Γ_0..Γ_12 stored, T K² (L + 1) multiply-adds. */
    @Benchmark
    public DMatrixRMaj storedLagsGamma0To12() {
        return Autocovariances.of(moments, true).gamma(LAGS);
    }

    /** Yardstick: T K² (L + 1) = 156,000,000 multiply-adds as L + 1 EJML products F'F. */
    @Benchmark
    public DMatrixRMaj ejmlProductSameWork() {
        for (int j = 0; j <= LAGS; j++) {
            CommonOps_DDRM.multTransA(moments, moments, product);
        }
        return product;
    }
}
