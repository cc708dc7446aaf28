package org.orthogon.cli;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.orthogon.data.InputException;
import org.orthogon.data.Suggestions;
import org.orthogon.gmm.ParameterBounds;
import org.orthogon.robust.RobustSetOptions;
import picocli.CommandLine.Option;

/** The options of {@code fit --s-sets}: whether to compute the robust sets, and where to look for them. */
final class RobustSetArguments {
    @Option(names = "--s-sets", description = "also compute weak-identification-robust confidence sets of every "
            + "parameter: Stock-Wright S-sets and Kleibergen K-sets, one parameter at a time with the others "
            + "concentrated out, and the joint sets when there are two parameters")
    boolean requested;

    @Option(names = "--s-range", paramLabel = "NAME=LOW:HIGH", description = "search range of one parameter's robust "
            + "set (repeatable); the default is the estimate +/- 20 standard errors, cut at the parameter's bounds")
    List<String> ranges;

    @Option(names = "--s-points", paramLabel = "N", description = "grid points per parameter of the robust-set "
            + "search (default 201, at least 11)")
    Integer points;

    /** The search options, or null when --s-sets was not given; refuses bad values before any estimation. */
    RobustSetOptions options(double level) {
        if (!requested) {
            if (ranges != null || points != null) {
                throw InputException.general().problem("--s-range and --s-points only apply with --s-sets",
                        "add --s-sets, or leave them out");
            }
            return null;
        }
        int n = points == null ? RobustSetOptions.DEFAULT_POINTS : points;
        if (n < 11) {
            throw InputException.general().problem("--s-points " + n + " is too few to map a set",
                    "give at least 11 grid points (the default is " + RobustSetOptions.DEFAULT_POINTS + ")");
        }
        Map<String, double[]> parsed = new LinkedHashMap<>();
        for (String text : ranges == null ? List.<String>of() : ranges) {
            parsed.put(nameOf(text), rangeOf(text));
        }
        return RobustSetOptions.defaults(level).withPoints(n, RobustSetOptions.DEFAULT_JOINT_POINTS).withRanges(parsed);
    }

    /**
     * Refuses a range that names no parameter of the model (with a suggestion) or lies wholly outside the
     * parameter's bounds.
     */
    static void checkNames(RobustSetOptions options, List<String> parameters, ParameterBounds bounds) {
        if (options == null) {
            return;
        }
        ParameterBounds box = bounds.forParameters(parameters.size());
        for (Map.Entry<String, double[]> range : options.ranges().entrySet()) {
            String name = range.getKey();
            int i = parameters.indexOf(name);
            if (i < 0) {
                throw InputException.general().problem("--s-range names \"" + name + "\", which is not a parameter of "
                        + "this model", "use one of " + String.join(", ", parameters)
                        + Suggestions.didYouMean(name, parameters));
            }
            double low = Math.max(range.getValue()[0], box.lower()[i]);
            double high = Math.min(range.getValue()[1], box.upper()[i]);
            if (!(low < high)) {
                throw InputException.general().problem("--s-range " + name + "=" + range.getValue()[0] + ":"
                        + range.getValue()[1] + " lies outside the bounds [" + box.lower()[i] + ", " + box.upper()[i]
                        + "] of " + name, "give a range that overlaps the bounds");
            }
        }
    }

    private static String nameOf(String text) {
        int equals = text.indexOf('=');
        if (equals <= 0) {
            throw malformed(text);
        }
        return text.substring(0, equals).trim();
    }

    private static double[] rangeOf(String text) {
        String[] ends = text.substring(text.indexOf('=') + 1).split(":", -1);
        if (ends.length != 2) {
            throw malformed(text);
        }
        try {
            double low = Double.parseDouble(ends[0].trim());
            double high = Double.parseDouble(ends[1].trim());
            if (!(low < high) || !Double.isFinite(low) || !Double.isFinite(high)) {
                throw malformed(text);
            }
            return new double[] {low, high};
        } catch (NumberFormatException e) {
            throw malformed(text);
        }
    }

    private static InputException malformed(String text) {
        return InputException.general().problem("--s-range " + text + " is not a search range",
                "write NAME=LOW:HIGH with two numbers LOW < HIGH, e.g. --s-range gamma=0:40");
    }
}
