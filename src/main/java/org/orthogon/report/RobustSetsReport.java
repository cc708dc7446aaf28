package org.orthogon.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.orthogon.robust.RobustSet;
import org.orthogon.robust.RobustSets;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.ObjectNode;

/**
 * The weak-identification-robust sets of {@code fit --s-sets} as console text, as the JSON fields
 * "robust_sets" and "robust_sets_summary", and as a report section with a table, one profile chart per
 * parameter and, for two parameters, the joint sets drawn over the plane.
 */
public final class RobustSetsReport {
    private RobustSetsReport() {
    }

    /** "[lo, hi] ∪ [lo, hi]" with "open" for an open end and "empty" for no interval. */
    static String intervals(RobustSet set) {
        if (set.isEmpty()) {
            return "empty";
        }
        List<String> pieces = new ArrayList<>();
        for (RobustSet.Interval i : set.intervals()) {
            pieces.add((i.lower() == null ? "(open" : "[" + ConsoleReport.number(i.lower())) + ", "
                    + (i.upper() == null ? "open)" : ConsoleReport.number(i.upper()) + "]"));
        }
        return String.join(" u ", pieces);
    }

    private static String setName(RobustSet set) {
        return set.kind().equals("concentrated") ? "concentrated" : "joint, projected";
    }

    /** The console block, ending in a newline. */
    public static String render(RobustSets.Analysis analysis) {
        StringBuilder out = new StringBuilder();
        double level = analysis.sets().isEmpty() ? Double.NaN : analysis.sets().get(0).level();
        out.append(String.format(Locale.ROOT, "%nWeak-identification-robust sets at %.0f%% (S: Stock-Wright 2000; "
                + "K: Kleibergen 2005)%n", 100 * level));
        TextTable table = new TextTable(List.of("parameter", "method", "set", "critical value", "df", "set of values",
                "search range"));
        for (RobustSet set : analysis.sets()) {
            table.row(List.of(set.parameter(), set.method(), setName(set), ConsoleReport.fixed(set.criticalValue(), 3),
                    Integer.toString(set.df()), intervals(set), "[" + ConsoleReport.number(set.searchLow()) + ", "
                            + ConsoleReport.number(set.searchHigh()) + "]"));
        }
        out.append(table.render("  "));
        for (RobustSet set : analysis.sets()) {
            for (String note : set.notes()) {
                out.append("  ").append(set.parameter()).append(' ').append(set.method()).append(" (")
                        .append(setName(set)).append("): ").append(note).append('\n');
            }
        }
        for (String note : analysis.notes()) {
            out.append("  ").append(note).append('\n');
        }
        return out.toString();
    }

    /** Adds "robust_sets" (one object per set) and "robust_sets_summary" to a results object. */
    public static void addTo(ObjectNode results, RobustSets.Analysis analysis) {
        ArrayNode array = results.putArray("robust_sets");
        for (RobustSet set : analysis.sets()) {
            ObjectNode node = array.addObject();
            node.put("parameter", set.parameter());
            JsonResults.number(node, "level", set.level());
            node.put("method", set.method());
            node.put("set", set.kind());
            node.put("df", set.df());
            JsonResults.number(node, "critical_value", set.criticalValue());
            ArrayNode range = node.putArray("search_range");
            range.add(set.searchLow());
            range.add(set.searchHigh());
            ArrayNode intervals = node.putArray("intervals");
            for (RobustSet.Interval i : set.intervals()) {
                ArrayNode pair = intervals.addArray();
                if (i.lower() == null) {
                    pair.addNull();
                } else {
                    pair.add(i.lower());
                }
                if (i.upper() == null) {
                    pair.addNull();
                } else {
                    pair.add(i.upper());
                }
            }
            node.put("contains_estimate", set.containsEstimate());
            node.put("undefined_points", set.undefinedPoints());
            ArrayNode notes = node.putArray("notes");
            set.notes().forEach(notes::add);
        }
        ObjectNode summary = results.putObject("robust_sets_summary");
        JsonResults.number(summary, "minimum_s", analysis.minimumS());
        JsonResults.number(summary, "joint_s_critical_value", analysis.jointSCritical());
        ArrayNode notes = summary.putArray("notes");
        analysis.notes().forEach(notes::add);
    }

    /** A report section: the table of sets, one profile chart per parameter, the joint regions for P = 2. */
    public static void addSection(Report.Builder report, RobustSets.Analysis analysis) {
        report.section("Weak-identification-robust sets").table(table(analysis));
        for (RobustSets.Profile profile : analysis.profiles()) {
            report.chart(profileChart(profile));
        }
        analysis.joint().ifPresent(grid -> {
            report.chart(regionChart(grid, "S", grid.s(), grid.sCritical()));
            report.chart(regionChart(grid, "K", grid.k(), grid.kCritical()));
        });
        analysis.notes().forEach(report::paragraph);
    }

    static Table table(RobustSets.Analysis analysis) {
        Table.Builder table = Table.builder("robust-sets", "Weak-identification-robust confidence sets", "parameter",
                "method", "set", "critical value", "df", "set of values", "search range", "estimate inside");
        List<String> notes = new ArrayList<>();
        for (RobustSet set : analysis.sets()) {
            table.row(Cell.text(set.parameter()), Cell.text(set.method()), Cell.text(setName(set)),
                    Cell.fixed(set.criticalValue(), 3), Cell.count(set.df()), Cell.text(intervals(set)),
                    Cell.text("[" + ConsoleReport.number(set.searchLow()) + ", " + ConsoleReport.number(set.searchHigh())
                            + "]"), Cell.text(set.containsEstimate() ? "yes" : "no"));
            for (String note : set.notes()) {
                notes.add(set.parameter() + " " + set.method() + " (" + setName(set) + "): " + note + ".");
            }
        }
        table.note("S: {theta_i : min over the other parameters of T g' S(theta)^{-1} g <= chi-square(K - P + 1)} "
                + "(Stock and Wright 2000), S(theta) re-estimated at every theta with the model file's kernel and "
                + "bandwidth rule. K: Kleibergen's (2005) score statistic at the same values, chi-square(1). Joint: "
                + "the sets of all parameters together (chi-square(K) and chi-square(P)), projected on each axis. "
                + "\"open\" marks an end where the set reaches the search range and may go on.");
        notes.forEach(table::note);
        return table.build();
    }

    private static Chart profileChart(RobustSets.Profile profile) {
        double[] grid = profile.grid();
        double[] s = profile.s();
        double[] k = profile.k();
        List<Chart.Point> sPoints = new ArrayList<>();
        List<Chart.Point> kPoints = new ArrayList<>();
        for (int m = 0; m < grid.length; m++) {
            sPoints.add(new Chart.Point("", grid[m], s[m]));
            kPoints.add(new Chart.Point("", grid[m], k[m]));
        }
        return new Chart.Profile("robust-profile-" + slug(profile.parameter()),
                "Concentrated S and K statistics against " + profile.parameter(), profile.parameter(), "statistic",
                List.of(new Chart.Curve("min S over the others", sPoints), new Chart.Curve("K", kPoints)),
                List.of(new Chart.Level(profile.sCritical(), String.format(Locale.ROOT, "S critical value %.2f",
                        profile.sCritical())), new Chart.Level(profile.kCritical(),
                                String.format(Locale.ROOT, "K critical value %.2f", profile.kCritical()))),
                profile.estimate(), "estimate");
    }

    private static Chart regionChart(RobustSets.JointGrid grid, String method, double[][] values, double critical) {
        List<Double> xs = new ArrayList<>();
        for (double x : grid.xs()) {
            xs.add(x);
        }
        List<Double> ys = new ArrayList<>();
        for (double y : grid.ys()) {
            ys.add(y);
        }
        List<List<Boolean>> inside = new ArrayList<>();
        for (double[] row : values) {
            List<Boolean> flags = new ArrayList<>();
            for (double v : row) {
                flags.add(v <= critical);
            }
            inside.add(flags);
        }
        double[] estimate = grid.estimate();
        return new Chart.Region("robust-joint-" + method.toLowerCase(Locale.ROOT), String.format(Locale.ROOT,
                "Joint %s-set of %s and %s (dot: the estimate)", method, grid.xName(), grid.yName()), grid.xName(),
                grid.yName(), xs, ys, inside, new Chart.Point("estimate", estimate[0], estimate[1]));
    }

    private static String slug(String name) {
        String slug = name.toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9]+", "-").replaceAll("^-+|-+$", "");
        return slug.isEmpty() ? "parameter" : slug;
    }
}
