package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.apache.commons.math3.exception.ConvergenceException;
import org.apache.commons.math3.exception.TooManyEvaluationsException;
import org.apache.commons.math3.exception.TooManyIterationsException;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresBuilder;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresOptimizer;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresProblem;
import org.apache.commons.math3.fitting.leastsquares.LevenbergMarquardtOptimizer;
import org.apache.commons.math3.fitting.leastsquares.MultivariateJacobianFunction;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;
import org.apache.commons.math3.util.Pair;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.ParameterOutOfRangeException;

/**
 * Minimises the GMM objective Q(θ) = T g_T(θ)' W g_T(θ) for a fixed weight W.
 *
 * <p>Models linear in θ use the closed form θ = -(D'WD)^{-1} D'W g_T(0) (Hansen 1982; for the linear
 * SDF this is b = (C'WC)^{-1} C'W d, Cochrane 2005 section 13.2). Non-linear models are solved as the
 * non-linear least-squares problem min |L' g_T(θ)|² with W = L L', by Levenberg-Marquardt
 * (Moré 1978) from several starting points, keeping the lowest objective. A run whose gradient
 * D'W g_T is not near zero is reported as not converged rather than returned as an estimate.
 *
 * <p>Exactly identified models (K = P) do not depend on W: a linear one is solved as D θ = -g_T(0)
 * directly, because forming D'WD squares the condition number (for a regression, X'X instead of X).
 * Parameter bounds are enforced by clamping every Levenberg-Marquardt iterate into the box; a closed
 * form outside the box falls back to the clamped solver. Parameters that end on a bound are listed in
 * {@link Minimum#atBounds()} and excluded from the first-order check (at a bound the gradient need not
 * vanish), so the caller can refuse to call the estimate clean.
 */
public final class WeightedMinimizer {
    private static final int MAX_EVALUATIONS = 20_000;
    private static final double GRADIENT_TOLERANCE = 1e-7;
    /** Starting points for a non-linear search: the user's, then each parameter moved by these factors. */
    private static final double[] START_SCALES = {0.5, 1.5, 3.0};

    private WeightedMinimizer() {
    }

    /**
     * The minimiser of Q(θ) for fixed W.
     *
     * @param model  the moment conditions
     * @param weight the K x K symmetric positive-definite weight W
     * @param start  starting values (ignored by the closed form)
     */
    public static Minimum minimize(MomentModel model, DMatrixRMaj weight, double[] start) {
        return minimize(model, weight, start, ParameterBounds.none());
    }

    /**
     * The minimiser of Q(θ) for fixed W over lower ≤ θ ≤ upper.
     *
     * @param bounds parameter bounds; {@link ParameterBounds#none()} for none
     */
    public static Minimum minimize(MomentModel model, DMatrixRMaj weight, double[] start, ParameterBounds bounds) {
        ParameterBounds box = bounds.forParameters(model.parameterCount());
        Minimum found;
        if (model.isLinear()) {
            Minimum closed = model.momentCount() == model.parameterCount() ? exactlyIdentified(model, weight)
                    : closedForm(model, weight);
            if (box.isUnbounded() || box.atBounds(closed.theta(), model.parameterNames()).isEmpty()
                    && Arrays.equals(box.clamp(closed.theta()), closed.theta())) {
                return closed;
            }
            found = levenbergMarquardt(model, weight, box.clamp(closed.theta()), box);
        } else {
            found = levenbergMarquardt(model, weight, box.clamp(start), box);
        }
        return found.atBounds().isEmpty() ? found : withBoundParametersFixed(model, weight, found, box);
    }

    /**
     * Re-solves for the parameters that are off their bounds with the others held on them: clamped
     * Levenberg-Marquardt steps can stall at a corner, while the reduced problem is an ordinary one
     * (a closed form again for a linear model).
     */
    private static Minimum withBoundParametersFixed(MomentModel model, DMatrixRMaj weight, Minimum found,
            ParameterBounds box) {
        double[] theta = found.theta();
        boolean[] free = box.freeParameters(theta);
        int count = 0;
        for (boolean f : free) {
            count += f ? 1 : 0;
        }
        if (count == 0) {
            return new Minimum(theta, found.objective(), true, found.iterations(), found.starts(), found.notes(),
                    found.atBounds());
        }
        int[] index = new int[count];
        double[] lower = new double[count];
        double[] upper = new double[count];
        double[] reducedStart = new double[count];
        double[] boxLower = box.lower();
        double[] boxUpper = box.upper();
        for (int p = 0, q = 0; p < theta.length; p++) {
            if (free[p]) {
                index[q] = p;
                lower[q] = boxLower[p];
                upper[q] = boxUpper[p];
                reducedStart[q++] = theta[p];
            }
        }
        Minimum reduced = minimize(new FixedParameters(model, theta, index), weight, reducedStart,
                new ParameterBounds(lower, upper));
        double[] merged = theta.clone();
        double[] solved = reduced.theta();
        for (int q = 0; q < count; q++) {
            merged[index[q]] = solved[q];
        }
        List<String> notes = new ArrayList<>(found.notes());
        notes.removeIf(n -> n.startsWith("the gradient D'W g"));
        notes.addAll(reduced.notes());
        return new Minimum(merged, objective(model, weight, merged), reduced.converged(),
                found.iterations() + reduced.iterations(), found.starts(), notes,
                box.atBounds(merged, model.parameterNames()));
    }

    /** A model with some parameters held at given values; θ of the view holds the others, in order. */
    private static final class FixedParameters extends ForwardingMomentModel {
        private final double[] full;
        private final int[] index;

        FixedParameters(MomentModel model, double[] full, int[] index) {
            super(model);
            this.full = full.clone();
            this.index = index.clone();
        }

        private double[] expand(double[] theta) {
            double[] out = full.clone();
            for (int q = 0; q < index.length; q++) {
                out[index[q]] = theta[q];
            }
            return out;
        }

        @Override
        public List<String> parameterNames() {
            List<String> names = new ArrayList<>(index.length);
            for (int p : index) {
                names.add(base.parameterNames().get(p));
            }
            return names;
        }

        @Override
        public DMatrixRMaj contributions(double[] theta) {
            return base.contributions(expand(theta));
        }

        @Override
        public double meanDiscountFactor(double[] theta) {
            return base.meanDiscountFactor(expand(theta));
        }

        @Override
        public MomentModel rows(int from, int to) {
            return new FixedParameters(base.rows(from, to), full, index);
        }

        @Override
        public DMatrixRMaj meanJacobian(double[] theta) {
            DMatrixRMaj d = base.meanJacobian(expand(theta));
            DMatrixRMaj out = new DMatrixRMaj(d.numRows, index.length);
            for (int i = 0; i < d.numRows; i++) {
                for (int q = 0; q < index.length; q++) {
                    out.unsafe_set(i, q, d.unsafe_get(i, index[q]));
                }
            }
            return out;
        }
    }

    /**
     * θ solving g_T(0) + D θ = 0 for a linear model with K = P: the GMM estimate for every W. Refined by
     * steps θ ← θ - D^{-1} g_T(θ) with g_T(θ) recomputed from the data (Wilkinson's iterative refinement,
     * Higham 2002, "Accuracy and Stability of Numerical Algorithms", chapter 12): the residual of the
     * moments themselves is far more accurate than D θ + g_T(0), which recovers the digits that forming
     * D = -X'X/T loses in a regression.
     */
    static Minimum exactlyIdentified(MomentModel model, DMatrixRMaj weight) {
        double[] zero = new double[model.parameterCount()];
        DMatrixRMaj jacobian = model.meanJacobian(zero);
        DMatrixRMaj intercept = model.meanMoments(zero);
        CommonOps_DDRM.scale(-1.0, intercept);
        double[] estimate = Matrices.solveSquare(jacobian, intercept, "D (K = P)").data.clone();
        refine(model, jacobian, null, estimate);
        return new Minimum(estimate, objective(model, weight, estimate), true, 0, 1, List.of(), List.of());
    }

    private static final int REFINEMENT_STEPS = 3;

    /**
     * Iterative refinement of a linear model's estimate in place: θ ← θ - A^{-1} B g_T(θ), with
     * A = D (B = I) for K = P and A = D'WD, B = D'W otherwise (exact Newton steps on an affine g).
     */
    private static void refine(MomentModel model, DMatrixRMaj jacobian, DMatrixRMaj dtw, double[] theta) {
        refine(model, jacobian, dtw, null, theta);
    }

    /**
     * As above; for K > P the Newton matrix D'WD was already inverted by the caller ({@code inverse}),
     * so each step is a product with that inverse instead of a new factorisation.
     */
    private static void refine(MomentModel model, DMatrixRMaj jacobian, DMatrixRMaj dtw, DMatrixRMaj inverse,
            double[] theta) {
        DMatrixRMaj normal = null;
        if (dtw != null && inverse == null) {
            normal = new DMatrixRMaj(theta.length, theta.length);
            CommonOps_DDRM.mult(dtw, jacobian, normal);
        }
        for (int step = 0; step < REFINEMENT_STEPS; step++) {
            DMatrixRMaj g = model.meanMoments(theta);
            DMatrixRMaj correction;
            if (dtw == null) {
                correction = Matrices.solveSquare(jacobian, g, "D (K = P)");
            } else {
                DMatrixRMaj rhs = new DMatrixRMaj(theta.length, 1);
                CommonOps_DDRM.mult(dtw, g, rhs);
                if (inverse != null) {
                    correction = new DMatrixRMaj(theta.length, 1);
                    CommonOps_DDRM.mult(inverse, rhs, correction);
                } else {
                    correction = Matrices.solveSquare(normal, rhs, "D'WD");
                }
            }
            for (int j = 0; j < theta.length; j++) {
                theta[j] -= correction.data[j];
            }
        }
    }

    /** θ = -(D'WD)^{-1} D'W g_T(0); exact for models affine in θ. */
    public static Minimum closedForm(MomentModel model, DMatrixRMaj weight) {
        int p = model.parameterCount();
        double[] zero = new double[p];
        DMatrixRMaj jacobian = model.meanJacobian(zero);
        DMatrixRMaj intercept = model.meanMoments(zero);
        DMatrixRMaj dtw = new DMatrixRMaj(p, weight.numCols);
        CommonOps_DDRM.multTransA(jacobian, weight, dtw);
        DMatrixRMaj normal = new DMatrixRMaj(p, p);
        CommonOps_DDRM.mult(dtw, jacobian, normal);
        DMatrixRMaj rhs = new DMatrixRMaj(p, 1);
        CommonOps_DDRM.mult(dtw, intercept, rhs);
        DMatrixRMaj inverse = Matrices.invertSymmetric(Matrices.symmetrize(normal), "D'WD");
        DMatrixRMaj theta = new DMatrixRMaj(p, 1);
        CommonOps_DDRM.mult(-1.0, inverse, rhs, theta);
        double[] estimate = theta.data.clone();
        refine(model, jacobian, dtw, inverse, estimate);
        return new Minimum(estimate, objective(model, weight, estimate), true, 0, 1, List.of(), List.of());
    }

    /** T g_T(θ)' W g_T(θ). */
    public static double objective(MomentModel model, DMatrixRMaj weight, double[] theta) {
        return Inference.quadraticStatistic(model.meanMoments(theta), weight, model.observations());
    }

    /** Levenberg-Marquardt from several starting points; exposed so tests can compare it with the closed form. */
    public static Minimum levenbergMarquardt(MomentModel model, DMatrixRMaj weight, double[] start) {
        return levenbergMarquardt(model, weight, start, ParameterBounds.none());
    }

    /** Levenberg-Marquardt from several starting points, each iterate clamped into the bounds. */
    public static Minimum levenbergMarquardt(MomentModel model, DMatrixRMaj weight, double[] start,
            ParameterBounds bounds) {
        ParameterBounds box = bounds.forParameters(model.parameterCount());
        DMatrixRMaj lower = Matrices.choleskyLower(weight, "the weighting matrix W");
        int k = model.momentCount();
        int p = model.parameterCount();
        MultivariateJacobianFunction residuals = point -> {
            double[] theta = point.toArray();
            DMatrixRMaj g = model.meanMoments(theta);
            DMatrixRMaj d = model.meanJacobian(theta);
            DMatrixRMaj r = new DMatrixRMaj(k, 1);
            CommonOps_DDRM.multTransA(lower, g, r);
            DMatrixRMaj j = new DMatrixRMaj(k, p);
            CommonOps_DDRM.multTransA(lower, d, j);
            RealMatrix jacobian = new Array2DRowRealMatrix(k, p);
            for (int a = 0; a < k; a++) {
                for (int b = 0; b < p; b++) {
                    jacobian.setEntry(a, b, j.unsafe_get(a, b));
                }
            }
            return new Pair<RealVector, RealMatrix>(new ArrayRealVector(r.data, false), jacobian);
        };
        LevenbergMarquardtOptimizer optimizer = new LevenbergMarquardtOptimizer()
                .withCostRelativeTolerance(1e-14)
                .withParameterRelativeTolerance(1e-14)
                .withOrthoTolerance(1e-14);

        List<double[]> starts = new ArrayList<>();
        for (double[] point : startingPoints(start)) {
            starts.add(box.clamp(point));
        }
        Minimum best = null;
        List<double[]> solutions = new ArrayList<>();
        int failed = 0;
        int evaluations = 0;
        for (double[] point : starts) {
            LeastSquaresProblem problem = new LeastSquaresBuilder()
                    .start(point)
                    .model(residuals)
                    .target(new double[k])
                    .maxEvaluations(MAX_EVALUATIONS)
                    .maxIterations(MAX_EVALUATIONS)
                    .lazyEvaluation(false)
                    .parameterValidator(box.isUnbounded() ? null
                            : candidate -> new ArrayRealVector(box.clamp(candidate.toArray()), false))
                    .build();
            try {
                LeastSquaresOptimizer.Optimum optimum = optimizer.optimize(problem);
                evaluations += optimum.getEvaluations();
                double[] theta = optimum.getPoint().toArray();
                if (!allFinite(theta)) {
                    failed++;
                    continue;
                }
                double q = objective(model, weight, theta);
                if (!Double.isFinite(q)) {
                    failed++;
                    continue;
                }
                solutions.add(theta);
                if (best == null || q < best.objective()) {
                    List<String> atBounds = box.atBounds(theta, model.parameterNames());
                    boolean stationary = isStationary(model, weight, theta, box.freeParameters(theta));
                    best = new Minimum(theta, q, stationary, optimum.getIterations(), starts.size(), List.of(),
                            atBounds);
                }
            } catch (TooManyEvaluationsException | TooManyIterationsException | ArithmeticException
                    | ConvergenceException | ParameterOutOfRangeException e) {
                // A start that wanders where the SDF is undefined (beta <= 0 in recursive utility), or where the
                // Jacobian loses rank so the solver's QR step fails, counts as a failed start.
                failed++;
            }
        }
        if (best == null) {
            return new Minimum(start.clone(), Double.NaN, false, 0, starts.size(),
                    List.of("Levenberg-Marquardt failed from all " + starts.size() + " starting points"), List.of());
        }
        List<String> notes = new ArrayList<>();
        if (failed > 0) {
            notes.add(failed + " of " + starts.size() + " starting points did not converge");
        }
        int disagreeing = 0;
        for (double[] theta : solutions) {
            if (maxRelativeDifference(theta, best.theta()) > 1e-4
                    && objective(model, weight, theta) > best.objective() * (1 + 1e-6) + 1e-12) {
                disagreeing++;
            }
        }
        if (disagreeing > 0) {
            notes.add(disagreeing + " of " + starts.size()
                    + " starting points ended at a local minimum with a higher objective; the lowest is reported");
        }
        if (!best.converged()) {
            notes.add("the gradient D'W g at the reported point is not near zero: the solver may have stopped early");
        }
        return new Minimum(best.theta(), best.objective(), best.converged(), best.iterations(), starts.size(),
                List.copyOf(notes), best.atBounds());
    }

    private static List<double[]> startingPoints(double[] start) {
        List<double[]> starts = new ArrayList<>();
        starts.add(start.clone());
        for (int p = 0; p < start.length; p++) {
            for (double scale : START_SCALES) {
                double[] moved = start.clone();
                moved[p] = start[p] == 0.0 ? scale - 1.0 : start[p] * scale;
                starts.add(moved);
            }
        }
        return starts;
    }

    /**
     * First-order condition D'W g = 0, judged relative to the scale of D and g so that the test
     * does not depend on the units of the moments.
     */
    private static boolean isStationary(MomentModel model, DMatrixRMaj weight, double[] theta, boolean[] free) {
        DMatrixRMaj g = model.meanMoments(theta);
        DMatrixRMaj d = model.meanJacobian(theta);
        DMatrixRMaj wg = new DMatrixRMaj(g.numRows, 1);
        CommonOps_DDRM.mult(weight, g, wg);
        DMatrixRMaj gradient = new DMatrixRMaj(theta.length, 1);
        CommonOps_DDRM.multTransA(d, wg, gradient);
        double scale = 0.0;
        for (int p = 0; p < theta.length; p++) {
            double column = 0.0;
            for (int i = 0; i < d.numRows; i++) {
                column += Math.abs(d.unsafe_get(i, p));
            }
            scale = Math.max(scale, column);
        }
        double wgScale = CommonOps_DDRM.elementMaxAbs(wg);
        double largest = 0.0;
        for (int p = 0; p < theta.length; p++) {
            if (free[p]) {
                largest = Math.max(largest, Math.abs(gradient.data[p]));
            }
        }
        return largest <= GRADIENT_TOLERANCE * scale * wgScale + 1e-12;
    }

    private static boolean allFinite(double[] values) {
        for (double value : values) {
            if (!Double.isFinite(value)) {
                return false;
            }
        }
        return true;
    }

    private static double maxRelativeDifference(double[] a, double[] b) {
        double max = 0.0;
        for (int i = 0; i < a.length; i++) {
            max = Math.max(max, Math.abs(a[i] - b[i]) / Math.max(1.0, Math.abs(b[i])));
        }
        return max;
    }

    /**
     * The result of one minimisation.
     *
     * @param theta      the minimiser
     * @param objective  T g' W g at theta
     * @param converged  the first-order condition holds at theta
     * @param iterations solver iterations of the winning start (0 for the closed form)
     * @param starts     number of starting points tried
     * @param notes      what the solver noticed (failed or disagreeing starts)
     * @param atBounds   parameters that ended on a bound, described ("beta = 0 (its lower bound)")
     */
    public record Minimum(double[] theta, double objective, boolean converged, int iterations, int starts,
            List<String> notes, List<String> atBounds) {
        public Minimum {
            theta = theta.clone();
            notes = List.copyOf(notes);
            atBounds = List.copyOf(atBounds);
        }

        @Override
        public double[] theta() {
            return theta.clone();
        }
    }
}
