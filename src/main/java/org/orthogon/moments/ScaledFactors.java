package org.orthogon.moments;

import java.util.ArrayList;
import java.util.List;

/**
 * Scaled factors for a conditional linear SDF. If the SDF's coefficients move with instruments known a
 * period earlier, m_{t} = 1 - (b_0 + B z_{t-1})'F_t, then m is an unconditional linear SDF in the
 * expanded factor set F_t ⊗ z_{t-1} (Cochrane 2005, "Asset Pricing", revised edition, section 8.3;
 * Cochrane 1996, Journal of Political Economy 104; cited from memory). Putting a constant among the
 * instruments keeps the unscaled factors themselves.
 *
 * @param values T x (K·L) rows F_t ⊗ z_{t-1}: column k·L + j holds F_{t,k} z_{t-1,j}
 * @param names  "factor*instrument", e.g. "MKT*z_growth", in the same order
 */
public record ScaledFactors(double[][] values, List<String> names) {

    /** Takes private copies. */
    public ScaledFactors {
        values = MomentAlgebra.copyRows(values, names.size(), "scaled factor");
        names = List.copyOf(names);
    }

    /** A copy of the expanded factor matrix. */
    @Override
    public double[][] values() {
        return MomentAlgebra.copyRows(values, names.size(), "scaled factor");
    }

    /**
     * Builds F_t ⊗ z_{t-1}. The caller aligns the instruments as for {@link ScaledMoments}: row t of
     * {@code laggedInstruments} already holds z_{t-1}.
     *
     * @param factors           T x K factors
     * @param factorNames       K names
     * @param laggedInstruments T x L instruments, row t holding z_{t-1}
     * @param instrumentNames   L names ("const" for a column of ones, if the caller wants one)
     */
    public static ScaledFactors expand(double[][] factors, List<String> factorNames, double[][] laggedInstruments,
            List<String> instrumentNames) {
        MomentAlgebra.requireRows(factors.length, laggedInstruments.length, "factors", "instruments");
        if (factorNames.isEmpty() || instrumentNames.isEmpty()) {
            throw new IllegalArgumentException("scaled factors need at least one factor and one instrument, got "
                    + factorNames + " and " + instrumentNames);
        }
        double[][] f = MomentAlgebra.copyRows(factors, factorNames.size(), "factor");
        double[][] z = MomentAlgebra.copyRows(laggedInstruments, instrumentNames.size(), "instrument");
        int k = factorNames.size();
        int l = instrumentNames.size();
        double[][] out = new double[f.length][k * l];
        for (int t = 0; t < f.length; t++) {
            for (int a = 0; a < k; a++) {
                for (int j = 0; j < l; j++) {
                    out[t][a * l + j] = f[t][a] * z[t][j];
                }
            }
        }
        List<String> names = new ArrayList<>(k * l);
        for (String factor : factorNames) {
            for (String instrument : instrumentNames) {
                names.add(factor + "*" + instrument);
            }
        }
        return new ScaledFactors(out, names);
    }
}
