package org.orthogon.bench;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.orthogon.analysis.Stability;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.InitialWeight;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;

/**
 * The repeated fits of {@code stability} on the sup-Wald peer workload (N = 25, T = 600, two-step with
 * the Newey-West bandwidth and the fixed-weight variant) on 1 and 2 threads: every break date of the
 * sup-Wald test (the null distribution is drawn once per process, so the time is the fits'), and
 * rolling windows of 120 months moved by one month. Two forks of ten measured iterations: on a 2-core
 * virtual machine one fork of five gave speed-ups anywhere from 1.4x to 2.1x for the same code.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 5, time = 2)
@Measurement(iterations = 10, time = 2)
@Fork(value = 2, jvmArgsAppend = {"-Xms1g", "-Xmx1g"})
public class ThreadScalingBenchmark {
    @Param({"1", "2"})
    int threads;

    PreparedRun prepared;
    List<GmmOptions> variants;

    @Setup
    public void setUp() throws IOException {
        Path folder = Files.createTempDirectory("orthogon-peer");
        Path model = PeerWorkloads.write(folder, "supwald", 5, 1962, 50, PeerWorkloads.SUP_WALD_SEED,
                "bandwidth = \"newey-west\"");
        RunSpec spec = ModelFile.read(model);
        prepared = ModelAssembler.prepare(spec);
        GmmOptions efficient = FittedRun.options(spec, prepared);
        variants = List.of(efficient,
                efficient.withMethod(EstimationMethod.ONE_STEP).withInitialWeight(new InitialWeight.Identity()));
    }

    @Benchmark
    public Object supWaldBothVariants() {
        Object last = null;
        for (GmmOptions options : variants) {
            last = Stability.supWald(prepared.moments(), prepared.startValues(), prepared.dates(), options, 0.15,
                    19930701L, 10_000, threads, i -> { });
        }
        return last;
    }

    @Benchmark
    public Object rollingBothVariants() {
        Object last = null;
        for (GmmOptions options : variants) {
            last = Stability.windows(prepared.moments(), prepared.startValues(), prepared.dates(), options, 120, 1,
                    false, threads, i -> { });
        }
        return last;
    }
}
