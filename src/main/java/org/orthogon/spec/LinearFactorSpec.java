package org.orthogon.spec;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.orthogon.data.ReturnTransforms;
import org.orthogon.data.SeriesTable;
import org.orthogon.moments.DemeanedFactorErrors;
import org.orthogon.moments.GrossFactorErrors;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.ObservationErrors;
import org.orthogon.moments.Payoff;
import org.orthogon.moments.ScaledFactors;
import org.orthogon.twopass.FactorSample;

/**
 * {@code family = "linear-factor"}: a linear SDF in the factors (Cochrane 2005, "Asset Pricing",
 * revised edition, chapter 13), in one of three forms, optionally with factors scaled by lagged
 * instruments (a conditional model, section 8.3 there).
 *
 * <p>The assembled model also carries the excess returns and factors on the moment rows
 * ({@link FamilyModel#factorSample()}), which `two-pass` and the risk premia of `fit` use.
 *
 * @param factorColumns     the factors, columns of the [data] factors file
 * @param form              excess, demeaned or gross (see {@link Form})
 * @param factorInstruments instruments that scale the factors, F_t ⊗ z_{t-1}
 * @param common            instruments, start values and bounds
 */
public record LinearFactorSpec(List<String> factorColumns, Form form, List<String> factorInstruments,
        ModelCommon common) implements ModelSpec {
    public static final Family FAMILY = new Family("linear-factor", "m = 1 - b'F (or its demeaned and gross forms)",
            List.of("factor_columns", "form", "factor_instruments"), List.of(), LinearFactorSpec::read);

    public LinearFactorSpec {
        factorColumns = List.copyOf(factorColumns);
        factorInstruments = List.copyOf(factorInstruments);
    }

    /** The three forms of the linear SDF. */
    public enum Form {
        /** m = 1 - b'F on excess returns; parameters b_&lt;factor&gt;. */
        EXCESS,
        /** m = 1 - b'(F - μ) on excess returns with the factor means estimated jointly; b then mu. */
        DEMEANED,
        /** m = a - b'F on gross returns, the risk-free asset priced too; a then b. */
        GROSS;

        /** The model-file word. */
        public String id() {
            return name().toLowerCase(Locale.ROOT);
        }

        static List<String> ids() {
            return Arrays.stream(values()).map(Form::id).toList();
        }

        static Form fromId(String id) {
            return valueOf(id.toUpperCase(Locale.ROOT));
        }
    }

    private static LinearFactorSpec read(ModelSection model, ModelCommon common) {
        List<String> factors = model.stringList("factor_columns");
        if (factors.isEmpty()) {
            throw model.error("factor_columns", "the linear-factor family needs factors",
                    "add factor_columns = [\"MKT\"] under [model], naming columns of the factors file");
        }
        Form form = Form.fromId(model.choice("form", Form.ids(), "excess"));
        return new LinearFactorSpec(factors, form, model.stringList("factor_instruments"), common);
    }

    @Override
    public Family family() {
        return FAMILY;
    }

    @Override
    public Payoff payoff() {
        return form == Form.GROSS ? Payoff.GROSS : Payoff.EXCESS;
    }

    @Override
    public List<String> instrumentsNeeded() {
        List<String> needed = new ArrayList<>(common.instrumentColumns());
        factorInstruments.stream().filter(name -> !needed.contains(name)).forEach(needed::add);
        return needed;
    }

    @Override
    public String instrumentsKey() {
        return common.instrumentColumns().isEmpty() ? "factor_instruments" : "instrument_columns";
    }

    @Override
    public FamilyModel assemble(DataLoader data) {
        SeriesTable assets;
        if (form == Form.GROSS) {
            DataLoader.ReturnsWithRate returns = data.returnsWithRate();
            if (returns.riskfreeGross() == null) {
                throw data.missingKey("data", "riskfree", "the gross form m = a - b'F prices the risk-free asset too",
                        "add riskfree = \"path/to/riskfree.csv\" under [data]");
            }
            assets = ReturnTransforms.toGross(returns.returns(), data.spec().data().returnsKind(),
                    returns.riskfreeGross());
            assets = DataLoader.withColumn(assets, "__riskfree", returns.riskfreeGross());
        } else {
            assets = data.excessReturns("the linear-factor family (form \"" + form.id() + "\") prices excess returns");
        }
        SeriesTable factors = data.factors(factorColumns);
        DataLoader.Aligned aligned = data.align(assets, List.of(factors));
        double[][] factorRows = DataLoader.transpose(aligned.otherColumns(0));
        List<String> factorNames = factorColumns;
        if (!factorInstruments.isEmpty()) {
            ScaledFactors scaled = ScaledFactors.expand(factorRows, factorColumns,
                    aligned.laggedInstruments(factorInstruments), factorInstruments);
            factorRows = scaled.values();
            factorNames = scaled.names();
        }
        ObservationErrors errors;
        Map<String, Double> defaults = new LinkedHashMap<>();
        FactorSample sample = null;
        switch (form) {
            case GROSS -> {
                double[][] rows = aligned.assetRows();
                int n = rows[0].length - 1;
                double[][] risky = new double[rows.length][n];
                double[] rate = new double[rows.length];
                for (int t = 0; t < rows.length; t++) {
                    System.arraycopy(rows[t], 0, risky[t], 0, n);
                    rate[t] = rows[t][n];
                }
                String rateName = data.spec().data().riskfreeColumn().orElse("riskfree");
                errors = new GrossFactorErrors(risky, rate, factorRows, assets.columnNames().subList(0, n), rateName,
                        factorNames);
                defaults.put("a", 1.0);
                double[][] excess = new double[rows.length][n];
                for (int t = 0; t < rows.length; t++) {
                    for (int i = 0; i < n; i++) {
                        excess[t][i] = risky[t][i] - rate[t];
                    }
                }
                sample = new FactorSample(assets.columnNames().subList(0, n), factorNames, excess, factorRows);
            }
            case DEMEANED -> {
                DemeanedFactorErrors demeaned = new DemeanedFactorErrors(aligned.assetRows(), factorRows,
                        assets.columnNames(), factorNames);
                double[] means = demeaned.sampleFactorMeans();
                for (int k = 0; k < means.length; k++) {
                    defaults.put("mu_" + factorNames.get(k), means[k]);
                }
                errors = demeaned;
            }
            case EXCESS -> errors = new LinearFactorErrors(aligned.assetRows(), factorRows, assets.columnNames(),
                    factorNames);
            default -> throw new AssertionError(form);
        }
        if (sample == null) {
            sample = new FactorSample(assets.columnNames(), factorNames, aligned.assetRows(), factorRows);
        }
        return new FamilyModel(errors, aligned, defaults, Optional.of(sample));
    }
}
