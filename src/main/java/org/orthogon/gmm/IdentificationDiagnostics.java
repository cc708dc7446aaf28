package org.orthogon.gmm;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.factory.DecompositionFactory_DDRM;
import org.ejml.interfaces.decomposition.SingularValueDecomposition_F64;
import org.orthogon.moments.MomentModel;

/**
 * Whether a fit's parameters are identified well enough for its standard errors, Wald intervals and tests to
 * mean what they say, judged from two things asymptotic inference takes for granted:
 * <ul>
 *   <li>a Jacobian of full rank: the smallest singular value σ_min of Ŝ^{-1/2} D with each column scaled to unit
 *       length (scale-free in the moments through Ŝ and in the parameters through the column scaling; 1 when the
 *       parameters move the standardised moments in orthogonal directions, 0 when two of them move the moments
 *       alike). σ_min² is 1/cond of the unit-diagonal D'Ŝ^{-1}D. Weak identification makes the usual standard
 *       errors unreliable (Stock and Wright 2000, Econometrica 68; Stock, Wright and Yogo 2002, Journal of
 *       Business and Economic Statistics 20) and calls for the robust sets;</li>
 *   <li>estimates inside the parameters' economic range (the discount factor β in (0, 1.1), risk aversion γ ≥ 0,
 *       the elasticity of intertemporal substitution ψ &gt; 0 for the utility families): an estimate outside it
 *       is a symptom of weak identification or of a misspecified model, never an answer.</li>
 * </ul>
 * Thresholds: below {@link #WEAK} (0.05) a warning; below {@link #UNIDENTIFIED} (0.001), or any parameter outside
 * its range, the fit is not clean. The demo models' values place them (common practice, no source): every Lumen
 * model whose parameters are identified has σ_min ≥ 0.10 (three-factor gross 0.107, demeaned 0.121, the others
 * above 0.8), while recursive utility, whose ψ the demo economy identifies only weakly, has 0.031; 0.05 sits
 * between the two on a log scale.
 */
public final class IdentificationDiagnostics {
    /** σ_min below which identification is called weak. */
    public static final double WEAK = 0.05;
    /** σ_min below which the parameters are called close to unidentified. */
    public static final double UNIDENTIFIED = 1e-3;

    private IdentificationDiagnostics() {
    }

    /**
     * β of the utility families in (0, 1.1): a quarterly or monthly β above 1.1 would value the future far above
     * the present.
     */
    public static final Range DISCOUNT_FACTOR = new Range("beta", 0.0, true, 1.1, true, "the subjective discount factor");
    /** γ ≥ 0: a negative relative risk aversion is a risk lover. */
    public static final Range RISK_AVERSION = new Range("gamma", 0.0, false, Double.POSITIVE_INFINITY, true,
            "relative risk aversion");
    /** ψ &gt; 0 for recursive utility (Epstein and Zin 1989). */
    public static final Range ELASTICITY_OF_SUBSTITUTION = new Range("psi", 0.0, true, Double.POSITIVE_INFINITY, true,
            "the elasticity of intertemporal substitution");

    /** A parameter's economic range: lower and upper ends, each open or closed, and what the parameter is. */
    public record Range(String parameter, double lower, boolean lowerOpen, double upper, boolean upperOpen,
            String meaning) {
        boolean contains(double x) {
            boolean above = lowerOpen ? x > lower : x >= lower;
            boolean below = upperOpen ? x < upper : x <= upper;
            return above && below;
        }

        String describe() {
            String low = Double.isInfinite(lower) ? "(-inf" : (lowerOpen ? "(" : "[") + plain(lower);
            String high = Double.isInfinite(upper) ? "inf)" : plain(upper) + (upperOpen ? ")" : "]");
            return low + ", " + high;
        }
    }

    /**
     * The fit with its identification assessed: σ_min recorded in the diagnostics, a warning when it is below
     * {@link #WEAK}, and warnings starting with {@link GmmEstimator#NOT_CLEAN} (with the fit no longer clean)
     * for σ_min below {@link #UNIDENTIFIED} and for every parameter outside its range.
     */
    public static GmmFit assess(MomentModel model, GmmFit fit, List<Range> ranges) {
        double[] theta = fit.estimates();
        List<String> names = fit.parameterNames();
        List<String> warnings = new ArrayList<>(fit.warnings());
        List<String> problems = new ArrayList<>();
        double[] direction = new double[theta.length];
        // A fixed selection (the beta-pricing system) has a singular S by construction, so Ŝ^{-1/2}D does not
        // exist; its identification is the invertibility of aD, which its estimator checks and reports.
        double sigma = model.fixedSelection().isPresent() ? Double.NaN
                : smallestScaledSingularValue(model.meanJacobian(theta), fit.longRun().covariance(), direction);
        if (sigma < UNIDENTIFIED) {
            String problem = String.format(Locale.ROOT, "the parameters are close to unidentified: the smallest "
                    + "singular value of the scaled Jacobian is %.2g (%s); the standard errors and tests do not "
                    + "apply. Drop a parameter, add moments that separate them, or read the robust sets (fit --s-sets)", sigma, involved(names, direction));
            problems.add(problem);
            warnings.add(GmmEstimator.NOT_CLEAN + problem);
        } else if (sigma < WEAK) {
            warnings.add(String.format(Locale.ROOT, "weak identification: the smallest singular value of the scaled "
                    + "Jacobian is %.2g (%s), so standard errors and Wald intervals can "
                    + "be far off in this sample; the robust sets (fit --s-sets) do not depend on identification",
                    sigma, involved(names, direction)));
        }
        for (Range range : ranges) {
            int i = names.indexOf(range.parameter());
            if (i >= 0 && !range.contains(theta[i])) {
                String problem = String.format(Locale.ROOT, "%s = %s lies outside the economic range %s of %s; an "
                        + "estimate there is a symptom of weak identification or misspecification, not an answer. "
                        + "Read the robust sets (fit --s-sets), bound the parameter, or re-specify the model",
                        range.parameter(), format(theta[i]), range.describe(), range.meaning());
                problems.add(problem);
                warnings.add(GmmEstimator.NOT_CLEAN + problem);
            }
        }
        return new GmmFit(fit.method(), fit.parameters(), fit.covariance(), fit.observations(), fit.momentCount(),
                fit.objective(), fit.overidentification(), fit.pricingErrors(), fit.pricingErrorsJoint(), fit.longRun(),
                fit.solverIterations(), warnings, fit.weight(), fit.diagnostics().withIdentification(sigma, problems),
                fit.hjDistance(), fit.confidenceLevel(), fit.firstStep());
    }

    /**
     * σ_min of Ŝ^{-1/2} D N, N scaling the columns to unit length (computed as the square root of the smallest
     * eigenvalue of N D'Ŝ^{-1}D N); {@code direction} receives the right singular vector. 0 when a column of D
     * is zero or Ŝ is singular.
     */
    static double smallestScaledSingularValue(DMatrixRMaj jacobian, DMatrixRMaj longRun, double[] direction) {
        int p = jacobian.numCols;
        DMatrixRMaj information;
        try {
            information = Matrices.quadraticForm(jacobian, Inference.efficientWeight(longRun));
        } catch (Matrices.SingularMatrixException e) {
            return 0.0;
        }
        double[] scale = new double[p];
        for (int j = 0; j < p; j++) {
            double d = information.get(j, j);
            if (!(d > 0)) {
                direction[j] = 1.0;
                return 0.0;
            }
            scale[j] = 1.0 / Math.sqrt(d);
        }
        DMatrixRMaj scaled = new DMatrixRMaj(p, p);
        for (int a = 0; a < p; a++) {
            for (int b = 0; b < p; b++) {
                scaled.set(a, b, information.get(a, b) * scale[a] * scale[b]);
            }
        }
        SingularValueDecomposition_F64<DMatrixRMaj> svd = DecompositionFactory_DDRM.svd(p, p, false, true, true);
        if (!svd.decompose(scaled)) {
            return 0.0;
        }
        double[] values = svd.getSingularValues();
        DMatrixRMaj v = svd.getV(null, false);
        int smallest = 0;
        for (int i = 1; i < values.length; i++) {
            if (values[i] < values[smallest]) {
                smallest = i;
            }
        }
        for (int j = 0; j < p; j++) {
            direction[j] = v.get(j, smallest);
        }
        return Math.sqrt(Math.max(values[smallest], 0.0));
    }

    /**
     * The parameters that carry the weak direction (|component| ≥ 0.3), as a clause: "beta and psi move the
     * moments almost alike", or "beta barely moves the moments" when one parameter carries it alone.
     */
    private static String involved(List<String> names, double[] direction) {
        List<String> out = new ArrayList<>();
        for (int j = 0; j < direction.length; j++) {
            if (Math.abs(direction[j]) >= 0.3) {
                out.add(names.get(j));
            }
        }
        if (out.size() == 1) {
            return out.get(0) + " barely moves the moments";
        }
        return (out.isEmpty() ? "the parameters" : String.join(" and ", out)) + " move the moments almost alike";
    }

    private static String plain(double x) {
        return java.math.BigDecimal.valueOf(x).stripTrailingZeros().toPlainString();
    }

    private static String format(double x) {
        return String.format(Locale.ROOT, "%.4g", x);
    }
}
