package org.orthogon.robust;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.function.BiFunction;
import org.apache.commons.math3.distribution.ChiSquaredDistribution;
import org.orthogon.analysis.ParallelRunner;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.ParameterBounds;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;

/**
 * Weak-identification-robust confidence sets by inverting the S test of Stock and Wright (2000, Econometrica
 * 68) and the K test of Kleibergen (2005, Econometrica 73): the set of θ whose statistic stays below the
 * chi-square critical value ({@link RobustStatistics}).
 * <ul>
 *   <li>Concentrated one-parameter sets: {θ_i : min over the others of S ≤ χ²_{K-P+1}(level)} (Stock and Wright
 *       2000, Theorem 3: the others, if well identified, are estimated away at the cost of P - 1 degrees of
 *       freedom), and {θ_i : K_i ≤ χ²_1(level)} with K_i at the same S-minimising values of the others. Each
 *       profile is evaluated on a grid over the search range, outwards from the estimate and back, every search
 *       started at a neighbour's answer; where the statistic crosses its critical value
 *       between two grid points the crossing is located by bisection.</li>
 *   <li>Joint sets {θ : S(θ) ≤ χ²_K(level)} and {θ : K(θ) ≤ χ²_P(level)}. The joint S-set's projection on axis i
 *       is exactly {θ_i : min over the others of S ≤ χ²_K}, read off the same profile for any P. When P = 2 both
 *       joint sets are also mapped on a grid over the plane, and the joint K-set is projected at the grid's
 *       resolution; for P &gt; 2 the joint K-set is not mapped. The joint S-set is empty exactly when min_θ S(θ),
 *       the continuously-updated objective, exceeds χ²_K: every θ is then rejected and the moment conditions
 *       with it.</li>
 * </ul>
 * Sets are unions of intervals and may be empty or unbounded: an end that reaches the search range is
 * reported open (null), with the reason. The grid can step over a piece of the set narrower than its
 * spacing, and the searches over the other parameters are local; the notes say so where it matters.
 * K is zero wherever the concentrated S is flat, so K-sets can hold values where S has a maximum or an
 * inflection point rather than a minimum: those grid points are named in the notes.
 */
public final class RobustSets {
    private static final int BISECTIONS = 40;
    /** Bisection stops when the bracket is below this share of the grid spacing. */
    private static final double CROSSING_TOLERANCE = 1e-10;

    private RobustSets() {
    }

    /** A concentrated profile: grid values of θ_i with min S and K_i at the minimising θ. */
    public record Profile(String parameter, int index, double estimate, double[] grid, double[] s, double[] k,
            double sCritical, double kCritical) {
        public Profile {
            grid = grid.clone();
            s = s.clone();
            k = k.clone();
        }

        @Override
        public double[] grid() {
            return grid.clone();
        }

        @Override
        public double[] s() {
            return s.clone();
        }

        @Override
        public double[] k() {
            return k.clone();
        }
    }

    /** The joint S and K statistics on a grid over two parameters (P = 2). */
    public record JointGrid(String xName, String yName, double[] xs, double[] ys, double[][] s, double[][] k,
            double sCritical, double kCritical, double[] estimate) {
        public JointGrid {
            xs = xs.clone();
            ys = ys.clone();
            s = deepCopy(s);
            k = deepCopy(k);
            estimate = estimate.clone();
        }

        @Override
        public double[][] s() {
            return deepCopy(s);
        }

        @Override
        public double[][] k() {
            return deepCopy(k);
        }

        @Override
        public double[] xs() {
            return xs.clone();
        }

        @Override
        public double[] ys() {
            return ys.clone();
        }

        @Override
        public double[] estimate() {
            return estimate.clone();
        }
    }

    /**
     * Everything the robust analysis found.
     *
     * @param sets      concentrated S and K sets per parameter, then (P = 2) the joint sets' projections
     * @param profiles  one per parameter
     * @param joint     the joint grid when P = 2
     * @param minimumS  the smallest S met anywhere in the searches (an upper bound on min_θ S)
     * @param jointSCritical χ²_K(level)
     * @param notes     what applies to every set: the joint set's fate for P &gt; 2, local searches
     */
    public record Analysis(List<RobustSet> sets, List<Profile> profiles, Optional<JointGrid> joint, double minimumS,
            double jointSCritical, List<String> notes) {
        public Analysis {
            sets = List.copyOf(sets);
            profiles = List.copyOf(profiles);
            notes = List.copyOf(notes);
        }
    }

    /**
     * The robust sets of a fit's parameters.
     *
     * @param model       the moments the fit was made from
     * @param fit         the fit: estimates and Wald standard errors place the default search ranges
     * @param longRun     the run's long-run covariance choices (Ŝ(θ) is re-estimated with them at every θ)
     * @param smallSample whether Ŝ carries the small-sample factor T/(T - P)
     * @param bounds      the parameter bounds of the run (searches stay inside them)
     * @param options     level, grids and search ranges
     * @throws IllegalArgumentException for a search range naming no parameter
     */
    public static Analysis compute(MomentModel model, GmmFit fit, LongRunOptions longRun, boolean smallSample,
            ParameterBounds bounds, RobustSetOptions options) {
        return compute(model, fit, longRun, smallSample, bounds, options, 1);
    }

    /**
     * As {@link #compute(MomentModel, GmmFit, LongRunOptions, boolean, ParameterBounds, RobustSetOptions)}, the
     * parameters' profiles and the rows of the joint grid shared among {@code threads} threads. Each profile's
     * warm-started chain of searches runs on one thread in its fixed order, so the result is the same for
     * every thread count.
     */
    public static Analysis compute(MomentModel model, GmmFit fit, LongRunOptions longRun, boolean smallSample,
            ParameterBounds bounds, RobustSetOptions options, int threads) {
        List<String> names = model.parameterNames();
        for (String name : options.ranges().keySet()) {
            if (!names.contains(name)) {
                throw new IllegalArgumentException("a search range is given for \"" + name
                        + "\", which is not a parameter of this model " + names);
            }
        }
        int p = names.size();
        int k = model.momentCount();
        double[] estimate = fit.estimates();
        double[] scales = scales(fit);
        ParameterBounds box = bounds.forParameters(p);
        double sCritical = quantile(k - p + 1, options.level());
        double kCritical = quantile(1, options.level());
        double jointS = quantile(k, options.level());
        double jointK = quantile(p, options.level());
        List<ParameterSets> perParameter = ParallelRunner.map(p, threads, i -> {
            double[] range = range(names.get(i), i, estimate, scales, box, options);
            ProfileMinimizer minimizer = new ProfileMinimizer(model, longRun, smallSample, box, i, scales);
            ProfileRun run = new ProfileRun(model, longRun, smallSample, minimizer, i, estimate);
            double[] grid = linspace(range[0], range[1], options.points());
            run.evaluate(grid);
            Profile profile = new Profile(names.get(i), i, estimate[i], grid, run.s, run.k, sCritical, kCritical);
            double lowerBound = box.lower()[i];
            double upperBound = box.upper()[i];
            RobustSet sSet = extract(names.get(i), options.level(), "S", "concentrated", k - p + 1, sCritical, grid,
                    run.s, estimate[i], lowerBound, upperBound, (x, warm) -> run.sAt(x, warm), run.thetas);
            RobustSet kSet = extract(names.get(i), options.level(), "K", "concentrated", 1, kCritical, grid, run.k,
                    estimate[i], lowerBound, upperBound, (x, warm) -> run.kAt(x, warm), run.thetas);
            // The joint S-set projected on axis i is {x : min over the others of S ≤ χ²_K}: the same profile.
            RobustSet projection = extract(names.get(i), options.level(), "S", "joint-projection", k, jointS, grid,
                    run.s, estimate[i], lowerBound, upperBound, (x, warm) -> run.sAt(x, warm), run.thetas);
            return new ParameterSets(profile, List.of(sSet, withFlatPointsNamed(kSet, grid, run.s, sCritical, run.k,
                    kCritical), projection));
        });
        List<RobustSet> sets = new ArrayList<>();
        List<Profile> profiles = new ArrayList<>();
        double minimumS = Double.POSITIVE_INFINITY;
        for (ParameterSets found : perParameter) {
            profiles.add(found.profile());
            sets.addAll(found.sets());
            minimumS = Math.min(minimumS, smallest(found.profile().s));
        }
        List<String> notes = new ArrayList<>();
        notes.add(String.format(Locale.ROOT, "The other parameters are concentrated out by local derivative-free "
                + "searches started at the neighbouring grid points' answers, outwards from the estimate and back; %d grid points per "
                + "parameter, crossings located by bisection; a piece of a set narrower than the grid spacing can be "
                + "missed.", options.points()));
        Optional<JointGrid> joint = Optional.empty();
        if (p == 2) {
            JointGrid grid = jointGrid(model, longRun, smallSample, names, estimate, profiles, options, jointS, jointK,
                    threads);
            joint = Optional.of(grid);
            for (double[] row : grid.s) {
                minimumS = Math.min(minimumS, smallest(row));
            }
            sets.addAll(projections(grid, options.level(), p, box));
        } else if (p > 2) {
            notes.add(String.format(Locale.ROOT, "The joint S-set of all %d parameters is reported through its exact "
                    + "projections on each axis (the profile against chi-square(%d)); the joint K-set is not mapped (that "
                    + "would take a grid in %d dimensions).", p, k, p));
        }
        if (minimumS > jointS) {
            notes.add(String.format(Locale.ROOT, "The joint S-set is empty: the smallest S met, %.4g, exceeds "
                    + "chi-square(%d) at %.0f%%, %.4g, so every parameter value is rejected, and with it the moment "
                    + "conditions.", minimumS, k, 100 * options.level(), jointS));
        } else if (p > 2) {
            notes.add(String.format(Locale.ROOT, "The joint S-set is not empty: S reaches %.4g, below chi-square(%d) "
                    + "at %.0f%%, %.4g.", minimumS, k, 100 * options.level(), jointS));
        }
        return new Analysis(sets, profiles, joint, minimumS, jointS, notes);
    }

    /** One parameter's profile and its S, K and joint-projection sets. */
    private record ParameterSets(Profile profile, List<RobustSet> sets) {
    }

    /** The smallest value that is not NaN, +∞ when there is none. */
    private static double smallest(double[] values) {
        double min = Double.POSITIVE_INFINITY;
        for (double v : values) {
            if (!Double.isNaN(v)) {
                min = Math.min(min, v);
            }
        }
        return min;
    }

    /** χ²_df quantile at the level. */
    static double quantile(int df, double level) {
        return new ChiSquaredDistribution(null, df).inverseCumulativeProbability(level);
    }

    /** Wald standard errors, or a tenth of the estimate's size (at least 0.1) where they are not usable. */
    private static double[] scales(GmmFit fit) {
        double[] out = new double[fit.parameters().size()];
        for (int i = 0; i < out.length; i++) {
            double se = fit.parameters().get(i).stdError();
            double estimate = fit.parameters().get(i).estimate();
            out[i] = Double.isFinite(se) && se > 0 ? se : Math.max(0.1 * Math.abs(estimate), 0.1);
        }
        return out;
    }

    private static double[] range(String name, int i, double[] estimate, double[] scales, ParameterBounds box,
            RobustSetOptions options) {
        double[] given = options.ranges().get(name);
        double low = given != null ? given[0] : estimate[i] - options.width() * scales[i];
        double high = given != null ? given[1] : estimate[i] + options.width() * scales[i];
        low = Math.max(low, box.lower()[i]);
        high = Math.min(high, box.upper()[i]);
        if (!(low < high)) {
            throw new IllegalArgumentException("the search range of " + name + " lies outside its bounds ["
                    + box.lower()[i] + ", " + box.upper()[i] + "]");
        }
        return new double[] {low, high};
    }

    static double[] linspace(double low, double high, int n) {
        double[] x = new double[n];
        for (int m = 0; m < n; m++) {
            x[m] = m == n - 1 ? high : low + (high - low) * m / (n - 1);
        }
        return x;
    }

    /** The profile of one parameter, evaluated from the estimate outwards with warm starts. */
    private static final class ProfileRun {
        final MomentModel model;
        final LongRunOptions longRun;
        final boolean smallSample;
        final ProfileMinimizer minimizer;
        final int index;
        final double[] estimate;
        double[] s;
        double[] k;
        double[][] thetas;

        ProfileRun(MomentModel model, LongRunOptions longRun, boolean smallSample, ProfileMinimizer minimizer,
                int index, double[] estimate) {
            this.model = model;
            this.longRun = longRun;
            this.smallSample = smallSample;
            this.minimizer = minimizer;
            this.index = index;
            this.estimate = estimate;
        }

        /**
         * Outwards from the estimate, each search started at its neighbour's answer; then inwards from both ends,
         * started at the outer neighbour's answer, keeping the lower minimum, so that a branch of lower S found
         * further out is carried back (two warm starts per point instead of one cold one).
         */
        void evaluate(double[] grid) {
            int n = grid.length;
            s = new double[n];
            k = new double[n];
            thetas = new double[n][];
            double[] minimum = new double[n];
            int center = 0;
            for (int m = 1; m < n; m++) {
                if (Math.abs(grid[m] - estimate[index]) < Math.abs(grid[center] - estimate[index])) {
                    center = m;
                }
            }
            for (int m = center; m < n; m++) {
                fill(grid, m, m == center ? estimate : thetas[m - 1], minimum);
            }
            for (int m = center - 1; m >= 0; m--) {
                fill(grid, m, thetas[m + 1], minimum);
            }
            for (int m = n - 2; m > center; m--) {
                improve(grid, m, thetas[m + 1], minimum);
            }
            for (int m = 1; m < center; m++) {
                improve(grid, m, thetas[m - 1], minimum);
            }
            for (int m = 0; m < n; m++) {
                s[m] = minimum[m] >= ProfileMinimizer.UNDEFINED ? Double.NaN : minimum[m];
                k[m] = Double.isNaN(s[m]) ? Double.NaN : kAtTheta(thetas[m]);
            }
        }

        private void fill(double[] grid, int m, double[] warm, double[] minimum) {
            ProfileMinimizer.Minimum found = minimizer.minimize(grid[m], warm);
            thetas[m] = found.theta();
            minimum[m] = found.s();
        }

        private void improve(double[] grid, int m, double[] warm, double[] minimum) {
            ProfileMinimizer.Minimum found = minimizer.minimize(grid[m], warm);
            if (found.s() < minimum[m]) {
                thetas[m] = found.theta();
                minimum[m] = found.s();
            }
        }

        double kAtTheta(double[] theta) {
            RobustStatistics.Point point = RobustStatistics.sAndK(model, theta, longRun, smallSample);
            return point.defined() ? point.kFor(index) : Double.NaN;
        }

        double sAt(double x, double[] warm) {
            ProfileMinimizer.Minimum minimum = minimizer.minimize(x, warm);
            return minimum.s() >= ProfileMinimizer.UNDEFINED ? Double.NaN : minimum.s();
        }

        double kAt(double x, double[] warm) {
            ProfileMinimizer.Minimum minimum = minimizer.minimize(x, warm);
            return minimum.s() >= ProfileMinimizer.UNDEFINED ? Double.NaN : kAtTheta(minimum.theta());
        }
    }

    /**
     * {x : value(x) ≤ c} from grid values, crossings refined by bisection with {@code refine} started at the
     * inside point's θ ({@code warm}); with no {@code refine} the ends stay at the inside grid points.
     */
    static RobustSet extract(String name, double level, String method, String kind, int df, double critical,
            double[] grid, double[] values, double estimate, double lowerBound, double upperBound,
            BiFunction<Double, double[], Double> refine, double[][] warm) {
        int n = grid.length;
        boolean[] in = new boolean[n];
        int undefined = 0;
        double smallest = Double.POSITIVE_INFINITY;
        for (int m = 0; m < n; m++) {
            in[m] = values[m] <= critical;
            if (Double.isNaN(values[m])) {
                undefined++;
            } else {
                smallest = Math.min(smallest, values[m]);
            }
        }
        List<RobustSet.Interval> intervals = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        String statistic = method.equals("S") ? "min S" : "K";
        int m = 0;
        while (m < n) {
            if (!in[m]) {
                m++;
                continue;
            }
            int a = m;
            while (m + 1 < n && in[m + 1]) {
                m++;
            }
            int b = m;
            Double lower;
            if (a == 0) {
                if (grid[0] == lowerBound) {
                    lower = grid[0];
                    notes.add(String.format(Locale.ROOT, "reaches the lower bound %s of %s, where the parameter space "
                            + "ends", number(lowerBound), name));
                } else {
                    lower = null;
                    notes.add(String.format(Locale.ROOT, "open below: %s = %.4g <= %.4g at the lower end %s of the search "
                            + "range, so the set may extend further down (widen the range to see)", statistic, values[0],
                            critical, number(grid[0])));
                }
            } else if (Double.isNaN(values[a - 1])) {
                lower = refine == null ? grid[a] : crossing(grid[a - 1], grid[a], critical, refine, warm[a]);
                notes.add(String.format(Locale.ROOT, "stops at %s, where the statistic ceases to be defined (the SDF "
                        + "or S cannot be evaluated at %s)", number(lower), number(grid[a - 1])));
            } else {
                lower = refine == null ? grid[a] : crossing(grid[a - 1], grid[a], critical, refine, warm[a]);
            }
            Double upper;
            if (b == n - 1) {
                if (grid[n - 1] == upperBound) {
                    upper = grid[n - 1];
                    notes.add(String.format(Locale.ROOT, "reaches the upper bound %s of %s, where the parameter space "
                            + "ends", number(upperBound), name));
                } else {
                    upper = null;
                    notes.add(String.format(Locale.ROOT, "open above: %s = %.4g <= %.4g at the upper end %s of the search "
                            + "range, so the set may extend further up (widen the range to see)", statistic,
                            values[n - 1], critical, number(grid[n - 1])));
                }
            } else if (Double.isNaN(values[b + 1])) {
                upper = refine == null ? grid[b] : crossing(grid[b + 1], grid[b], critical, refine, warm[b]);
                notes.add(String.format(Locale.ROOT, "stops at %s, where the statistic ceases to be defined (the SDF "
                        + "or S cannot be evaluated at %s)", number(upper), number(grid[b + 1])));
            } else {
                upper = refine == null ? grid[b] : crossing(grid[b + 1], grid[b], critical, refine, warm[b]);
            }
            intervals.add(new RobustSet.Interval(lower, upper));
            m++;
        }
        if (intervals.isEmpty()) {
            notes.add(String.format(Locale.ROOT, "empty: %s stays above the critical value %.4g over the whole search "
                    + "range [%s, %s] (its smallest value there is %.4g): no value of %s is accepted at this level",
                    statistic, critical, number(grid[0]), number(grid[n - 1]), smallest, name));
        }
        if (undefined > 0) {
            notes.add(undefined + " of " + n + " grid points could not be evaluated (the SDF or S is not defined there)"
                    + " and count as outside the set");
        }
        boolean contains = intervals.stream().anyMatch(i -> i.contains(estimate));
        return new RobustSet(name, level, method, kind, df, critical, grid[0], grid[n - 1], intervals, contains,
                undefined, notes);
    }

    /**
     * The point between an outside x and an inside x where the value meets the critical value, by bisection; a
     * point where the value is not defined (NaN) counts as outside.
     */
    private static double crossing(double outside, double inside, double critical,
            BiFunction<Double, double[], Double> value, double[] warm) {
        double out = outside;
        double in = inside;
        double tolerance = CROSSING_TOLERANCE * Math.abs(outside - inside);
        for (int i = 0; i < BISECTIONS && Math.abs(out - in) > tolerance; i++) {
            double mid = 0.5 * (out + in);
            if (mid == out || mid == in) {
                break;
            }
            double v = value.apply(mid, warm);
            if (v <= critical) {
                in = mid;
            } else {
                out = mid;
            }
        }
        return in;
    }

    /** Adds to a K-set the note naming grid points it accepts where the concentrated S is above its critical value. */
    private static RobustSet withFlatPointsNamed(RobustSet kSet, double[] grid, double[] s, double sCritical,
            double[] k, double kCritical) {
        List<String> ranges = new ArrayList<>();
        int m = 0;
        int n = grid.length;
        while (m < n) {
            if (!(k[m] <= kCritical && s[m] > sCritical)) {
                m++;
                continue;
            }
            int a = m;
            while (m + 1 < n && k[m + 1] <= kCritical && s[m + 1] > sCritical) {
                m++;
            }
            ranges.add(a == m ? number(grid[a]) : "[" + number(grid[a]) + ", " + number(grid[m]) + "]");
            m++;
        }
        if (ranges.isEmpty()) {
            return kSet;
        }
        List<String> notes = new ArrayList<>(kSet.notes());
        notes.add("holds values where the concentrated S is above its own critical value, " + String.join(", ", ranges)
                + ": there K is small because S is flat (near a maximum or an inflection point of S), not because the "
                + "moments fit; read the K-set together with the S-set");
        return new RobustSet(kSet.parameter(), kSet.level(), kSet.method(), kSet.kind(), kSet.df(),
                kSet.criticalValue(), kSet.searchLow(), kSet.searchHigh(), kSet.intervals(), kSet.containsEstimate(),
                kSet.undefinedPoints(), notes);
    }

    private static JointGrid jointGrid(MomentModel model, LongRunOptions longRun, boolean smallSample,
            List<String> names, double[] estimate, List<Profile> profiles, RobustSetOptions options, double sCritical,
            double kCritical, int threads) {
        double[] xs = linspace(profiles.get(0).grid[0], profiles.get(0).grid[profiles.get(0).grid.length - 1],
                options.jointPoints());
        double[] ys = linspace(profiles.get(1).grid[0], profiles.get(1).grid[profiles.get(1).grid.length - 1],
                options.jointPoints());
        // Every point stands alone (no warm starts), so the rows can be shared among threads in any order.
        List<double[][]> rows = ParallelRunner.map(ys.length, threads, r -> {
            double[][] sk = new double[2][xs.length];
            for (int c = 0; c < xs.length; c++) {
                RobustStatistics.Point point = RobustStatistics.sAndK(model, new double[] {xs[c], ys[r]}, longRun,
                        smallSample);
                sk[0][c] = point.defined() ? point.s() : Double.NaN;
                sk[1][c] = point.defined() ? point.k() : Double.NaN;
            }
            return sk;
        });
        double[][] s = new double[ys.length][];
        double[][] k = new double[ys.length][];
        for (int r = 0; r < ys.length; r++) {
            s[r] = rows.get(r)[0];
            k[r] = rows.get(r)[1];
        }
        return new JointGrid(names.get(0), names.get(1), xs, ys, s, k, sCritical, kCritical, estimate);
    }

    /**
     * The joint K-set's projections on each axis at the grid's resolution (the joint S-set's come exactly from
     * the profiles, so only K is projected from the grid).
     */
    private static List<RobustSet> projections(JointGrid grid, double level, int p, ParameterBounds box) {
        List<RobustSet> out = new ArrayList<>();
        for (int axis = 0; axis < 2; axis++) {
            double[] along = axis == 0 ? grid.xs : grid.ys;
            double[] best = new double[along.length];
            java.util.Arrays.fill(best, Double.NaN);
            for (int r = 0; r < grid.ys.length; r++) {
                for (int c = 0; c < grid.xs.length; c++) {
                    int at = axis == 0 ? c : r;
                    double v = grid.k[r][c];
                    if (!Double.isNaN(v) && !(best[at] <= v)) {
                        best[at] = v;
                    }
                }
            }
            String name = axis == 0 ? grid.xName : grid.yName;
            RobustSet projected = extract(name, level, "K", "joint-projection", p, grid.kCritical, along, best,
                    grid.estimate[axis], box.lower()[axis], box.upper()[axis], null, null);
            List<String> notes = new ArrayList<>(projected.notes());
            notes.add(String.format(Locale.ROOT, "projection of the joint K-set on %s at the resolution of the "
                    + "%d x %d grid (spacing %s), so each end is known to within one spacing", name,
                    grid.xs.length, grid.ys.length, number(along[1] - along[0])));
            out.add(new RobustSet(projected.parameter(), level, "K", "joint-projection", p, grid.kCritical,
                    projected.searchLow(), projected.searchHigh(), projected.intervals(),
                    projected.containsEstimate(), projected.undefinedPoints(), notes));
        }
        return out;
    }

    private static String number(double x) {
        return String.format(Locale.ROOT, "%.6g", x);
    }

    private static double[][] deepCopy(double[][] a) {
        double[][] out = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            out[i] = a[i].clone();
        }
        return out;
    }
}
