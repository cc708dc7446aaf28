package org.orthogon.bootstrap;

import org.ejml.data.DMatrixRMaj;
import org.orthogon.moments.MomentModel;

/**
 * The bootstrap world of one estimate: resamples of the sample's rows in blocks, with the moments
 * recentred at their bootstrap expectation at θ̂ so that θ̂ satisfies the moment conditions there
 * exactly (Hall and Horowitz 1996, section 3). Optionally a stated alternative: pricing errors δ added
 * to the population moments, E*[f*(θ̂)] = δ instead of 0.
 *
 * @param model      the sample's moments
 * @param estimate   θ̂, the truth of this world
 * @param resampler  the block scheme and length
 * @param centre     c, subtracted from every resampled row (E*[ḡ*(θ̂)] - δ)
 * @param seed       the run's seed
 */
public record BootstrapWorld(MomentModel model, double[] estimate, BlockResampler resampler, double[] centre,
        long seed) {

    public BootstrapWorld {
        estimate = estimate.clone();
        centre = centre.clone();
    }

    @Override
    public double[] estimate() {
        return estimate.clone();
    }

    /** The null world of {@code model} at θ̂ with the given block scheme and length. */
    public static BootstrapWorld atNull(MomentModel model, double[] estimate, BlockResampler resampler, long seed) {
        return withPricingErrors(model, estimate, resampler, seed, new double[model.momentCount()]);
    }

    /** The world where moment i has population mean δ_i at θ̂ (δ = 0 is the null). */
    public static BootstrapWorld withPricingErrors(MomentModel model, double[] estimate, BlockResampler resampler,
            long seed, double[] delta) {
        DMatrixRMaj contributions = model.contributions(estimate);
        double[] centre = resampler.expectedMean(contributions);
        for (int i = 0; i < centre.length; i++) {
            centre[i] -= delta[i];
        }
        return new BootstrapWorld(model, estimate, resampler, centre, seed);
    }

    /** Replication {@code index}: its rows drawn from its own stream, the moments recentred. */
    public MomentModel replication(int index) {
        int[] rows = resampler.draw(ReplicationStreams.stream(seed, index));
        return new RecentredMoments(model.select(rows), centre);
    }
}
