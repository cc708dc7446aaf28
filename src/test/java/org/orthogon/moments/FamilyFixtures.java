package org.orthogon.moments;

import java.util.Random;

/** Seeded random inputs shaped like monthly or quarterly asset-pricing data, for the family tests. */
final class FamilyFixtures {
    final double[][] gross;
    final double[][] excess;
    final double[][] factors;
    final double[] growth;
    final double[] wealth;
    final double[] riskfree;

    FamilyFixtures(long seed, int t, int n, int k) {
        Random random = new Random(seed);
        gross = new double[t][n];
        excess = new double[t][n];
        factors = new double[t][k];
        growth = new double[t];
        wealth = new double[t];
        riskfree = new double[t];
        for (int s = 0; s < t; s++) {
            growth[s] = Math.exp(0.005 + 0.02 * random.nextGaussian());
            wealth[s] = 1.015 + 0.06 * random.nextGaussian();
            riskfree[s] = 1.002;
            for (int j = 0; j < k; j++) {
                factors[s][j] = 0.005 + 0.04 * random.nextGaussian();
            }
            for (int i = 0; i < n; i++) {
                excess[s][i] = 0.004 + 0.05 * random.nextGaussian();
                gross[s][i] = riskfree[s] + excess[s][i];
            }
        }
    }

    /** Largest absolute difference between two arrays of arrays, for exact-identity checks. */
    static double maxDifference(double[][] a, double[][] b) {
        double worst = 0;
        for (int p = 0; p < a.length; p++) {
            worst = Math.max(worst, maxDifference(a[p], b[p]));
        }
        return worst;
    }

    static double maxDifference(double[] a, double[] b) {
        if (a.length != b.length) {
            throw new AssertionError("lengths " + a.length + " and " + b.length);
        }
        double worst = 0;
        for (int j = 0; j < a.length; j++) {
            worst = Math.max(worst, Math.abs(a[j] - b[j]));
        }
        return worst;
    }

    static double[] errors(ObservationErrors family, double[] theta) {
        double[] out = new double[family.observations() * family.assetNames().size()];
        family.errors(theta, out);
        return out;
    }

    static double[][] derivatives(ObservationErrors family, double[] theta) {
        double[][] out = new double[theta.length][family.observations() * family.assetNames().size()];
        family.errorDerivatives(theta, out);
        return out;
    }
}
