package org.orthogon.robust;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.GmmEstimator;
import org.orthogon.gmm.GmmFit;
import org.orthogon.gmm.GmmOptions;
import org.orthogon.gmm.ParameterBounds;
import org.orthogon.longrun.LongRunCovariance;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.moments.MomentModel;
import org.orthogon.moments.PowerUtilityErrors;
import org.orthogon.moments.ScaledMoments;
import org.orthogon.spec.FittedRun;
import org.orthogon.spec.ModelFile;
import org.orthogon.spec.RunSpec;

/**
 * The S-sets of Stock and Wright (2000, Econometrica 68) and the K-sets of Kleibergen (2005, Econometrica 73)
 * checked against cases with known answers and against an independent script.
 */
class RobustSetsTest {

    /**
     * Moments f_t(θ) = x_t - C θ with C fixed: centering removes θ from u_t, so Ŝ does not depend on θ and
     * S(θ) = T (x̄ - Cθ)' Ŝ^{-1} (x̄ - Cθ) is an exact quadratic (Stock and Wright 2000, section 2: the S
     * statistic is the CUE objective; here CUE is GLS). With A = T C'Ŝ^{-1}C, θ̂ = argmin S and S_min = S(θ̂):
     * S(θ) = S_min + (θ - θ̂)'A(θ - θ̂), so the joint S-set is the ellipse (θ - θ̂)'A(θ - θ̂) ≤ χ²_K - S_min, its
     * projections and the concentrated sets are θ̂_i ± sqrt((c - S_min)[A^{-1}]_ii) with c = χ²_K and χ²_{K-P+1}.
     * The Jacobian rows are constant, so D̃ = -C, K(θ) = (θ - θ̂)'A(θ - θ̂) and the concentrated K-set is the
     * Wald interval θ̂_i ± sqrt(χ²_1 [A^{-1}]_ii) (Kleibergen 2005, section 2: K equals the Wald statistic when the
     * Jacobian is known). Algebra of quadratic forms; common practice, no source.
     */
    private static final class ShiftedMeans implements MomentModel {
        final double[][] x;
        final double[][] c;

        ShiftedMeans(long seed, int t, int k, double[][] c, double shift) {
            Random random = new Random(seed);
            this.c = c;
            x = new double[t][k];
            double[] previous = new double[k];
            for (int s = 0; s < t; s++) {
                for (int j = 0; j < k; j++) {
                    previous[j] = 0.4 * previous[j] + random.nextGaussian();
                    x[s][j] = previous[j] + 0.3 * c[j][0] + (c[j].length > 1 ? -0.2 * c[j][1] : 0) + shift * (j % 2);
                }
            }
        }

        @Override
        public List<String> parameterNames() {
            return c[0].length == 1 ? List.of("a") : List.of("a", "b");
        }

        @Override
        public List<String> momentNames() {
            List<String> names = new ArrayList<>();
            for (int j = 0; j < x[0].length; j++) {
                names.add("m" + j);
            }
            return names;
        }

        @Override
        public int observations() {
            return x.length;
        }

        @Override
        public DMatrixRMaj contributions(double[] theta) {
            int k = x[0].length;
            DMatrixRMaj f = new DMatrixRMaj(x.length, k);
            for (int s = 0; s < x.length; s++) {
                for (int j = 0; j < k; j++) {
                    double v = x[s][j];
                    for (int p = 0; p < theta.length; p++) {
                        v -= c[j][p] * theta[p];
                    }
                    f.set(s, j, v);
                }
            }
            return f;
        }

        @Override
        public DMatrixRMaj meanJacobian(double[] theta) {
            DMatrixRMaj d = new DMatrixRMaj(c);
            CommonOps_DDRM.scale(-1.0, d);
            return d;
        }

        @Override
        public boolean isLinear() {
            return true;
        }

        @Override
        public DMatrixRMaj payoffs() {
            return new DMatrixRMaj(x);
        }
    }

    private static final double[][] LOADINGS = {{1.0, 0.2}, {0.5, 1.0}, {0.8, -0.4}, {0.3, 0.6}, {1.2, 0.1}};

    @Test
    void quadraticCaseGivesTheEllipseAndWaldIntervals() {
        ShiftedMeans model = new ShiftedMeans(7, 150, 5, LOADINGS, 0.0);
        LongRunOptions bartlett = LongRunOptions.bartlettLags(4);
        GmmFit fit = GmmEstimator.estimate(model, new double[2],
                new GmmOptions(EstimationMethod.TWO_STEP, bartlett));
        Quadratic q = Quadratic.of(model, bartlett);
        RobustSets.Analysis analysis = RobustSets.compute(model, fit, bartlett, false, ParameterBounds.none(),
                RobustSetOptions.defaults(0.95).withPoints(41, 41));
        assertThat(analysis.minimumS()).isCloseTo(q.minimum, within(1e-8));
        double sConcentrated = RobustSets.quantile(4, 0.95); // K - P + 1 = 4
        double sJoint = RobustSets.quantile(5, 0.95);
        double kOne = RobustSets.quantile(1, 0.95);
        for (int i = 0; i < 2; i++) {
            String name = model.parameterNames().get(i);
            double halfS = Math.sqrt((sConcentrated - q.minimum) * q.inverse.get(i, i));
            assertInterval(set(analysis, name, "S", "concentrated"), q.center[i] - halfS, q.center[i] + halfS, 1e-7);
            double halfK = Math.sqrt(kOne * q.inverse.get(i, i));
            assertInterval(set(analysis, name, "K", "concentrated"), q.center[i] - halfK, q.center[i] + halfK, 1e-7);
            // The joint S-set's projection comes from the profile; the joint K-set's is read off the 41 x 41 grid,
            // exact to within one spacing: the Wald ellipse's projection θ̂_i ± sqrt(χ²_2 [A^{-1}]_ii).
            double halfJoint = Math.sqrt((sJoint - q.minimum) * q.inverse.get(i, i));
            assertInterval(set(analysis, name, "S", "joint-projection"), q.center[i] - halfJoint,
                    q.center[i] + halfJoint, 1e-7);
            RobustSet projection = set(analysis, name, "K", "joint-projection");
            double halfEllipse = Math.sqrt(RobustSets.quantile(2, 0.95) * q.inverse.get(i, i));
            double spacing = (projection.searchHigh() - projection.searchLow()) / 40;
            assertInterval(projection, q.center[i] - halfEllipse, q.center[i] + halfEllipse, spacing);
        }
        assertThat(analysis.sets()).allSatisfy(s -> assertThat(s.containsEstimate()).isTrue());
    }

    @Test
    void threadCountDoesNotChangeTheSets() {
        // The profiles and the joint grid's rows are shared among threads; every search chain keeps its own
        // order, so one and two threads must give the same sets, profiles and grid, bit for bit.
        ShiftedMeans model = new ShiftedMeans(7, 150, 5, LOADINGS, 0.0);
        LongRunOptions bartlett = LongRunOptions.bartlettLags(4);
        GmmFit fit = GmmEstimator.estimate(model, new double[2], new GmmOptions(EstimationMethod.TWO_STEP, bartlett));
        RobustSetOptions options = RobustSetOptions.defaults(0.95).withPoints(21, 15);
        RobustSets.Analysis one = RobustSets.compute(model, fit, bartlett, false, ParameterBounds.none(), options, 1);
        RobustSets.Analysis two = RobustSets.compute(model, fit, bartlett, false, ParameterBounds.none(), options, 2);
        assertThat(two.sets()).isEqualTo(one.sets());
        assertThat(two.minimumS()).isEqualTo(one.minimumS());
        for (int i = 0; i < 2; i++) {
            assertThat(two.profiles().get(i).s()).containsExactly(one.profiles().get(i).s());
            assertThat(two.profiles().get(i).k()).containsExactly(one.profiles().get(i).k());
        }
        assertThat(two.joint().orElseThrow().s()).isDeepEqualTo(one.joint().orElseThrow().s());
        assertThat(two.joint().orElseThrow().k()).isDeepEqualTo(one.joint().orElseThrow().k());
    }

    @Test
    void rejectedMomentsGiveEmptySetsSaidSo() {
        // Shifting alternate means by 0.6 that no θ can absorb: S_min far above every critical value.
        ShiftedMeans model = new ShiftedMeans(7, 150, 5, LOADINGS, 0.6);
        LongRunOptions hc = LongRunOptions.heteroskedasticityConsistent();
        GmmFit fit = GmmEstimator.estimate(model, new double[2], new GmmOptions(EstimationMethod.TWO_STEP, hc));
        Quadratic q = Quadratic.of(model, hc);
        assertThat(q.minimum).isGreaterThan(2 * RobustSets.quantile(5, 0.95));
        RobustSets.Analysis analysis = RobustSets.compute(model, fit, hc, false, ParameterBounds.none(),
                RobustSetOptions.defaults(0.95).withPoints(51, 21));
        for (String name : model.parameterNames()) {
            RobustSet s = set(analysis, name, "S", "concentrated");
            assertThat(s.isEmpty()).isTrue();
            assertThat(s.notes()).anyMatch(n -> n.startsWith("empty"));
        }
        assertThat(analysis.notes()).anyMatch(n -> n.startsWith("The joint S-set is empty"));
    }

    @Test
    void oneParameterSetIsTheRootIntervalOfTheQuadratic() {
        double[][] loadings = {{1.0}, {0.5}, {0.8}};
        ShiftedMeans model = new ShiftedMeans(3, 120, 3, loadings, 0.0);
        LongRunOptions hc = LongRunOptions.heteroskedasticityConsistent();
        GmmFit fit = GmmEstimator.estimate(model, new double[1], new GmmOptions(EstimationMethod.TWO_STEP, hc));
        Quadratic q = Quadratic.of(model, hc);
        RobustSets.Analysis analysis = RobustSets.compute(model, fit, hc, false, ParameterBounds.none(),
                RobustSetOptions.defaults(0.90).withPoints(61, 11));
        // With P = 1 nothing is concentrated out: {a : S(a) ≤ χ²_K}, the roots of S_min + A(a - â)² = c.
        double half = Math.sqrt((RobustSets.quantile(3, 0.90) - q.minimum) * q.inverse.get(0, 0));
        RobustSet s = set(analysis, "a", "S", "concentrated");
        assertThat(s.df()).isEqualTo(3);
        assertInterval(s, q.center[0] - half, q.center[0] + half, 1e-7);
        assertThat(analysis.joint()).isEmpty();
    }

    @Test
    void exactlyIdentifiedSetContainsTheEstimateWhereSIsZero() {
        // Power utility on two assets: K = P = 2, so g(θ̂) = 0 and S(θ̂) = 0; the joint S-set is {θ : S ≤ χ²_2}
        // (Stock and Wright 2000: S is χ²_K at the truth; here K = P) and the concentrated sets use χ²_1.
        Random random = new Random(11);
        int t = 160;
        double[][] gross = new double[t][2];
        double[] growth = new double[t];
        for (int s = 0; s < t; s++) {
            double shock = random.nextGaussian();
            growth[s] = Math.exp(0.005 + 0.01 * shock);
            gross[s][0] = Math.exp(0.01 + 0.03 * shock + 0.02 * random.nextGaussian());
            gross[s][1] = Math.exp(0.015 + 0.06 * shock + 0.05 * random.nextGaussian());
        }
        MomentModel model = ScaledMoments.unscaled(new PowerUtilityErrors(gross, growth, List.of("A", "B")));
        LongRunOptions hc = LongRunOptions.heteroskedasticityConsistent();
        GmmFit fit = GmmEstimator.estimate(model, new double[] {0.99, 2.0}, new GmmOptions(EstimationMethod.TWO_STEP, hc));
        RobustStatistics.Point atEstimate = RobustStatistics.sAndK(model, fit.estimates(), hc, false);
        assertThat(atEstimate.s()).isLessThan(1e-12);
        assertThat(atEstimate.k()).isLessThan(1e-12);
        RobustSets.Analysis analysis = RobustSets.compute(model, fit, hc, false, ParameterBounds.none(),
                RobustSetOptions.defaults(0.95).withPoints(61, 31));
        assertThat(analysis.minimumS()).isLessThan(1e-10);
        assertThat(analysis.jointSCritical()).isCloseTo(5.991464547107979, within(1e-12)); // χ²_2, NIST table 5.99
        for (String name : model.parameterNames()) {
            RobustSet s = set(analysis, name, "S", "concentrated");
            assertThat(s.df()).isEqualTo(1);
            assertThat(s.containsEstimate()).isTrue();
            assertThat(set(analysis, name, "S", "joint-projection").df()).isEqualTo(2);
            assertThat(set(analysis, name, "S", "joint-projection").containsEstimate()).isTrue();
        }
        // Every grid point of the joint set has S ≤ χ²_2 and the estimate's cell is in it.
        RobustSets.JointGrid grid = analysis.joint().orElseThrow();
        assertThat(grid.sCritical()).isEqualTo(analysis.jointSCritical());
    }

    @Test
    void lumenPowerUtilityAgreesWithTheIndependentScript() {
        // src/test/resources/reference/robust/s_sets_reference.py (numpy 2.4, scipy 1.17), written from the
        // definitions of Stock and Wright (2000) and Kleibergen (2005), over the same search ranges.
        RunSpec spec = ModelFile.read(Paths.get("models/lumen-power-utility.toml"));
        FittedRun run = FittedRun.of(spec);
        MomentModel model = run.prepared().moments();
        LongRunOptions longRun = spec.estimation().longRunOptions();
        List<String[]> rows = reference();
        for (String[] row : rows) {
            double[] theta = {Double.parseDouble(row[1]), Double.parseDouble(row[2])};
            if (row[0].equals("point")) {
                RobustStatistics.Point point = RobustStatistics.sAndK(model, theta, longRun, false);
                assertRelative("S at " + row[1] + "," + row[2], point.s(), row[3], 1e-9);
                assertRelative("K at " + row[1] + "," + row[2], point.k(), row[4], 1e-8);
            }
        }
        RobustSets.Analysis analysis = RobustSets.compute(model, run.fit(), longRun, false,
                FittedRun.options(spec, run.prepared()).bounds(), RobustSetOptions.defaults(0.95).withPoints(101, 11)
                        .withRanges(Map.of("beta", new double[] {0.84, 1.11}, "gamma", new double[] {-30, 50})));
        for (String[] row : rows) {
            if (row[0].startsWith("profile_")) {
                String name = row[0].substring("profile_".length());
                int i = name.equals("beta") ? 0 : 1;
                double x = Double.parseDouble(row[1 + i]);
                RobustSets.Profile profile = analysis.profiles().get(i);
                ProfileMinimizer minimizer = new ProfileMinimizer(model, longRun, false,
                        FittedRun.options(spec, run.prepared()).bounds(), i, new double[] {0.0068, 2.06});
                ProfileMinimizer.Minimum minimum = minimizer.minimize(x, run.fit().estimates());
                assertRelative("min S at " + name + " = " + x, minimum.s(), row[3], 1e-9);
                assertRelative("other parameter at " + name + " = " + x, minimum.theta()[1 - i], row[2 - i], 1e-6);
                double k = RobustStatistics.sAndK(model, minimum.theta(), longRun, false).kFor(i);
                assertRelative("K_i at " + name + " = " + x, k, row[4], 1e-6);
                assertThat(profile.parameter()).isEqualTo(name);
            }
            if (row[0].startsWith("set_")) {
                String[] what = row[0].split("_");
                RobustSet set = set(analysis, what[1], what[2], "concentrated");
                assertThat(set.df()).isEqualTo(Integer.parseInt(row[1]));
                assertRelative("critical value", set.criticalValue(), row[2], 1e-12);
                String[] pieces = row[3].split(" ");
                assertThat(set.intervals()).as(row[0]).hasSize(pieces.length);
                for (int m = 0; m < pieces.length; m++) {
                    String[] ends = pieces[m].split(":");
                    // K at a profile point moves with where the minimum over the other parameter is placed
                    // (each program's line search stops near 1e-10 relative), so its ends agree less closely.
                    double tolerance = what[2].equals("S") ? 1e-7 : 1e-6;
                    assertEnd(row[0] + " lower " + m, set.intervals().get(m).lower(), ends[0], tolerance);
                    assertEnd(row[0] + " upper " + m, set.intervals().get(m).upper(), ends[1], tolerance);
                }
            }
        }
        // The figures: Wald [3.8, 11.9] against the robust S-set [1.86, 19.44].
        RobustSet gamma = set(analysis, "gamma", "S", "concentrated");
        assertThat(gamma.intervals().get(0).lower()).isCloseTo(1.8587, within(1e-4));
        assertThat(gamma.intervals().get(0).upper()).isCloseTo(19.4354, within(1e-4));
    }

    private static void assertEnd(String what, Double actual, String expected, double tolerance) {
        if (expected.equals("open")) {
            assertThat(actual).as(what).isNull();
        } else {
            assertThat(actual).as(what).isNotNull();
            assertRelative(what, actual, expected, tolerance);
        }
    }

    private static void assertRelative(String what, double actual, String expected, double tolerance) {
        double value = Double.parseDouble(expected);
        assertThat(Math.abs(actual - value)).as("%s: Orthogon %s, script %s", what, actual, expected)
                .isLessThanOrEqualTo(tolerance * Math.max(1e-3, Math.abs(value)));
    }

    private static List<String[]> reference() {
        try (InputStream in = RobustSetsTest.class.getResourceAsStream("/reference/robust/s_sets_values.csv")) {
            List<String> lines = new String(in.readAllBytes(), StandardCharsets.UTF_8).lines().toList();
            return lines.subList(1, lines.size()).stream().map(l -> l.split(",", -1)).toList();
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    static RobustSet set(RobustSets.Analysis analysis, String name, String method, String kind) {
        return analysis.sets().stream().filter(s -> s.parameter().equals(name) && s.method().equals(method)
                && s.kind().equals(kind)).findFirst().orElseThrow();
    }

    private static void assertInterval(RobustSet set, double lower, double upper, double tolerance) {
        assertThat(set.intervals()).as(set.parameter() + " " + set.method() + " " + set.kind()).hasSize(1);
        assertThat(set.intervals().get(0).lower()).isCloseTo(lower, within(tolerance));
        assertThat(set.intervals().get(0).upper()).isCloseTo(upper, within(tolerance));
    }

    /** θ̂ = (C'Ŝ^{-1}C)^{-1}C'Ŝ^{-1}x̄, A = T C'Ŝ^{-1}C, S_min, for {@link ShiftedMeans}. */
    private record Quadratic(double[] center, DMatrixRMaj inverse, double minimum) {
        static Quadratic of(ShiftedMeans model, LongRunOptions options) {
            int t = model.observations();
            int p = model.parameterCount();
            DMatrixRMaj f0 = model.contributions(new double[p]);
            DMatrixRMaj s = LongRunCovariance.estimate(f0, options).covariance();
            DMatrixRMaj sInv = new DMatrixRMaj(s.numRows, s.numRows);
            CommonOps_DDRM.invert(s, sInv);
            DMatrixRMaj c = new DMatrixRMaj(model.c);
            DMatrixRMaj mean = org.orthogon.moments.MomentAlgebra.columnMeans(f0);
            DMatrixRMaj sc = new DMatrixRMaj(s.numRows, p);
            CommonOps_DDRM.mult(sInv, c, sc);
            DMatrixRMaj a = new DMatrixRMaj(p, p);
            CommonOps_DDRM.multTransA(c, sc, a);
            DMatrixRMaj b = new DMatrixRMaj(p, 1);
            CommonOps_DDRM.multTransA(sc, mean, b);
            DMatrixRMaj aInv = new DMatrixRMaj(p, p);
            CommonOps_DDRM.invert(a, aInv);
            DMatrixRMaj center = new DMatrixRMaj(p, 1);
            CommonOps_DDRM.mult(aInv, b, center);
            DMatrixRMaj g = model.meanMoments(center.data);
            DMatrixRMaj sg = new DMatrixRMaj(s.numRows, 1);
            CommonOps_DDRM.mult(sInv, g, sg);
            double minimum = t * CommonOps_DDRM.dot(g, sg);
            CommonOps_DDRM.divide(aInv, t);
            return new Quadratic(center.data.clone(), aInv, minimum);
        }
    }
}
