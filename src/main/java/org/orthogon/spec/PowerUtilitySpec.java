package org.orthogon.spec;

import java.util.List;
import java.util.Map;
import org.orthogon.data.SeriesTable;
import org.orthogon.moments.Payoff;
import org.orthogon.moments.PowerUtilityErrors;
import org.orthogon.gmm.IdentificationDiagnostics;

/**
 * {@code family = "power-utility"}: the Euler equations of power (CRRA) utility,
 * m_t = β (C_t/C_{t-1})^{-γ}, on the test assets' gross returns at the frequency of consumption
 * (Hansen and Singleton 1982).
 *
 * @param consumption where consumption growth comes from
 * @param common      instruments, start values and bounds
 */
public record PowerUtilitySpec(Consumption consumption, ModelCommon common) implements ModelSpec {
    public static final Family FAMILY = new Family("power-utility", "m = beta g^-gamma on gross returns",
            Consumption.KEYS, List.of(), PowerUtilitySpec::read);

    private static PowerUtilitySpec read(ModelSection model, ModelCommon common) {
        return new PowerUtilitySpec(Consumption.read(model, FAMILY.id()), common);
    }

    @Override
    public Family family() {
        return FAMILY;
    }

    @Override
    public Payoff payoff() {
        return Payoff.GROSS;
    }

    @Override
    public Map<String, double[]> defaultBounds() {
        return Consumption.discountFactorBounds();
    }

    @Override
    public List<IdentificationDiagnostics.Range> economicRanges() {
        return List.of(IdentificationDiagnostics.DISCOUNT_FACTOR, IdentificationDiagnostics.RISK_AVERSION);
    }

    /** One-period Euler equations: their errors are martingale differences under the model. */
    @Override
    public boolean martingaleDifferenceErrors() {
        return true;
    }

    @Override
    public FamilyModel assemble(DataLoader data) {
        SeriesTable macro = data.consumption(consumption);
        SeriesTable gross = data.grossAtFrequencyOf(macro);
        DataLoader.Aligned aligned = data.align(gross, List.of(macro));
        double[] growth = data.positiveGrowth(aligned, consumption.growthName());
        return new FamilyModel(new PowerUtilityErrors(aligned.assetRows(), growth, gross.columnNames()), aligned,
                Map.of("beta", 0.99, "gamma", 2.0));
    }
}
