package org.orthogon.spec;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.orthogon.moments.MomentModel;
import org.orthogon.twopass.FactorSample;

/**
 * A model file turned into estimable moment conditions on one aligned sample.
 *
 * @param moments     the moment conditions
 * @param startValues starting values in parameter order (used by non-linear families)
 * @param sample      the sample the moments cover
 * @param notes       what the data preparation did that a reader should know (dropped partial periods,
 *                    which file limited the sample)
 * @param inputs      every data file read
 * @param assets      the N test assets (before any scaling by instruments)
 * @param dates       the label of every observation of the moments, in order (T of them)
 * @param warnings    what a reader must know before estimating (many moments, exact identification)
 * @param bounds      closed bounds by parameter name: the family's defaults and the model file's
 * @param factorSample linear-factor models: the test assets' excess returns and the factors on the same
 *                    rows, for the two-pass regressions and the risk premia; empty for other families
 */
public record PreparedRun(MomentModel moments, double[] startValues, SampleInfo sample, List<String> notes,
        List<InputSummary> inputs, List<String> assets, List<String> dates, List<Warning> warnings,
        Map<String, double[]> bounds, Optional<FactorSample> factorSample) {
    public PreparedRun {
        startValues = startValues.clone();
        notes = List.copyOf(notes);
        inputs = List.copyOf(inputs);
        assets = List.copyOf(assets);
        dates = List.copyOf(dates);
        warnings = List.copyOf(warnings);
        bounds = copy(bounds);
    }

    @Override
    public double[] startValues() {
        return startValues.clone();
    }

    @Override
    public Map<String, double[]> bounds() {
        return copy(bounds);
    }

    /** The same preparation without the warnings of one code (a fit's own, more exact warning supersedes it). */
    public PreparedRun withoutWarning(String code) {
        return new PreparedRun(moments, startValues, sample, notes, inputs, assets, dates,
                warnings.stream().filter(w -> !w.code().equals(code)).toList(), bounds, factorSample);
    }

    private static Map<String, double[]> copy(Map<String, double[]> bounds) {
        Map<String, double[]> copy = new LinkedHashMap<>();
        bounds.forEach((name, range) -> copy.put(name, range.clone()));
        return java.util.Collections.unmodifiableMap(copy);
    }
}
