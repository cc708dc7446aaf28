package org.orthogon.spec;

import java.util.List;
import org.orthogon.moments.MomentModel;

/**
 * A model file turned into estimable moment conditions on one aligned sample.
 *
 * @param moments     the moment conditions
 * @param startValues starting values in parameter order (used by non-linear families)
 * @param sample      the sample the moments cover
 * @param notes       what the data preparation did that a reader should know (dropped partial periods,
 *                    which file limited the sample)
 */
public record PreparedRun(MomentModel moments, double[] startValues, SampleInfo sample, List<String> notes) {
    public PreparedRun {
        startValues = startValues.clone();
        notes = List.copyOf(notes);
    }

    @Override
    public double[] startValues() {
        return startValues.clone();
    }
}
