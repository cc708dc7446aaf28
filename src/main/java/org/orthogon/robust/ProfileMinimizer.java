package org.orthogon.robust;

import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.PointValuePair;
import org.apache.commons.math3.optim.SimpleValueChecker;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.NelderMeadSimplex;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.SimplexOptimizer;
import org.orthogon.gmm.ParameterBounds;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * min over the other parameters α of S(θ_i = x, α), the concentrated S statistic of Stock and Wright (2000,
 * section 4). S is not smooth where an automatic bandwidth jumps and has no cheap gradient once Ŝ moves with
 * θ, so the search is derivative-free: Nelder-Mead (Nelder and Mead 1965, Computer Journal 7) in standardised
 * coordinates (α - start)/scale, restarted at its own answer until it stops improving, from each start given;
 * the lowest end wins. Parameter bounds are kept by evaluating at the nearest point inside and adding a
 * steep penalty for the distance outside. A local search from a few starts: a lower minimum elsewhere can be
 * missed, which the caller states.
 */
final class ProfileMinimizer {
    private static final int MAX_EVALUATIONS = 4_000;
    private static final int MAX_RESTARTS = 6;
    /** Stand-in value where S is not defined: far above any critical value, finite so the simplex can compare. */
    static final double UNDEFINED = 1e30;
    private static final double PENALTY = 1e8;

    private final MomentModel model;
    private final LongRunOptions options;
    private final boolean smallSample;
    private final double[] lower;
    private final double[] upper;
    private final int tested;
    private final double[] scales;

    /**
     * @param tested index of the parameter held fixed
     * @param scales positive lengths per parameter (the Wald standard errors), the unit of the search
     */
    ProfileMinimizer(MomentModel model, LongRunOptions options, boolean smallSample, ParameterBounds bounds,
            int tested, double[] scales) {
        this.model = model;
        this.options = options;
        this.smallSample = smallSample;
        ParameterBounds box = bounds.forParameters(model.parameterCount());
        this.lower = box.lower();
        this.upper = box.upper();
        this.tested = tested;
        this.scales = scales.clone();
    }

    /** The minimiser θ (with θ_i = x) and S there, or S = {@link #UNDEFINED} when no start reached a defined point. */
    record Minimum(double[] theta, double s) {
        Minimum {
            theta = theta.clone();
        }

        @Override
        public double[] theta() {
            return theta.clone();
        }
    }

    /** θ moved into the bounds, a new array. */
    double[] clamp(double[] theta) {
        double[] out = theta.clone();
        for (int j = 0; j < out.length; j++) {
            out[j] = Math.min(upper[j], Math.max(lower[j], out[j]));
        }
        return out;
    }

    /** S(θ) with penalties: the value the search sees. */
    double objective(double[] theta) {
        double[] inside = clamp(theta);
        double distance = 0.0;
        for (int j = 0; j < theta.length; j++) {
            double d = (theta[j] - inside[j]) / scales[j];
            distance += d * d;
        }
        RobustStatistics.Point point = RobustStatistics.s(model, inside, options, smallSample);
        double s = point.defined() ? point.s() : UNDEFINED;
        return s + PENALTY * distance;
    }

    /** Minimises over every parameter but the tested one, which is held at {@code value}, from each start. */
    Minimum minimize(double value, double[]... starts) {
        int p = model.parameterCount();
        if (p == 1) {
            double[] theta = {value};
            return new Minimum(theta, objective(theta));
        }
        Minimum best = null;
        for (double[] start : starts) {
            Minimum found = fromStart(value, start);
            if (best == null || found.s() < best.s()) {
                best = found;
            }
        }
        return best;
    }

    /**
     * One free parameter: a bracket found by golden-ratio expansion from 0 and ±1 standard error, then Brent's
     * (1973) parabolic search to a relative 1e-10 (Commons Math {@code BracketFinder}, {@code BrentOptimizer}).
     */
    private static double lineSearch(java.util.function.DoubleUnaryOperator f) {
        org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction objective =
                new org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction(f::applyAsDouble);
        org.apache.commons.math3.optim.univariate.BracketFinder bracket =
                new org.apache.commons.math3.optim.univariate.BracketFinder(100, 500);
        try {
            bracket.search(f::applyAsDouble, GoalType.MINIMIZE, -0.5, 0.5);
        } catch (TooManyEvaluationsException e) {
            return 0.0;
        }
        double lo = Math.min(bracket.getLo(), bracket.getHi());
        double hi = Math.max(bracket.getLo(), bracket.getHi());
        double mid = Math.min(Math.max(bracket.getMid(), lo), hi);
        try {
            return new org.apache.commons.math3.optim.univariate.BrentOptimizer(1e-10, 1e-12).optimize(
                    new MaxEval(MAX_EVALUATIONS), objective, GoalType.MINIMIZE,
                    new org.apache.commons.math3.optim.univariate.SearchInterval(lo, hi, mid)).getPoint();
        } catch (TooManyEvaluationsException e) {
            return mid;
        }
    }

    private Minimum fromStart(double value, double[] start) {
        int p = start.length;
        double[] origin = start.clone();
        origin[tested] = value;
        origin = clamp(origin);
        origin[tested] = value;
        double[] base = origin;
        java.util.function.Function<double[], double[]> toTheta = u -> {
            double[] theta = base.clone();
            int c = 0;
            for (int j = 0; j < p; j++) {
                if (j != tested) {
                    theta[j] = base[j] + scales[j] * u[c++];
                }
            }
            return theta;
        };
        double[] u = new double[p - 1];
        if (p == 2) {
            u[0] = lineSearch(v -> objective(toTheta.apply(new double[] {v})));
            double[] theta = clamp(toTheta.apply(u));
            theta[tested] = value;
            RobustStatistics.Point point = RobustStatistics.s(model, theta, options, smallSample);
            return new Minimum(theta, point.defined() ? point.s() : UNDEFINED);
        }
        ObjectiveFunction function = new ObjectiveFunction(v -> objective(toTheta.apply(v)));
        double current = objective(origin);
        SimplexOptimizer optimizer = new SimplexOptimizer(new SimpleValueChecker(1e-10, 1e-10));
        try {
            for (int restart = 0; restart < MAX_RESTARTS; restart++) {
                PointValuePair end = optimizer.optimize(new MaxEval(MAX_EVALUATIONS), function, GoalType.MINIMIZE,
                        new InitialGuess(u), new NelderMeadSimplex(p - 1, 0.3));
                boolean improved = end.getValue() < current - 1e-10 * (1.0 + Math.abs(current));
                if (end.getValue() <= current) {
                    u = end.getPoint();
                    current = end.getValue();
                }
                if (!improved) {
                    break;
                }
            }
        } catch (TooManyEvaluationsException e) {
            // keep the best point reached so far
        }
        double[] theta = clamp(toTheta.apply(u));
        theta[tested] = value;
        RobustStatistics.Point point = RobustStatistics.s(model, theta, options, smallSample);
        return new Minimum(theta, point.defined() ? point.s() : UNDEFINED);
    }
}
