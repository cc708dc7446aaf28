package org.orthogon.spec;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.orthogon.data.ReturnKind;
import org.orthogon.data.ReturnTransforms;
import org.orthogon.data.SeriesTable;
import org.orthogon.moments.Payoff;
import org.orthogon.moments.RecursiveUtilityErrors;
import org.orthogon.gmm.IdentificationDiagnostics;

/**
 * {@code family = "recursive-utility"}: the Euler equations of Epstein-Zin utility priced with a
 * wealth-return proxy, m_t = β^θ g_t^{-θ/ψ} R_{w,t}^{θ-1}, on gross returns and on the proxy itself
 * (Epstein and Zin 1991).
 *
 * @param consumption  where consumption growth comes from
 * @param wealthColumn the gross wealth-return column of the [data] wealth file
 * @param common       instruments, start values and bounds
 */
public record RecursiveUtilitySpec(Consumption consumption, String wealthColumn, ModelCommon common)
        implements ModelSpec {
    public static final Family FAMILY = new Family("recursive-utility",
            "m = beta^theta g^(-theta/psi) R_w^(theta-1) on gross returns and the wealth proxy",
            concat(Consumption.KEYS, List.of("wealth_column")), List.of("wealth"), RecursiveUtilitySpec::read);

    private static RecursiveUtilitySpec read(ModelSection model, ModelCommon common) {
        Consumption consumption = Consumption.read(model, FAMILY.id());
        String wealth = model.requiredString("wealth_column", "the recursive-utility family needs a wealth-return proxy",
                "add wealth_column = \"wealth_return\" under [model], naming a gross return column of the wealth file");
        return new RecursiveUtilitySpec(consumption, wealth, common);
    }

    private static List<String> concat(List<String> first, List<String> second) {
        return java.util.stream.Stream.concat(first.stream(), second.stream()).toList();
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
        return List.of(IdentificationDiagnostics.DISCOUNT_FACTOR, IdentificationDiagnostics.RISK_AVERSION, IdentificationDiagnostics.ELASTICITY_OF_SUBSTITUTION);
    }

    /** One-period Euler equations: their errors are martingale differences under the model. */
    @Override
    public boolean martingaleDifferenceErrors() {
        return true;
    }

    @Override
    public FamilyModel assemble(DataLoader data) {
        Path wealthFile = data.spec().data().wealth().orElseThrow(() -> data.missingKey("data", "wealth",
                "the recursive-utility family needs a file with the wealth-return proxy",
                "add wealth = \"path/to/wealth.csv\" under [data] (gross returns at the consumption frequency)"));
        SeriesTable macro = data.consumption(consumption);
        SeriesTable gross = data.grossAtFrequencyOf(macro);
        SeriesTable wealth = data.select("model", "wealth_column", data.table("wealth", wealthFile),
                List.of(wealthColumn));
        ReturnTransforms.checkPlausible(wealth, ReturnKind.GROSS, data.spec().data().units());
        wealth = ReturnTransforms.toDecimal(wealth, data.spec().data().units());
        DataLoader.Aligned aligned = data.align(gross, List.of(macro, wealth));
        double[] growth = data.positiveGrowth(aligned, consumption.growthName());
        return new FamilyModel(new RecursiveUtilityErrors(aligned.assetRows(), growth, aligned.otherColumns(1)[0],
                gross.columnNames(), wealthColumn), aligned, Map.of("beta", 0.99, "gamma", 2.0, "psi", 0.5));
    }
}
