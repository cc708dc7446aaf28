package org.orthogon.gmm;

import java.util.List;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.moments.MomentModel;

/**
 * A moment model that passes every call to another; views override what they change. The in-place
 * {@link MomentModel#contributions(double[], DMatrixRMaj)} and the per-row Jacobians are not passed
 * on, so a view that changes θ stays right through the interface's defaults.
 */
public abstract class ForwardingMomentModel implements MomentModel {
    protected final MomentModel base;

    protected ForwardingMomentModel(MomentModel base) {
        this.base = base;
    }

    @Override
    public List<String> parameterNames() {
        return base.parameterNames();
    }

    @Override
    public List<String> momentNames() {
        return base.momentNames();
    }

    @Override
    public int observations() {
        return base.observations();
    }

    @Override
    public DMatrixRMaj contributions(double[] theta) {
        return base.contributions(theta);
    }

    @Override
    public DMatrixRMaj meanJacobian(double[] theta) {
        return base.meanJacobian(theta);
    }


    @Override
    public boolean isLinear() {
        return base.isLinear();
    }

    @Override
    public DMatrixRMaj payoffs() {
        return base.payoffs();
    }

    @Override
    public int pricingMomentCount() {
        return base.pricingMomentCount();
    }

    @Override
    public double meanDiscountFactor(double[] theta) {
        return base.meanDiscountFactor(theta);
    }
}
