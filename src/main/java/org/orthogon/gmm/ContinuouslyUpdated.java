package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.exception.MathIllegalStateException;
import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.PointValuePair;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import java.util.function.ToDoubleFunction;
import org.apache.commons.math3.optim.SimpleBounds;
import org.apache.commons.math3.optim.SimplePointChecker;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.BOBYQAOptimizer;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.NelderMeadSimplex;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.SimplexOptimizer;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * The continuously-updated GMM estimator of Hansen, Heaton and Yaron (1996, "Finite-sample properties of
 * some alternative GMM estimators", Journal of Business and Economic Statistics 14):
 * θ̂ = argmin Q(θ), Q(θ) = T g_T(θ)' S(θ)^{-1} g_T(θ), with S(θ) re-estimated at every θ by the run's
 * long-run options (an automatic bandwidth is re-selected at every evaluation; docs/methods.md).
 *
 * <p>Q has no convenient analytic gradient once S moves with θ, so it is minimised derivative-free in
 * standardised coordinates u = (θ - θ̂2)/se(θ̂2): by BOBYQA (Powell 2009, "The BOBYQA algorithm for bound
 * constrained optimization without derivatives", Cambridge NA report 2009/06), which honours the parameter
 * bounds directly, or for a single parameter by Nelder-Mead (Nelder and Mead 1965, Computer Journal 7)
 * restarted at its own answer. The answer is then polished by Newton steps on central-difference
 * derivatives with steps of 1e-4 standard errors. The search runs from the two-step estimate; a cheaper
 * search from ±2 standard errors along each parameter checks it, and disagreeing ends are reported (a
 * lower one found that way replaces the first). Because Q is unchanged when a moment is multiplied by a
 * constant c (g_i → c g_i, S_ij → c S_ij, and likewise for c_j), so is the estimate.
 */
final class ContinuouslyUpdated {
    private static final int MAX_EVALUATIONS = 5_000;
    private static final int MAX_RESTARTS = 8;
    private static final int MAX_NEWTON_STEPS = 10;
    /** Initial trust-region radius (simplex size) in standard errors. */
    private static final double INITIAL_RADIUS = 0.5;
    /** Final radius of the main search, in standard errors; the Newton polish takes it from there. */
    private static final double FINE_RADIUS = 1e-6;
    /** Final radius of the check searches: enough to tell which minimum they fall into. */
    private static final double COARSE_RADIUS = 1e-3;
    /** Newton polish stops when every step is below this many standard errors. */
    private static final double STEP_TOLERANCE = 1e-9;
    /** Ends of different starts closer than this many standard errors count as the same point. */
    private static final double SAME_POINT = 1e-2;
    private static final double OUT_OF_BOUNDS_PENALTY = 1e8;

    private ContinuouslyUpdated() {
    }

    /** The result: the estimate, Q at it, whether the polish met its tolerance, and what the starts showed. */
    record Result(double[] theta, double objective, boolean converged, int evaluations, List<String> notes,
            List<String> atBounds) {
    }

    /**
     * Q(θ) = T g' S(θ)^{-1} g, with S^{-1} g from a Cholesky solve; +∞ where S is not positive definite
     * or the moments are not finite.
     */
    static double objective(MomentModel model, LongRunOptions options, double[] theta) {
        return new Workspace(model, options).objective(theta);
    }

    /**
     * What one search evaluates Q with, thousands of times: the T x K contributions written in place,
     * S^{-1} g and the Cholesky solver are kept between evaluations instead of allocated anew (the
     * long-run covariance itself is formed fresh each time). One search, one thread.
     */
    static final class Workspace {
        private final MomentModel model;
        private final LongRunOptions options;
        private final DMatrixRMaj f = new DMatrixRMaj(1, 1);
        private final DMatrixRMaj sInvG;
        private final LinearSolverDense<DMatrixRMaj> solver;

        Workspace(MomentModel model, LongRunOptions options) {
            this.model = model;
            this.options = options;
            int k = model.momentCount();
            this.sInvG = new DMatrixRMaj(k, 1);
            this.solver = LinearSolverFactory_DDRM.chol(k);
        }

        double objective(double[] theta) {
            model.contributions(theta, f);
            double[] data = f.data;
            int n = f.getNumElements();
            for (int i = 0; i < n; i++) {
                if (!Double.isFinite(data[i])) {
                    return Double.POSITIVE_INFINITY;
                }
            }
            DMatrixRMaj g = org.orthogon.moments.MomentAlgebra.columnMeans(f);
            DMatrixRMaj s = LongRunCovariance.estimate(f, options).covariance();
            if (!solver.setA(s)) {
                return Double.POSITIVE_INFINITY;
            }
            solver.solve(g, sInvG);
            double q = 0.0;
            for (int i = 0; i < g.numRows; i++) {
                q += g.data[i] * sInvG.data[i];
            }
            return model.observations() * q;
        }
    }

    /**
     * Minimises Q from {@code start}, checked from start ± 2 scale_p per parameter.
     *
     * @param scales a positive length per parameter (the two-step standard errors): the unit of the
     *               standardised coordinates, of the difference steps and of the comparison of ends
     */
    static Result minimize(MomentModel model, LongRunOptions options, double[] start, double[] scales,
            ParameterBounds bounds) {
        int p = start.length;
        double[] lowerU = new double[p];
        double[] upperU = new double[p];
        double[] lo = bounds.lower();
        double[] hi = bounds.upper();
        for (int j = 0; j < p; j++) {
            lowerU[j] = (lo[j] - start[j]) / scales[j];
            upperU[j] = (hi[j] - start[j]) / scales[j];
        }
        ParameterBounds box = new ParameterBounds(lowerU, upperU);
        int[] evaluations = {0};
        Workspace workspace = new Workspace(model, options);
        ToDoubleFunction<double[]> q = u -> {
            evaluations[0]++;
            double[] inside = box.clamp(u);
            double distance = 0.0;
            for (int j = 0; j < p; j++) {
                double d = u[j] - inside[j];
                distance += d * d;
            }
            return workspace.objective(theta(start, scales, inside)) + OUT_OF_BOUNDS_PENALTY * distance;
        };

        List<String> notes = new ArrayList<>();
        double[] best;
        boolean[] polished = {false};
        try {
            best = polish(q, search(q, new double[p], box, FINE_RADIUS), box, polished);
        } catch (TooManyEvaluationsException e) {
            return new Result(start.clone(), Double.NaN, false, evaluations[0],
                    List.of("the continuously-updated search from the two-step estimate used up its "
                            + MAX_EVALUATIONS + " evaluations"), List.of());
        } catch (MathIllegalStateException | ArithmeticException | IllegalArgumentException
                | Matrices.SingularMatrixException e) {
            // The objective can leave the region where S is invertible or the SDF is defined.
            return new Result(start.clone(), Double.NaN, false, evaluations[0],
                    List.of("the continuously-updated search from the two-step estimate failed: " + e.getMessage()),
                    List.of());
        }
        double bestValue = q.applyAsDouble(best);
        int higher = 0;
        int flat = 0;
        int failed = 0;
        int checks = 2 * p;
        for (int j = 0; j < p; j++) {
            for (double sign : new double[] {-2.0, 2.0}) {
                double[] from = new double[p];
                from[j] = sign;
                from = box.clamp(from);
                try {
                    double[] end = search(q, from, box, COARSE_RADIUS);
                    double value = q.applyAsDouble(end);
                    if (value < bestValue - 1e-8 * (1.0 + bestValue)) {
                        boolean[] ok = {false};
                        double[] refined = polish(q, search(q, end, box, FINE_RADIUS), box, ok);
                        double refinedValue = q.applyAsDouble(refined);
                        if (refinedValue < bestValue) {
                            if (distance(refined, best) > SAME_POINT) {
                                higher++;
                            }
                            best = refined;
                            bestValue = refinedValue;
                            polished[0] = ok[0];
                            continue;
                        }
                    }
                    if (distance(end, best) > SAME_POINT) {
                        if (value > bestValue + 1e-6 * (1.0 + bestValue)) {
                            higher++;
                        } else {
                            flat++;
                        }
                    }
                } catch (MathIllegalStateException | ArithmeticException | IllegalArgumentException
                        | Matrices.SingularMatrixException e) {
                    // Used up its evaluations, or left the region where S is invertible or the SDF defined.
                    failed++;
                }
            }
        }
        if (failed > 0) {
            notes.add("continuously-updated GMM: " + failed + " of " + checks + " check starts used up their evaluations "
                    + "or left the region where the objective is defined");
        }
        if (higher > 0) {
            notes.add("continuously-updated GMM: the starts disagree: " + higher + " of " + (checks + 1)
                    + " ended at a local minimum with a higher objective; the lowest (" + bestValue + ") is reported");
        }
        if (flat > 0) {
            notes.add("continuously-updated GMM: the starts disagree: " + flat + " of " + (checks + 1)
                    + " ended more than " + SAME_POINT + " standard errors away with the same objective, so the "
                    + "objective is flat there and the parameters are weakly identified");
        }
        double[] theta = theta(start, scales, box.clamp(best));
        List<String> atBounds = bounds.atBounds(theta, model.parameterNames());
        return new Result(theta, workspace.objective(theta), polished[0], evaluations[0], notes, atBounds);
    }

    private static double[] theta(double[] start, double[] scales, double[] u) {
        double[] theta = new double[u.length];
        for (int j = 0; j < u.length; j++) {
            theta[j] = start[j] + scales[j] * u[j];
        }
        return theta;
    }

    /**
     * A derivative-free minimum of q from u0 in standardised coordinates, to a trust-region radius (or,
     * for one parameter, a simplex size) of {@code radius}.
     */
    private static double[] search(ToDoubleFunction<double[]> q, double[] u0, ParameterBounds box, double radius) {
        int p = u0.length;
        if (p >= 2) {
            // BOBYQA needs every box at least twice its initial radius wide.
            double initial = INITIAL_RADIUS;
            double[] lower = box.lower();
            double[] upper = box.upper();
            for (int j = 0; j < p; j++) {
                initial = Math.min(initial, 0.49 * (upper[j] - lower[j]));
            }
            BOBYQAOptimizer optimizer = new BOBYQAOptimizer(2 * p + 1, initial, Math.min(radius, 0.5 * initial));
            PointValuePair optimum = optimizer.optimize(new MaxEval(MAX_EVALUATIONS),
                    new ObjectiveFunction(q::applyAsDouble), GoalType.MINIMIZE, new InitialGuess(u0),
                    new SimpleBounds(box.lower(), box.upper()));
            return optimum.getPoint();
        }
        double[] point = u0.clone();
        double step = INITIAL_RADIUS;
        for (int restart = 0; restart < MAX_RESTARTS && step > radius; restart++) {
            double[] before = point;
            point = new SimplexOptimizer(new SimplePointChecker<>(0.0, radius)).optimize(new MaxEval(MAX_EVALUATIONS),
                    new ObjectiveFunction(q::applyAsDouble), GoalType.MINIMIZE, new InitialGuess(point),
                    new NelderMeadSimplex(new double[] {step})).getPoint();
            step = Math.max(10 * radius, Math.min(step, 10 * distance(point, before)));
            if (distance(point, before) < radius) {
                break;
            }
        }
        return point;
    }

    /**
     * Newton steps u ← u - H^{-1} ∇Q on central differences with step 1e-4 (standard errors), each step
     * halved until Q does not increase. Sets ok[0] when the last step is below {@link #STEP_TOLERANCE}
     * standard errors at a positive-definite H (a strict local minimum), with parameters at a bound
     * held fixed.
     */
    private static double[] polish(ToDoubleFunction<double[]> q, double[] start, ParameterBounds bounds,
            boolean[] ok) {
        double[] scales = new double[start.length];
        java.util.Arrays.fill(scales, 1.0);
        int p = start.length;
        double[] theta = start.clone();
        double value = q.applyAsDouble(theta);
        for (int iteration = 0; iteration < MAX_NEWTON_STEPS; iteration++) {
            boolean[] free = bounds.freeParameters(theta);
            double[] gradient = new double[p];
            DMatrixRMaj hessian = new DMatrixRMaj(p, p);
            NumericalDerivatives.gradientAndHessian(q, theta, scales, 1e-4, gradient, hessian);
            for (int j = 0; j < p; j++) {
                if (!free[j]) {
                    gradient[j] = 0.0;
                    for (int k = 0; k < p; k++) {
                        hessian.unsafe_set(j, k, j == k ? 1.0 : 0.0);
                        hessian.unsafe_set(k, j, j == k ? 1.0 : 0.0);
                    }
                }
            }
            LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.chol(p);
            if (!solver.setA(hessian.copy())) {
                return theta;
            }
            DMatrixRMaj step = new DMatrixRMaj(p, 1);
            solver.solve(DMatrixRMaj.wrap(p, 1, gradient), step);
            double size = 0.0;
            for (int j = 0; j < p; j++) {
                size = Math.max(size, Math.abs(step.data[j]) / scales[j]);
            }
            double length = 1.0;
            double[] trial = null;
            double trialValue = Double.POSITIVE_INFINITY;
            for (int halving = 0; halving < 30; halving++) {
                trial = new double[p];
                for (int j = 0; j < p; j++) {
                    trial[j] = theta[j] - length * step.data[j];
                }
                trialValue = q.applyAsDouble(trial);
                if (trialValue <= value) {
                    break;
                }
                length *= 0.5;
            }
            if (!(trialValue <= value)) {
                // No descent along the Newton direction: θ is a minimum to within the rounding of Q.
                ok[0] = size < 1e-6;
                return theta;
            }
            theta = trial;
            value = trialValue;
            if (size * length < STEP_TOLERANCE) {
                ok[0] = true;
                return theta;
            }
        }
        return theta;
    }

    /** Largest coordinate difference, in standard errors. */
    private static double distance(double[] a, double[] b) {
        double max = 0.0;
        for (int j = 0; j < a.length; j++) {
            max = Math.max(max, Math.abs(a[j] - b[j]));
        }
        return max;
    }
}
