package org.orthogon.gmm;

import java.util.function.Function;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;

/**
 * Standard errors of smooth functions of estimated parameters by the delta method: if
 * √T(θ̂ - θ) → N(0, T V) then √T(h(θ̂) - h(θ)) → N(0, T H V H'), H = ∂h/∂θ' at θ̂ (Oehlert 1992, "A note
 * on the delta method", The American Statistician 46). H comes from central differences with scaled
 * steps ({@link NumericalDerivatives#jacobian}), so any Java function will do.
 */
public final class DeltaMethod {
    private DeltaMethod() {
    }

    /**
     * h(θ̂) with covariance H V H'.
     *
     * @param values     h(θ̂)
     * @param covariance H V H', already divided by T like V
     */
    public record Transformed(double[] values, DMatrixRMaj covariance) {
        public Transformed {
            values = values.clone();
            covariance = covariance.copy();
        }

        @Override
        public double[] values() {
            return values.clone();
        }

        @Override
        public DMatrixRMaj covariance() {
            return covariance.copy();
        }

        /** sqrt of the diagonal of H V H'. */
        public double[] standardErrors() {
            double[] out = new double[values.length];
            for (int i = 0; i < out.length; i++) {
                out[i] = Math.sqrt(Math.max(covariance.get(i, i), 0.0));
            }
            return out;
        }
    }

    /**
     * h(θ̂) and H V H' for a function h: R^P → R^m.
     *
     * @param covariance V, the P x P covariance of θ̂
     */
    public static Transformed apply(Function<double[], double[]> h, double[] theta, DMatrixRMaj covariance) {
        if (covariance.numRows != theta.length || covariance.numCols != theta.length) {
            throw new IllegalArgumentException("covariance is " + covariance.numRows + " x " + covariance.numCols
                    + " for " + theta.length + " parameters");
        }
        double[] values = h.apply(theta.clone());
        DMatrixRMaj jacobian = NumericalDerivatives.jacobian(h, theta);
        DMatrixRMaj jt = new DMatrixRMaj(jacobian.numCols, jacobian.numRows);
        CommonOps_DDRM.transpose(jacobian, jt);
        return new Transformed(values, Matrices.quadraticForm(jt, covariance));
    }

    /** The same for the estimates and covariance of a fit. */
    public static Transformed apply(Function<double[], double[]> h, GmmFit fit) {
        return apply(h, fit.estimates(), fit.covariance());
    }
}
