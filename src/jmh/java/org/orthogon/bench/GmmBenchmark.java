package org.orthogon.bench;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
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
import org.orthogon.demo.LumenEconomy;
import org.orthogon.demo.LumenSimulator;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ScaledMoments;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelAssembler;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.PreparedRun;
import org.orthogon.spec.RunSpec;

/**
 * Time per complete GMM fit (issue 4): a two-step linear SDF on N = 100 excess returns with 3 factors
 * and T = 1200 months, Bartlett L = 12; and iterated GMM for power utility on the shipped demo data
 * (12 quarterly portfolios, T = 252). Each fit includes the closing S, standard errors, pricing errors
 * and the simulated p-value of the Hansen-Jagannathan distance, as a `fit` does.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(value = 1, jvmArgsAppend = {"-Xms1g", "-Xmx1g"})
public class GmmBenchmark {
    static final int ASSETS = 100;
    static final int MONTHS = 1200;

    MomentModel hundredAssets;
    GmmOptions secondStepBartlett;
    PreparedRun powerUtility;
    GmmOptions iterated;

    @Setup
    public void setUp() {
        // 100 excess returns: the 12 Lumen portfolios' loadings recycled with seeded idiosyncratic noise,
        // on 100 years of simulated Lumen factors.
        LumenEconomy economy = LumenEconomy.standard();
        var sample = LumenSimulator.simulate(economy, 1900, MONTHS / 12, 7L);
        java.util.Random noise = new java.util.Random(11L);
        double[][] excess = new double[MONTHS][ASSETS];
        List<String> names = new ArrayList<>();
        for (int i = 0; i < ASSETS; i++) {
            names.add("A" + i);
        }
        for (int t = 0; t < MONTHS; t++) {
            for (int i = 0; i < ASSETS; i++) {
                double[] loading = economy.loadings()[i % 12];
                double value = 0.02 * noise.nextGaussian();
                for (int k = 0; k < 3; k++) {
                    value += loading[k] * (1 + 0.05 * (i / 12)) * sample.factors()[t][k];
                }
                excess[t][i] = value;
            }
        }
        hundredAssets = ScaledMoments.unscaled(new LinearFactorErrors(excess, sample.factors(), names,
                economy.factorNames()));
        secondStepBartlett = new GmmOptions(EstimationMethod.TWO_STEP, LongRunOptions.bartlettLags(12));

        RunSpec spec = ModelFile.read(Path.of("models/lumen-power-utility.toml"));
        powerUtility = ModelAssembler.prepare(spec);
        iterated = FittedRun.options(spec, powerUtility).withMethod(EstimationMethod.ITERATED);
    }

    @Benchmark
    public GmmFit twoStepHundredAssetsBartlett12() {
        return GmmEstimator.estimate(hundredAssets, new double[3], secondStepBartlett);
    }

    @Benchmark
    public GmmFit iteratedPowerUtilityDemo() {
        return GmmEstimator.estimate(powerUtility.moments(), powerUtility.startValues(), iterated);
    }
}
