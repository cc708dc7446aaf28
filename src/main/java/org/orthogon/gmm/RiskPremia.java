package org.orthogon.gmm;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * Factor risk premia implied by a linear SDF on demeaned factors, m_t = 1 - b'(F_t - μ): E[R^e] =
 * Cov(R^e, F') b = β λ with λ = Cov(F, F') b (Cochrane 2005, "Asset Pricing", revised edition, section 6.3), here with
 * Σ_F = (1/T) Σ_t (F_t - F̄)(F_t - F̄)'.
 */
public final class RiskPremia {
    private RiskPremia() {
    }

    /**
     * λ = Σ_F b with Σ_F treated as known: Var(λ) = Σ_F V_b Σ_F.
     *
     * @param factors          T x J factor values on the sample the fit used
     * @param coefficientNames the J parameters that form b, in factor order (e.g. b_MKT, b_SIZE)
     */
    public static DeltaMethod.Transformed withGivenCovariance(double[][] factors, GmmFit fit,
            List<String> coefficientNames) {
        int[] index = indices(fit, coefficientNames, factors);
        DMatrixRMaj sigma = covariance(factors);
        DMatrixRMaj full = fit.covariance();
        int j = index.length;
        DMatrixRMaj vb = new DMatrixRMaj(j, j);
        double[] b = new double[j];
        for (int a = 0; a < j; a++) {
            b[a] = fit.estimates()[index[a]];
            for (int c = 0; c < j; c++) {
                vb.set(a, c, full.get(index[a], index[c]));
            }
        }
        return DeltaMethod.apply(x -> multiply(sigma, x), b, vb);
    }

    /**
     * λ = Σ_F b with Σ_F estimated along with b: the delta method on (b, vech Σ_F), whose joint covariance
     * comes from the influence functions ψ_t = -A (f_t(θ̂) - g_T(θ̂)), A = (D'WD)^{-1} D'W (D^{-1} when
     * K = P; W = S^{-1} for the efficient estimators), stacked with h_t = vech((F_t - F̄)(F_t - F̄)' - Σ_F),
     * and the long-run covariance of that stack with the fit's kernel and its reported bandwidth (no
     * prewhitening; Newey and McFadden 1994, Handbook of Econometrics 4, section 6, on stacked GMM
     * estimators). The (b, b) block is replaced by the fit's own covariance so that λ's variance reduces to
     * {@link #withGivenCovariance} when Σ_F carries no sampling error.
     */
    public static DeltaMethod.Transformed withEstimatedCovariance(double[][] factors, MomentModel model, GmmFit fit,
            List<String> coefficientNames) {
        int[] index = indices(fit, coefficientNames, factors);
        int t = model.observations();
        if (factors.length != t) {
            throw new IllegalArgumentException("factors have " + factors.length + " rows but the model has " + t
                    + " observations");
        }
        int j = index.length;
        int p = model.parameterCount();
        int k = model.momentCount();
        double[] theta = fit.estimates();
        DMatrixRMaj d = model.meanJacobian(theta);
        DMatrixRMaj influence; // P x K
        if (k == p) {
            influence = Matrices.solveSquare(d, CommonOps_DDRM.identity(k), "D (K = P)");
        } else {
            DMatrixRMaj w = fit.method().isEfficient()
                    ? Matrices.invertSymmetric(fit.longRun().covariance(), "S at the estimate") : fit.weight();
            DMatrixRMaj bread = Matrices.invertSymmetric(Matrices.quadraticForm(d, w), "D'WD");
            DMatrixRMaj dtw = new DMatrixRMaj(p, k);
            CommonOps_DDRM.multTransA(d, w, dtw);
            influence = new DMatrixRMaj(p, k);
            CommonOps_DDRM.mult(bread, dtw, influence);
        }
        DMatrixRMaj f = model.contributions(theta);
        double[] mean = new double[j];
        for (double[] row : factors) {
            for (int a = 0; a < j; a++) {
                mean[a] += row[a] / t;
            }
        }
        DMatrixRMaj sigma = covariance(factors);
        int q = j * (j + 1) / 2;
        DMatrixRMaj stack = new DMatrixRMaj(t, j + q);
        for (int s = 0; s < t; s++) {
            for (int a = 0; a < j; a++) {
                double value = 0.0;
                for (int c = 0; c < k; c++) {
                    value -= influence.unsafe_get(index[a], c) * f.unsafe_get(s, c);
                }
                stack.unsafe_set(s, a, value);
            }
            int column = j;
            for (int a = 0; a < j; a++) {
                for (int c = a; c < j; c++) {
                    double value = (factors[s][a] - mean[a]) * (factors[s][c] - mean[c]) - sigma.get(a, c);
                    stack.unsafe_set(s, column++, value);
                }
            }
        }
        LongRunOptions options = fit.longRun().kernel() == Kernel.NONE
                ? LongRunOptions.heteroskedasticityConsistent().withCentered(true)
                : new LongRunOptions(fit.longRun().kernel(), new BandwidthRule.Fixed(fit.longRun().bandwidth()), true,
                        false);
        DMatrixRMaj joint = LongRunCovariance.estimate(stack, options).covariance();
        CommonOps_DDRM.divide(joint, t);
        DMatrixRMaj full = fit.covariance();
        for (int a = 0; a < j; a++) {
            for (int c = 0; c < j; c++) {
                joint.set(a, c, full.get(index[a], index[c]));
            }
        }
        double[] x = new double[j + q];
        for (int a = 0; a < j; a++) {
            x[a] = theta[index[a]];
        }
        int column = j;
        for (int a = 0; a < j; a++) {
            for (int c = a; c < j; c++) {
                x[column++] = sigma.get(a, c);
            }
        }
        return DeltaMethod.apply(v -> {
            DMatrixRMaj s = new DMatrixRMaj(j, j);
            int at = j;
            for (int a = 0; a < j; a++) {
                for (int c = a; c < j; c++) {
                    s.set(a, c, v[at]);
                    s.set(c, a, v[at++]);
                }
            }
            return multiply(s, java.util.Arrays.copyOf(v, j));
        }, x, joint);
    }

    /** Σ_F = (1/T) Σ_t (F_t - F̄)(F_t - F̄)'. */
    static DMatrixRMaj covariance(double[][] factors) {
        int t = factors.length;
        int j = factors[0].length;
        double[] mean = new double[j];
        for (double[] row : factors) {
            for (int a = 0; a < j; a++) {
                mean[a] += row[a] / t;
            }
        }
        DMatrixRMaj sigma = new DMatrixRMaj(j, j);
        for (double[] row : factors) {
            for (int a = 0; a < j; a++) {
                for (int c = 0; c < j; c++) {
                    sigma.add(a, c, (row[a] - mean[a]) * (row[c] - mean[c]) / t);
                }
            }
        }
        return sigma;
    }

    private static double[] multiply(DMatrixRMaj sigma, double[] b) {
        double[] out = new double[b.length];
        for (int a = 0; a < b.length; a++) {
            for (int c = 0; c < b.length; c++) {
                out[a] += sigma.get(a, c) * b[c];
            }
        }
        return out;
    }

    private static int[] indices(GmmFit fit, List<String> names, double[][] factors) {
        if (factors.length == 0 || factors[0].length != names.size()) {
            throw new IllegalArgumentException("need one factor column per coefficient " + names + ", got "
                    + (factors.length == 0 ? 0 : factors[0].length));
        }
        List<String> all = fit.parameterNames();
        int[] index = new int[names.size()];
        for (int a = 0; a < names.size(); a++) {
            index[a] = all.indexOf(names.get(a));
            if (index[a] < 0) {
                throw new IllegalArgumentException("no parameter \"" + names.get(a) + "\"; the fit has " + all);
            }
        }
        return index;
    }
}
