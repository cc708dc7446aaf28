package org.orthogon.bootstrap;

import java.util.Optional;
import org.ejml.data.DMatrixRMaj;
import org.orthogon.gmm.ForwardingMomentModel;
import org.orthogon.moments.MomentModel;

/**
 * The moments f_t(θ) - c for a fixed K-vector c: the recentred bootstrap moments of Hall and Horowitz
 * (1996, section 3), f*_t(θ) - E*[f*(θ̂)], whose bootstrap population satisfies E*[f* - c] = 0 at θ̂
 * exactly, so that the bootstrap draws the distribution of the statistics under the null even when the
 * sample's moments are not zero at θ̂ (an overidentified model never fits exactly). A constant shift
 * leaves the Jacobians, the per-row Jacobians, linearity and the payoffs unchanged; views (rows,
 * select) keep the shift.
 */
public final class RecentredMoments extends ForwardingMomentModel {
    private final double[] shift;

    /**
     * @param base  the moments to shift
     * @param shift c, one value per moment, subtracted from every row
     */
    public RecentredMoments(MomentModel base, double[] shift) {
        super(base);
        if (shift.length != base.momentCount()) {
            throw new IllegalArgumentException("shift has " + shift.length + " values for " + base.momentCount()
                    + " moments");
        }
        this.shift = shift.clone();
    }

    /** The vector c subtracted from every row. */
    public double[] shift() {
        return shift.clone();
    }

    @Override
    public DMatrixRMaj contributions(double[] theta) {
        DMatrixRMaj f = base.contributions(theta).copy();
        subtract(f);
        return f;
    }

    @Override
    public void contributions(double[] theta, DMatrixRMaj out) {
        base.contributions(theta, out);
        subtract(out);
    }

    @Override
    public DMatrixRMaj meanMoments(double[] theta) {
        DMatrixRMaj g = base.meanMoments(theta).copy();
        for (int i = 0; i < shift.length; i++) {
            g.data[i] -= shift[i];
        }
        return g;
    }

    @Override
    public DMatrixRMaj rowJacobians(double[] theta) {
        return base.rowJacobians(theta);
    }

    @Override
    public double[] discountFactors(double[] theta) {
        return base.discountFactors(theta);
    }

    /** No Hansen-Jagannathan distance is taken in a bootstrap world (the shift prices no payoff). */
    @Override
    public Optional<MomentModel> distanceMoments() {
        return Optional.empty();
    }

    @Override
    public MomentModel rows(int from, int to) {
        return new RecentredMoments(base.rows(from, to), shift);
    }

    @Override
    public MomentModel select(int[] rows) {
        return new RecentredMoments(base.select(rows), shift);
    }

    private void subtract(DMatrixRMaj f) {
        int k = shift.length;
        double[] data = f.data;
        for (int t = 0; t < f.numRows; t++) {
            int at = t * k;
            for (int i = 0; i < k; i++) {
                data[at + i] -= shift[i];
            }
        }
    }
}
