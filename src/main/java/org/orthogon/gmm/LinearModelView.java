package org.orthogon.gmm;

import org.ejml.data.DMatrixRMaj;
import org.orthogon.moments.MomentModel;

/**
 * A model linear in θ seen through one estimation: its Jacobian D is the same at every θ (that is what
 * {@link MomentModel#isLinear()} promises) and its payoffs do not depend on θ at all, so both are formed
 * once and handed out as copies, instead of once per step, per standard error and per
 * Hansen-Jagannathan minimisation. Everything else goes to the model. One estimation uses a view, on one
 * thread.
 */
final class LinearModelView extends ForwardingMomentModel {
    private DMatrixRMaj jacobian;
    private DMatrixRMaj payoffs;
    private DMatrixRMaj work;

    LinearModelView(MomentModel base) {
        super(base);
    }

    @Override
    public DMatrixRMaj meanJacobian(double[] theta) {
        if (theta.length != base.parameterCount()) {
            return base.meanJacobian(theta);
        }
        if (jacobian == null) {
            jacobian = base.meanJacobian(new double[theta.length]);
        }
        return jacobian.copy();
    }

    @Override
    public DMatrixRMaj meanMoments(double[] theta) {
        if (!(base instanceof org.orthogon.moments.ScaledMoments)) {
            return base.meanMoments(theta);
        }
        // the same column means, from one work matrix filled in place instead of a new T x K matrix per call
        if (work == null) {
            work = new DMatrixRMaj(1, 1);
        }
        base.contributions(theta, work);
        return org.orthogon.moments.MomentAlgebra.columnMeans(work);
    }

    @Override
    public void contributions(double[] theta, DMatrixRMaj out) {
        base.contributions(theta, out);
    }

    @Override
    public DMatrixRMaj rowJacobians(double[] theta) {
        return base.rowJacobians(theta);
    }

    @Override
    public double[] discountFactors(double[] theta) {
        return base.discountFactors(theta);
    }

    /** The distance is taken through this view when the model takes it over itself. */
    @Override
    public java.util.Optional<MomentModel> distanceMoments() {
        return base.distanceMoments().map(priced -> priced == base ? this : priced);
    }

    @Override
    public DMatrixRMaj payoffs() {
        if (payoffs == null) {
            payoffs = base.payoffs();
        }
        return payoffs.copy();
    }
}
