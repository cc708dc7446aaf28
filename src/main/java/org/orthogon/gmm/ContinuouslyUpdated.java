package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.PointValuePair;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
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
 * long-run options (an automatic bandwidth is re-selected at every evaluation, DESIGN.md section 3).
 *
 * <p>Q has no convenient analytic gradient once S moves with θ, so it is minimised derivative-free by
 * Nelder-Mead (Nelder and Mead 1965, Computer Journal 7), restarted at its own answer until the answer
 * stops moving (restarts repair the known premature collapse of the simplex; Lagarias et al. 1998, SIAM
 * Journal on Optimization 9), then polished by Newton steps on central-difference derivatives with steps
 * scaled to each parameter's standard error. The search runs from the two-step estimate and from points
 * ±2 standard errors away along each parameter; disagreeing ends are reported. Because Q is unchanged
 * when a moment is multiplied by a constant c (g_i → c g_i, S_ij → c S_ij, and likewise for c_j), so is
 * the estimate.
 */
final class ContinuouslyUpdated {
    private static final int MAX_EVALUATIONS = 20_000;
    private static final int MAX_RESTARTS = 8;
    private static final int MAX_NEWTON_STEPS = 20;
    /** Newton polish stops when every step is below this many standard errors. */
    private static final double STEP_TOLERANCE = 1e-9;
    /** Ends of different starts closer than this many standard errors count as the same point. */
    private static final double SAME_POINT = 1e-4;
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
        DMatrixRMaj f = model.contributions(theta);
        for (double v : f.data) {
            if (!Double.isFinite(v)) {
                return Double.POSITIVE_INFINITY;
            }
        }
        DMatrixRMaj g = org.orthogon.moments.MomentAlgebra.columnMeans(f);
        DMatrixRMaj s = LongRunCovariance.estimate(f, options).covariance();
        LinearSolverDense<DMatrixRMaj> solver = LinearSolverFactory_DDRM.chol(s.numRows);
        if (!solver.setA(s)) {
            return Double.POSITIVE_INFINITY;
        }
        DMatrixRMaj sInvG = new DMatrixRMaj(g.numRows, 1);
        solver.solve(g, sInvG);
        double q = 0.0;
        for (int i = 0; i < g.numRows; i++) {
            q += g.data[i] * sInvG.data[i];
        }
        return model.observations() * q;
    }

    /**
     * Minimises Q from {@code start} and from start ± 2 scale_p per parameter.
     *
     * @param scales a positive length per parameter (the two-step standard errors): simplex sizes,
     *               difference steps and the unit in which points are compared
     */
    static Result minimize(MomentModel model, LongRunOptions options, double[] start, double[] scales,
            ParameterBounds bounds) {
        int p = start.length;
        List<double[]> starts = new ArrayList<>();
        starts.add(start.clone());
        for (int j = 0; j < p; j++) {
            for (double sign : new double[] {-2.0, 2.0}) {
                double[] moved = start.clone();
                moved[j] += sign * scales[j];
                starts.add(bounds.clamp(moved));
            }
        }
        int[] evaluations = {0};
        java.util.function.ToDoubleFunction<double[]> q = theta -> {
            evaluations[0]++;
            double[] inside = bounds.clamp(theta);
            double distance = 0.0;
            for (int j = 0; j < p; j++) {
                double d = (theta[j] - inside[j]) / scales[j];
                distance += d * d;
            }
            return objective(model, options, inside) + OUT_OF_BOUNDS_PENALTY * distance;
        };

        List<double[]> ends = new ArrayList<>();
        List<Double> values = new ArrayList<>();
        List<Boolean> polished = new ArrayList<>();
        int failed = 0;
        for (double[] point : starts) {
            try {
                double[] end = restartedSimplex(q, point, scales);
                boolean[] ok = {false};
                end = bounds.clamp(newtonPolish(q, end, scales, bounds, ok));
                double value = objective(model, options, end);
                if (!Double.isFinite(value)) {
                    failed++;
                    continue;
                }
                ends.add(end);
                values.add(value);
                polished.add(ok[0]);
            } catch (TooManyEvaluationsException e) {
                failed++;
            }
        }
        List<String> notes = new ArrayList<>();
        if (ends.isEmpty()) {
            return new Result(start.clone(), Double.NaN, false, evaluations[0],
                    List.of("the continuously-updated search failed from all " + starts.size() + " starting points"),
                    List.of());
        }
        int best = 0;
        for (int i = 1; i < ends.size(); i++) {
            if (values.get(i) < values.get(best)) {
                best = i;
            }
        }
        double[] theta = ends.get(best);
        double bestValue = values.get(best);
        int higher = 0;
        int flat = 0;
        for (int i = 0; i < ends.size(); i++) {
            if (distance(ends.get(i), theta, scales) > SAME_POINT) {
                if (values.get(i) > bestValue + 1e-8 * (1.0 + bestValue)) {
                    higher++;
                } else {
                    flat++;
                }
            }
        }
        if (failed > 0) {
            notes.add("continuously-updated GMM: " + failed + " of " + starts.size() + " starting points failed");
        }
        if (higher > 0) {
            notes.add("continuously-updated GMM: the starts disagree: " + higher + " of " + starts.size()
                    + " ended at a local minimum with a higher objective; the lowest (" + bestValue + ") is reported");
        }
        if (flat > 0) {
            notes.add("continuously-updated GMM: the starts disagree: " + flat + " of " + starts.size()
                    + " ended more than " + SAME_POINT + " standard errors away with the same objective, so the "
                    + "objective is flat there and the parameters are weakly identified");
        }
        List<String> atBounds = bounds.atBounds(theta, model.parameterNames());
        return new Result(theta, bestValue, polished.get(best), evaluations[0], notes, atBounds);
    }

    private static double[] restartedSimplex(java.util.function.ToDoubleFunction<double[]> q, double[] start,
            double[] scales) {
        SimplexOptimizer optimizer = new SimplexOptimizer(1e-14, 1e-300);
        double[] point = start.clone();
        for (int restart = 0; restart < MAX_RESTARTS; restart++) {
            double[] steps = new double[point.length];
            for (int j = 0; j < point.length; j++) {
                steps[j] = restart == 0 ? scales[j] : 0.1 * scales[j];
            }
            PointValuePair optimum = optimizer.optimize(new MaxEval(MAX_EVALUATIONS),
                    new ObjectiveFunction(q::applyAsDouble), GoalType.MINIMIZE, new InitialGuess(point),
                    new NelderMeadSimplex(steps));
            double[] next = optimum.getPoint();
            double moved = distance(next, point, scales);
            point = next;
            if (restart > 0 && moved < 1e-7) {
                break;
            }
        }
        return point;
    }

    /**
     * Newton steps θ ← θ - H^{-1} ∇Q on central differences with step h_j = 1e-4 scale_j, each step
     * halved until Q does not increase. Sets ok[0] when the last step is below {@link #STEP_TOLERANCE}
     * standard errors at a positive-definite H (a strict local minimum), with parameters at a bound
     * held fixed.
     */
    private static double[] newtonPolish(java.util.function.ToDoubleFunction<double[]> q, double[] start,
            double[] scales, ParameterBounds bounds, boolean[] ok) {
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

    private static double distance(double[] a, double[] b, double[] scales) {
        double max = 0.0;
        for (int j = 0; j < a.length; j++) {
            max = Math.max(max, Math.abs(a[j] - b[j]) / scales[j]);
        }
        return max;
    }
}
