package org.orthogon.bench;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;
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
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;

/**
 * The in-process fit of the peer comparison (bench/compare.py, docs/benchmarks.md): the linear SDF on
 * N = 100 excess returns of the Lumen peer workload ({@link PeerWorkloads}, 3 factors, T = 1200 months),
 * two-step GMM with the Bartlett kernel and 4 lags, with full inference: standard errors, the J test,
 * the pricing errors and their joint test, and the Hansen-Jagannathan distance with its p-value. The
 * data are read through the model file once, in the setup, as {@code fit} reads them.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 5, time = 1)
@Measurement(iterations = 10, time = 1)
@Fork(value = 1, jvmArgsAppend = {"-Xms1g", "-Xmx1g"})
public class PeerWorkloadBenchmark {
    PreparedRun prepared;
    GmmOptions options;

    @Setup
    public void setUp() throws IOException {
        Path folder = Files.createTempDirectory("orthogon-peer");
        Path model = PeerWorkloads.write(folder, "fit", 10, 1900, 100, PeerWorkloads.FIT_SEED, "lags = 4");
        RunSpec spec = ModelFile.read(model);
        prepared = ModelAssembler.prepare(spec);
        options = FittedRun.options(spec, prepared);
    }

    @Benchmark
    public GmmFit twoStepBartlett4() {
        return GmmEstimator.estimate(prepared.moments(), prepared.startValues(), options);
    }
}
