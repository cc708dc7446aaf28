package org.orthogon.gmm;

import java.util.Arrays;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.orthogon.moments.MomentModel;

/**
 * The fixed weight of a one-step estimate, and the first-step weight of the two-step, iterated and
 * continuously-updated estimators (docs/methods.md).
 */
public sealed interface InitialWeight {

    /** W = I. */
    record Identity() implements InitialWeight {
        @Override
        public String id() {
            return "identity";
        }
    }

    /**
     * W = G^{-1}, G = (1/T) Σ_t x_t x_t' the second-moment matrix of the payoffs the moments price
     * ({@link MomentModel#payoffs()}): the weight of the Hansen-Jagannathan (1997) distance, the same for
     * every model priced on the same payoffs, so that misspecified models can be compared.
     */
    record SecondMoment() implements InitialWeight {
        @Override
        public String id() {
            return "second-moment";
        }
    }

    /** W = diag(w), w_i > 0 given by the user, one entry per moment. */
    record Diagonal(double[] weights) implements InitialWeight {
        public Diagonal {
            weights = weights.clone();
            for (int i = 0; i < weights.length; i++) {
                if (!(weights[i] > 0.0) || Double.isInfinite(weights[i])) {
                    throw new IllegalArgumentException("diagonal weight " + (i + 1) + " must be a finite number > 0, got "
                            + weights[i]);
                }
            }
        }

        @Override
        public double[] weights() {
            return weights.clone();
        }

        @Override
        public String id() {
            return "diagonal";
        }

        @Override
        public boolean equals(Object other) {
            return other instanceof Diagonal d && Arrays.equals(weights, d.weights);
        }

        @Override
        public int hashCode() {
            return Arrays.hashCode(weights);
        }

        @Override
        public String toString() {
            return "Diagonal" + Arrays.toString(weights);
        }
    }

    /** The spelling of the model file's {@code initial_weight} ("identity", "second-moment", "diagonal"). */
    String id();

    /** Looks up "identity" or "second-moment"; a diagonal weight needs its numbers, so it has no id lookup. */
    static InitialWeight fromId(String id) {
        return switch (id) {
            case "identity" -> new Identity();
            case "second-moment" -> new SecondMoment();
            default -> throw new IllegalArgumentException("unknown initial weight \"" + id
                    + "\"; use identity or second-moment");
        };
    }

    /**
     * The K x K weight for this model.
     *
     * @throws EstimationException when G is singular
     */
    default DMatrixRMaj matrix(MomentModel model) {
        int k = model.momentCount();
        if (this instanceof Identity) {
            return CommonOps_DDRM.identity(k);
        }
        if (this instanceof SecondMoment) {
            try {
                return Matrices.invertSymmetric(secondMoments(model), "G, the second-moment matrix of the payoffs");
            } catch (Matrices.SingularMatrixException e) {
                throw GmmEstimator.refusal(e, model);
            }
        }
        double[] w = ((Diagonal) this).weights;
        if (w.length != k) {
            throw new IllegalArgumentException("the diagonal weight has " + w.length + " entries but the model has "
                    + k + " moments " + model.momentNames());
        }
        DMatrixRMaj out = new DMatrixRMaj(k, k);
        for (int i = 0; i < k; i++) {
            out.unsafe_set(i, i, w[i]);
        }
        return out;
    }

    /** G = (1/T) Σ_t x_t x_t' of {@link MomentModel#payoffs()} (Hansen and Jagannathan 1997). */
    static DMatrixRMaj secondMoments(MomentModel model) {
        return org.orthogon.longrun.LongRunCovariance.secondMoments(model.payoffs());
    }
}
