package org.orthogon.spec;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.orthogon.data.InputException;
import org.orthogon.data.Period;
import org.orthogon.data.Suggestions;
import org.orthogon.gmm.ManyMoments;
import org.orthogon.gmm.LinearRestrictions;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.ObservationErrors;
import org.orthogon.moments.ScaledMoments;

/**
 * Turns a {@link RunSpec} into estimable moment conditions: the family assembles its pricing errors
 * from the data ({@link ModelSpec#assemble} with a {@link DataLoader}), and this class scales them by
 * the instruments and checks, before any estimation, everything a fit would otherwise refuse later:
 * start values and bounds that name no parameter, fewer moments than parameters, fewer observations
 * than moments or than the long-run covariance options need, and restrictions that do not parse.
 * `check`, `fit`, `compare` and `stability` all prepare through here, so they refuse alike.
 */
public final class ModelAssembler {
    /** The built-in instrument column of ones. */
    public static final String CONSTANT_INSTRUMENT = DataLoader.CONSTANT_INSTRUMENT;

    private ModelAssembler() {
    }

    /** Reads and aligns the data of {@code spec} and builds its moment conditions. */
    public static PreparedRun prepare(RunSpec spec) {
        DataLoader data = new DataLoader(spec);
        FamilyModel family = spec.model().assemble(data);
        return finish(spec, data, family);
    }

    /**
     * The fewest observations one fit of {@code moments} moments can use with the spec's estimation
     * choices: more than K (else S cannot be inverted), and what the long-run covariance options need
     * ({@link LongRunOptions#minimumObservations}). Subsample fits (`stability`) use the same rule.
     */
    public static int minimumObservations(RunSpec spec, int moments) {
        return Math.max(moments + 1, spec.estimation().longRunOptions().minimumObservations(moments));
    }

    private static PreparedRun finish(RunSpec spec, DataLoader data, FamilyModel family) {
        ObservationErrors errors = family.errors();
        DataLoader.Aligned aligned = family.aligned();
        List<String> instrumentColumns = spec.model().instrumentColumns();
        ScaledMoments moments = instrumentColumns.isEmpty() ? ScaledMoments.unscaled(errors)
                : ScaledMoments.scaled(errors, aligned.laggedInstruments(instrumentColumns), instrumentColumns);
        List<String> names = errors.parameterNames();
        double[] start = startValues(spec, names, family.defaultStarts());
        Map<String, double[]> bounds = bounds(spec, names, start);
        int k = moments.momentCount();
        int p = names.size();
        int observations = aligned.observations();
        if (k < p) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "family"))
                    .problem("the model has " + p + " parameters " + names + " but only " + k + " moment"
                            + (k == 1 ? "" : "s") + ", so the parameters are not identified",
                            "price more test assets, scale the moments by instruments (instrument_columns), or "
                                    + "estimate fewer parameters");
        }
        if (observations <= k) {
            int line = spec.lineOf("data", spec.data().start().isPresent() ? "start" : "returns");
            throw InputException.in(spec.modelFile()).line(line).problem("the sample has " + observations
                    + " observations but the model has " + k + " moments; GMM needs more "
                    + "observations than moments to estimate S", "widen the sample (start/end under [data]), "
                    + "or use fewer test assets or instruments");
        }
        LongRunOptions longRun = spec.estimation().longRunOptions();
        int needed = longRun.minimumObservations(k);
        if (observations < needed) {
            String key = longRun.prewhiten() ? "prewhiten" : "bandwidth";
            throw InputException.in(spec.modelFile()).line(spec.lineOf("estimation", key))
                    .problem(String.format(Locale.ROOT, "the sample has %d observations, but the long-run covariance "
                            + "(kernel %s, %s%s) needs at least %d with K = %d moments", observations,
                            longRun.kernel().id(), spec.estimation().bandwidthLabel(),
                            longRun.prewhiten() ? ", VAR(1) prewhitening" : "", needed, k),
                            longRun.prewhiten() && observations < longRun.withPrewhiten(false).minimumObservations(k)
                                    ? "use a longer sample, or a fixed bandwidth or lag count without prewhitening"
                                    : longRun.prewhiten() ? "use a longer sample, or switch prewhitening off (prewhiten "
                                            + "= false, or --no-prewhiten)"
                                    : "use a longer sample, or a fixed bandwidth or lag count");
        }
        checkRestrictions(spec, names);
        List<Period> dates = aligned.sample().dates();
        SampleInfo sample = new SampleInfo(dates.get(aligned.first()).label(), dates.get(aligned.last()).label(),
                observations, dates.get(0).frequency().id());
        List<String> labels = dates.subList(aligned.first(), aligned.last() + 1).stream().map(Period::label).toList();
        return new PreparedRun(moments, start, sample, data.notes(), data.inputs(),
                errors.assetNames().subList(0, errors.pricedAssets()), labels, warnings(k, p, observations, spec.estimation().longRunOptions()), bounds,
                family.factorSample());
    }

    /** Warnings before any estimation: the many-moments rule of {@link ManyMoments} with the file's S, and K = P. */
    private static List<Warning> warnings(int k, int p, int t, LongRunOptions longRun) {
        List<Warning> warnings = new ArrayList<>();
        ManyMoments.warning(k, t, longRun).ifPresent(w -> warnings.add(new Warning("many-moments", w)));
        if (k == p) {
            warnings.add(new Warning("exactly-identified", "the model is exactly identified (K = P): there will be "
                    + "no overidentifying restrictions to test"));
        }
        return warnings;
    }

    private static double[] startValues(RunSpec spec, List<String> parameters, Map<String, Double> defaults) {
        Map<String, Double> given = spec.model().startValues();
        for (String name : given.keySet()) {
            if (!parameters.contains(name)) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "start_values"))
                        .problem("start_values names \"" + name + "\", which is not a parameter of this model",
                                "use the parameter names " + parameters + Suggestions.didYouMean(name, parameters));
            }
        }
        double[] start = new double[parameters.size()];
        for (int i = 0; i < start.length; i++) {
            start[i] = given.getOrDefault(parameters.get(i), defaults.getOrDefault(parameters.get(i), 0.0));
        }
        return start;
    }

    /** The family's default bounds overridden by the model file's, by name; refuses names and starts that do not fit. */
    private static Map<String, double[]> bounds(RunSpec spec, List<String> names, double[] start) {
        Map<String, double[]> bounds = new LinkedHashMap<>();
        spec.model().defaultBounds().forEach((name, range) -> {
            if (names.contains(name)) {
                bounds.put(name, range.clone());
            }
        });
        for (Map.Entry<String, double[]> entry : spec.model().bounds().entrySet()) {
            if (!names.contains(entry.getKey())) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "bounds"))
                        .problem("bounds names \"" + entry.getKey() + "\", which is not a parameter of this model",
                                "use the parameter names " + names + Suggestions.didYouMean(entry.getKey(), names));
            }
            bounds.put(entry.getKey(), entry.getValue().clone());
        }
        for (int i = 0; i < names.size(); i++) {
            double[] range = bounds.get(names.get(i));
            if (range != null && !(start[i] >= range[0] && start[i] <= range[1])) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "start_values"))
                        .problem("the start value " + start[i] + " of " + names.get(i) + " lies outside its bounds ["
                                + range[0] + ", " + range[1] + "]", "choose a start value inside the bounds");
            }
        }
        return bounds;
    }

    private static final Pattern IDENTIFIER = Pattern.compile("[A-Za-z_][A-Za-z0-9_]*");

    /** Every restriction must parse over the parameter names now, not after a long estimation. */
    private static void checkRestrictions(RunSpec spec, List<String> names) {
        for (String text : spec.estimation().restrictions()) {
            try {
                LinearRestrictions.parse(text, names);
            } catch (IllegalArgumentException e) {
                String hint = "";
                Matcher m = IDENTIFIER.matcher(text);
                while (m.find()) {
                    if (!names.contains(m.group())) {
                        hint = Suggestions.didYouMean(m.group(), names);
                        break;
                    }
                }
                // Restrictions come from the model file's [estimation] restrictions or from --restrict.
                boolean inFile = spec.writes("estimation", "restrictions");
                InputException.Builder where = inFile
                        ? InputException.in(spec.modelFile()).line(spec.lineOf("estimation", "restrictions"))
                        : InputException.general();
                throw where.problem((inFile ? "" : "--restrict: ") + "the restriction \"" + text
                        + "\" cannot be tested: " + e.getMessage(),
                        "write linear restrictions over the parameters " + names + ", e.g. \"" + names.get(names.size() - 1)
                                + " = 0\"" + hint);
            }
        }
    }
}
