package org.orthogon.gmm;

import java.util.Objects;
import org.orthogon.longrun.LongRunOptions;

/**
 * Estimation choices of one GMM run (docs/methods.md).
 *
 * @param method             one-step, two-step, iterated or continuously-updated
 * @param longRun            how S, the long-run covariance of the moments, is estimated
 * @param initialWeight      the fixed weight of one-step GMM and the first-step weight of the others
 * @param bounds             parameter bounds ({@link ParameterBounds#none()} for none)
 * @param maxIterations      cap on the weight updates of iterated GMM (default 100)
 * @param iterationTolerance iterated GMM stops when max_p |θ_p^(i) - θ_p^(i-1)| is below this (default 1e-8)
 * @param confidenceLevel    level of the reported confidence intervals, in (0, 1) (default 0.95)
 * @param hjSeed             seed of the simulated Hansen-Jagannathan p-value (default 20240101)
 * @param hjDraws            draws of that simulation (default 100 000)
 * @param smallSample        multiply S by T/(T - P) for what is reported ({@link SmallSampleCorrection}; default off)
 */
public record GmmOptions(EstimationMethod method, LongRunOptions longRun, InitialWeight initialWeight,
        ParameterBounds bounds, int maxIterations, double iterationTolerance, double confidenceLevel, long hjSeed,
        int hjDraws, boolean smallSample) {

    public static final int DEFAULT_MAX_ITERATIONS = 100;
    public static final double DEFAULT_ITERATION_TOLERANCE = 1e-8;
    public static final double DEFAULT_CONFIDENCE_LEVEL = 0.95;
    public static final long DEFAULT_HJ_SEED = 20240101L;
    public static final int DEFAULT_HJ_DRAWS = 100_000;

    public GmmOptions {
        Objects.requireNonNull(method, "method");
        Objects.requireNonNull(longRun, "longRun");
        Objects.requireNonNull(initialWeight, "initialWeight");
        Objects.requireNonNull(bounds, "bounds");
        if (maxIterations < 1) {
            throw new IllegalArgumentException("maxIterations must be at least 1, got " + maxIterations);
        }
        if (!(iterationTolerance > 0.0)) {
            throw new IllegalArgumentException("iterationTolerance must be > 0, got " + iterationTolerance);
        }
        if (!(confidenceLevel > 0.0 && confidenceLevel < 1.0)) {
            throw new IllegalArgumentException("confidenceLevel must lie strictly between 0 and 1, got "
                    + confidenceLevel);
        }
        if (hjDraws < 1) {
            throw new IllegalArgumentException("hjDraws must be at least 1, got " + hjDraws);
        }
    }

    /** The method and S with every other choice at its default (identity first-step weight, no bounds). */
    public GmmOptions(EstimationMethod method, LongRunOptions longRun) {
        this(method, longRun, new InitialWeight.Identity(), ParameterBounds.none(), DEFAULT_MAX_ITERATIONS,
                DEFAULT_ITERATION_TOLERANCE, DEFAULT_CONFIDENCE_LEVEL, DEFAULT_HJ_SEED, DEFAULT_HJ_DRAWS, false);
    }

    public GmmOptions withMethod(EstimationMethod m) {
        return new GmmOptions(m, longRun, initialWeight, bounds, maxIterations, iterationTolerance, confidenceLevel,
                hjSeed, hjDraws, smallSample);
    }

    public GmmOptions withInitialWeight(InitialWeight w) {
        return new GmmOptions(method, longRun, w, bounds, maxIterations, iterationTolerance, confidenceLevel, hjSeed,
                hjDraws, smallSample);
    }

    public GmmOptions withBounds(ParameterBounds b) {
        return new GmmOptions(method, longRun, initialWeight, b, maxIterations, iterationTolerance, confidenceLevel,
                hjSeed, hjDraws, smallSample);
    }

    public GmmOptions withMaxIterations(int cap) {
        return new GmmOptions(method, longRun, initialWeight, bounds, cap, iterationTolerance, confidenceLevel, hjSeed,
                hjDraws, smallSample);
    }

    public GmmOptions withConfidenceLevel(double level) {
        return new GmmOptions(method, longRun, initialWeight, bounds, maxIterations, iterationTolerance, level, hjSeed,
                hjDraws, smallSample);
    }

    public GmmOptions withHjSimulation(long seed, int draws) {
        return new GmmOptions(method, longRun, initialWeight, bounds, maxIterations, iterationTolerance,
                confidenceLevel, seed, draws, smallSample);
    }

    public GmmOptions withSmallSample(boolean on) {
        return new GmmOptions(method, longRun, initialWeight, bounds, maxIterations, iterationTolerance, confidenceLevel,
                hjSeed, hjDraws, on);
    }
}
