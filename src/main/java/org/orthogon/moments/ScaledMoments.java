package org.orthogon.moments;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import org.ejml.data.DMatrixRMaj;

/**
 * GMM moments built from a family's pricing errors, optionally scaled by instruments:
 * f_t(θ) = e_t(θ) ⊗ z_{t-1}, where z_{t-1} is known when the payoff dated t is priced
 * (Hansen and Singleton 1982, "Generalized instrumental variables estimation of nonlinear rational
 * expectations models", Econometrica 50). Without instruments f_t(θ) = e_t(θ).
 *
 * <p>The caller aligns the instruments: row t of {@code laggedInstruments} must already hold z_{t-1}.
 * Moment (i, j) sits in column i*L + j, named "asset*instrument".
 */
public final class ScaledMoments implements MomentModel {
    private final ObservationErrors errors;
    private final double[][] instruments; // [t][j], already lagged; null when unscaled
    private final List<String> momentNames;
    private final List<String> instrumentNames;
    private final int assets;
    private final int instrumentCount;

    private ScaledMoments(ObservationErrors errors, double[][] laggedInstruments, List<String> instrumentNames) {
        this.errors = Objects.requireNonNull(errors);
        this.assets = errors.assetNames().size();
        this.instrumentNames = instrumentNames;
        if (laggedInstruments == null) {
            this.instruments = null;
            this.instrumentCount = 1;
            this.momentNames = List.copyOf(errors.assetNames());
        } else {
            if (laggedInstruments.length != errors.observations()) {
                throw new IllegalArgumentException("instruments have " + laggedInstruments.length
                        + " rows but the pricing errors have " + errors.observations());
            }
            if (instrumentNames.isEmpty()) {
                throw new IllegalArgumentException("an empty instrument list would remove every moment");
            }
            this.instrumentCount = instrumentNames.size();
            this.instruments = new double[laggedInstruments.length][];
            for (int t = 0; t < laggedInstruments.length; t++) {
                if (laggedInstruments[t].length != instrumentCount) {
                    throw new IllegalArgumentException("instrument row " + t + " has " + laggedInstruments[t].length
                            + " values, expected " + instrumentCount);
                }
                this.instruments[t] = laggedInstruments[t].clone();
            }
            List<String> names = new ArrayList<>(assets * instrumentCount);
            for (String asset : errors.assetNames()) {
                for (String instrument : instrumentNames) {
                    names.add(asset + "*" + instrument);
                }
            }
            this.momentNames = List.copyOf(names);
        }
    }

    /** Unscaled moments f_t(θ) = e_t(θ). */
    public static ScaledMoments unscaled(ObservationErrors errors) {
        return new ScaledMoments(errors, null, List.of());
    }

    /** Moments f_t(θ) = e_t(θ) ⊗ z_{t-1}; row t of {@code laggedInstruments} holds z_{t-1}. */
    public static ScaledMoments scaled(ObservationErrors errors, double[][] laggedInstruments,
            List<String> instrumentNames) {
        return new ScaledMoments(errors, Objects.requireNonNull(laggedInstruments), List.copyOf(instrumentNames));
    }

    /**
     * The same moments on observations [from, to) only, for subsample and rolling-window fits: the
     * family's data and the instruments are sliced to those rows, so the cost is proportional to the
     * window, not to the full sample.
     *
     * @throws IllegalArgumentException unless 0 ≤ from &lt; to ≤ T
     */
    @Override
    public ScaledMoments rows(int from, int to) {
        if (from < 0 || to > observations() || to - from < 1) {
            throw new IllegalArgumentException("window [" + from + ", " + to + ") is not inside the "
                    + observations() + " observations");
        }
        int[] rows = new int[to - from];
        for (int r = 0; r < rows.length; r++) {
            rows[r] = from + r;
        }
        return select(rows);
    }

    /**
     * The same moments on the observations {@code rows}, in the given order, repeats allowed (a
     * block-bootstrap resample): row r of the result is row rows[r] of this model, the instruments
     * selected alongside, so a row chosen twice contributes twice to every sample mean.
     *
     * @throws IllegalArgumentException if a row is outside 0..T-1 or no row is given
     */
    @Override
    public ScaledMoments select(int[] rows) {
        ObservationErrors selected = errors.select(rows);
        if (instruments == null) {
            return new ScaledMoments(selected, null, instrumentNames);
        }
        double[][] z = new double[rows.length][];
        for (int r = 0; r < rows.length; r++) {
            z[r] = instruments[rows[r]];
        }
        return new ScaledMoments(selected, z, instrumentNames);
    }

    @Override
    public List<String> parameterNames() {
        return errors.parameterNames();
    }

    @Override
    public List<String> momentNames() {
        return momentNames;
    }

    @Override
    public int observations() {
        return errors.observations();
    }

    @Override
    public boolean isLinear() {
        return errors.isLinear();
    }

    @Override
    public DMatrixRMaj contributions(double[] theta) {
        checkLength(theta);
        int rows = observations();
        double[] raw = new double[rows * assets];
        errors.errors(theta, raw);
        return scaledRows(raw);
    }

    @Override
    public void contributions(double[] theta, DMatrixRMaj out) {
        checkLength(theta);
        int rows = observations();
        if (instruments == null) {
            out.reshape(rows, assets);
            errors.errors(theta, out.data);
            return;
        }
        double[] raw = new double[rows * assets];
        errors.errors(theta, raw);
        out.reshape(rows, assets * instrumentCount);
        kronecker(raw, out.data);
    }

    /**
     * ∂f_t/∂θ' row by row from the family's ∂e_t/∂θ_p (analytic for the built-in families, central
     * differences for formula SDFs), times the lagged instruments when the moments are scaled.
     */
    @Override
    public DMatrixRMaj rowJacobians(double[] theta) {
        checkLength(theta);
        int rows = observations();
        int params = parameterNames().size();
        int moments = assets * instrumentCount;
        double[][] derivatives = new double[params][rows * assets];
        errors.errorDerivatives(theta, derivatives);
        DMatrixRMaj out = new DMatrixRMaj(rows, moments * params);
        double[] scaled = instruments == null ? null : new double[rows * moments];
        for (int p = 0; p < params; p++) {
            double[] column = derivatives[p];
            if (scaled != null) {
                kronecker(derivatives[p], scaled);
                column = scaled;
            }
            for (int t = 0; t < rows; t++) {
                int in = t * moments;
                int at = t * moments * params + p;
                for (int k = 0; k < moments; k++) {
                    out.data[at + k * params] = column[in + k];
                }
            }
        }
        return out;
    }

    /** The T x N values as the T x K moment matrix: themselves, or times the lagged instruments. */
    private DMatrixRMaj scaledRows(double[] raw) {
        int rows = observations();
        if (instruments == null) {
            return DMatrixRMaj.wrap(rows, assets, raw);
        }
        DMatrixRMaj scaled = new DMatrixRMaj(rows, assets * instrumentCount);
        kronecker(raw, scaled.data);
        return scaled;
    }

    @Override
    public double[] discountFactors(double[] theta) {
        checkLength(theta);
        double[] sdf = new double[observations()];
        errors.discountFactor(theta, sdf);
        return sdf;
    }

    @Override
    public java.util.Optional<MomentModel> distanceMoments() {
        return errors.distanceErrors().map(priced -> priced == errors ? this : instruments == null
                ? unscaled(priced) : scaled(priced, instruments, instrumentNames));
    }

    @Override
    public double meanDiscountFactor(double[] theta) {
        double[] sdf = discountFactors(theta);
        double sum = 0.0;
        for (double value : sdf) {
            sum += value;
        }
        return sum / sdf.length;
    }

    @Override
    public int pricingMomentCount() {
        return errors.pricedAssets() * instrumentCount;
    }

    @Override
    public DMatrixRMaj payoffs() {
        int rows = observations();
        double[] raw = new double[rows * assets];
        errors.payoffs(raw);
        return scaledRows(raw);
    }

    @Override
    public DMatrixRMaj meanJacobian(double[] theta) {
        checkLength(theta);
        int rows = observations();
        int params = parameterNames().size();
        double[][] derivatives = new double[params][rows * assets];
        errors.errorDerivatives(theta, derivatives);
        int moments = assets * instrumentCount;
        DMatrixRMaj jacobian = new DMatrixRMaj(moments, params);
        double[] scaled = new double[rows * moments];
        for (int p = 0; p < params; p++) {
            double[] column;
            if (instruments == null) {
                column = derivatives[p];
            } else {
                kronecker(derivatives[p], scaled);
                column = scaled;
            }
            for (int t = 0; t < rows; t++) {
                int offset = t * moments;
                for (int k = 0; k < moments; k++) {
                    jacobian.data[k * params + p] += column[offset + k];
                }
            }
            for (int k = 0; k < moments; k++) {
                jacobian.data[k * params + p] /= rows;
            }
        }
        return jacobian;
    }

    private void kronecker(double[] raw, double[] out) {
        int rows = observations();
        int moments = assets * instrumentCount;
        for (int t = 0; t < rows; t++) {
            double[] z = instruments[t];
            int in = t * assets;
            int outOffset = t * moments;
            for (int i = 0; i < assets; i++) {
                double e = raw[in + i];
                for (int j = 0; j < instrumentCount; j++) {
                    out[outOffset + i * instrumentCount + j] = e * z[j];
                }
            }
        }
    }

    private void checkLength(double[] theta) {
        if (theta.length != parameterNames().size()) {
            throw new IllegalArgumentException("θ has " + theta.length + " values, the model has parameters "
                    + parameterNames());
        }
    }
}
