package org.orthogon.bootstrap;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import org.apache.commons.math3.random.MersenneTwister;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.junit.jupiter.api.Test;

/**
 * The corrections of Hall and Horowitz (1996, section 3) on cases whose answer follows from the
 * first-order algebra alone: when the bootstrap world's true long-run covariance Σ̃ equals what the
 * kernel estimator estimates there (S̃) nothing changes; when Σ̃ = c S̃ every t statistic is divided by √c
 * and the J and joint statistics by c.
 */
class HallHorowitzTest {
    private static final int K = 6;
    private static final int P = 2;

    private static DMatrixRMaj random(int rows, int cols, long seed) {
        MersenneTwister r = new MersenneTwister(seed);
        DMatrixRMaj m = new DMatrixRMaj(rows, cols);
        for (int i = 0; i < m.data.length; i++) {
            m.data[i] = r.nextGaussian();
        }
        return m;
    }

    private static DMatrixRMaj positiveDefinite(long seed) {
        DMatrixRMaj a = random(K, K, seed);
        DMatrixRMaj s = new DMatrixRMaj(K, K);
        CommonOps_DDRM.multTransB(a, a, s);
        for (int i = 0; i < K; i++) {
            s.add(i, i, 0.5);
        }
        return s;
    }

    /** A mean g* whose W^{1/2} g* is orthogonal to W^{1/2} D, as at an efficient estimate. */
    private static DMatrixRMaj residualMean(DMatrixRMaj d, DMatrixRMaj weight) {
        DMatrixRMaj g = random(K, 1, 77L);
        DMatrixRMaj wd = new DMatrixRMaj(K, P);
        CommonOps_DDRM.mult(weight, d, wd);
        DMatrixRMaj dwd = new DMatrixRMaj(P, P);
        CommonOps_DDRM.multTransA(d, wd, dwd);
        CommonOps_DDRM.invert(dwd);
        DMatrixRMaj dwg = new DMatrixRMaj(P, 1);
        CommonOps_DDRM.multTransA(wd, g, dwg);
        DMatrixRMaj coefficient = new DMatrixRMaj(P, 1);
        CommonOps_DDRM.mult(dwd, dwg, coefficient);
        DMatrixRMaj fitted = new DMatrixRMaj(K, 1);
        CommonOps_DDRM.mult(d, coefficient, fitted);
        CommonOps_DDRM.subtractEquals(g, fitted);
        return g;
    }

    @Test
    void equalCovariancesNeedNoCorrection() {
        DMatrixRMaj d = random(K, P, 1L);
        DMatrixRMaj s = positiveDefinite(2L);
        HallHorowitz correction = HallHorowitz.of(d, null, s, s);
        assertThat(correction.tScale()).containsOnly(new double[] {1.0, 1.0}, within(1e-10));
        DMatrixRMaj identity = CommonOps_DDRM.identity(K);
        assertThat(correction.jMap().data).containsExactly(identity.data, within(1e-9));
        assertThat(correction.jointMap().data).containsExactly(identity.data, within(1e-9));
    }

    @Test
    void aLargerTrueCovarianceShrinksEveryStatistic() {
        double c = 2.5;
        DMatrixRMaj d = random(K, P, 3L);
        DMatrixRMaj s = positiveDefinite(4L);
        DMatrixRMaj sigma = s.copy();
        CommonOps_DDRM.scale(c, sigma);
        HallHorowitz efficient = HallHorowitz.of(d, null, sigma, s);
        assertThat(efficient.tScale()).containsOnly(new double[] {1.0 / Math.sqrt(c)}, within(1e-10));
        DMatrixRMaj weight = HallHorowitz.symmetricPower(s, K, -1.0);
        DMatrixRMaj g = residualMean(d, weight);
        int t = 100;
        double j = t * quadratic(g, weight);
        assertThat(efficient.overidentification(g, weight, t)).isCloseTo(j / c, within(1e-9 * j));
        // the joint test with V the pricing-error covariance (1/T) A S A' of the same weight
        DMatrixRMaj a = CommonOps_DDRM.identity(K);
        DMatrixRMaj wd = new DMatrixRMaj(K, P);
        CommonOps_DDRM.mult(weight, d, wd);
        DMatrixRMaj h = new DMatrixRMaj(P, P);
        CommonOps_DDRM.multTransA(d, wd, h);
        CommonOps_DDRM.invert(h);
        DMatrixRMaj m = new DMatrixRMaj(P, K);
        CommonOps_DDRM.multTransB(h, wd, m);
        DMatrixRMaj dm = new DMatrixRMaj(K, K);
        CommonOps_DDRM.mult(d, m, dm);
        CommonOps_DDRM.subtractEquals(a, dm);
        DMatrixRMaj as = new DMatrixRMaj(K, K);
        CommonOps_DDRM.mult(a, s, as);
        DMatrixRMaj v = new DMatrixRMaj(K, K);
        CommonOps_DDRM.multTransB(as, a, v);
        CommonOps_DDRM.divide(v, t);
        double joint = efficient.jointPricing(g, v, t);
        // uncorrected: T g' (A S A')^+ g, which equals J for the efficient weight (Cochrane 2005, section 11.5)
        double uncorrected = HallHorowitz.of(d, null, s, s).jointPricing(g, v, t);
        assertThat(uncorrected).isCloseTo(j, within(1e-8 * j));
        assertThat(joint).isCloseTo(j / c, within(1e-8 * j));
        // one-step with a fixed weight: the sandwich scales the same way
        HallHorowitz fixed = HallHorowitz.of(d, CommonOps_DDRM.identity(K), sigma, s);
        assertThat(fixed.tScale()).containsOnly(new double[] {1.0 / Math.sqrt(c)}, within(1e-10));
    }

    private static double quadratic(DMatrixRMaj g, DMatrixRMaj w) {
        DMatrixRMaj wg = new DMatrixRMaj(K, 1);
        CommonOps_DDRM.mult(w, g, wg);
        return CommonOps_DDRM.dot(g, wg);
    }
}
