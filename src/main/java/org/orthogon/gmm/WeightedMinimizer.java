package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
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
        if (model.isLinear()) {
            return closedForm(model, weight);
        }
        return levenbergMarquardt(model, weight, start);
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
        return new Minimum(estimate, objective(model, weight, estimate), true, 0, 1, List.of());
    }

    /** T g_T(θ)' W g_T(θ). */
    public static double objective(MomentModel model, DMatrixRMaj weight, double[] theta) {
        return Inference.quadraticStatistic(model.meanMoments(theta), weight, model.observations());
    }

    /** Levenberg-Marquardt from several starting points; exposed so tests can compare it with the closed form. */
    public static Minimum levenbergMarquardt(MomentModel model, DMatrixRMaj weight, double[] start) {
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

        List<double[]> starts = startingPoints(start);
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
                    boolean stationary = isStationary(model, weight, theta);
                    best = new Minimum(theta, q, stationary, optimum.getIterations(), starts.size(), List.of());
                }
            } catch (TooManyEvaluationsException | TooManyIterationsException | ArithmeticException
                    | ParameterOutOfRangeException e) {
                // A start that wanders where the SDF is undefined (beta <= 0 in recursive utility) counts as failed.
                failed++;
            }
        }
        if (best == null) {
            return new Minimum(start.clone(), Double.NaN, false, 0, starts.size(),
                    List.of("Levenberg-Marquardt failed from all " + starts.size() + " starting points"));
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
                List.copyOf(notes));
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
    private static boolean isStationary(MomentModel model, DMatrixRMaj weight, double[] theta) {
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
        return CommonOps_DDRM.elementMaxAbs(gradient) <= GRADIENT_TOLERANCE * scale * wgScale + 1e-12;
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
     */
    public record Minimum(double[] theta, double objective, boolean converged, int iterations, int starts,
            List<String> notes) {
        public Minimum {
            theta = theta.clone();
            notes = List.copyOf(notes);
        }

        @Override
        public double[] theta() {
            return theta.clone();
        }
    }
}
