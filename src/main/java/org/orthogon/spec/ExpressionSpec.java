package org.orthogon.spec;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.orthogon.data.InputException;
import org.orthogon.data.ReturnKind;
import org.orthogon.data.ReturnTransforms;
import org.orthogon.data.SeriesTable;
import org.orthogon.data.Suggestions;
import org.orthogon.moments.ExpressionSdfErrors;
import org.orthogon.moments.Payoff;

/**
 * {@code family = "expression"}: an SDF the user writes as a formula over data columns (of the macro
 * and factors files) and parameters, priced on gross or excess returns.
 *
 * @param sdf        the formula, e.g. "beta * cons_growth^(-gamma)"
 * @param parameters the parameters, in order
 * @param payoff     what the formula's SDF prices
 * @param common     instruments, start values and bounds
 */
public record ExpressionSpec(String sdf, List<String> parameters, Payoff payoff, ModelCommon common)
        implements ModelSpec {
    public static final Family FAMILY = new Family("expression", "an SDF formula over data columns and parameters",
            List.of("sdf", "parameters", "payoff"), List.of(), ExpressionSpec::read);

    public ExpressionSpec {
        parameters = List.copyOf(parameters);
    }

    private static ExpressionSpec read(ModelSection model, ModelCommon common) {
        String formula = model.requiredString("sdf", "the expression family needs an SDF formula",
                "add sdf = \"beta * cons_growth^(-gamma)\" under [model], over data columns and parameters");
        List<String> parameters = model.stringList("parameters");
        if (parameters.isEmpty()) {
            throw model.error("parameters", "the expression family needs the list of its parameters",
                    "add parameters = [\"beta\", \"gamma\"] under [model]");
        }
        Payoff payoff = Payoff.fromId(model.choice("payoff", Arrays.stream(Payoff.values()).map(Payoff::id).toList(),
                "gross")).orElseThrow();
        return new ExpressionSpec(formula, parameters, payoff, common);
    }

    @Override
    public Family family() {
        return FAMILY;
    }

    /** A parameter named beta is read as a time discount factor and kept above zero, as in the consumption families. */
    @Override
    public Map<String, double[]> defaultBounds() {
        return parameters.contains("beta") ? Consumption.discountFactorBounds() : Map.of();
    }

    @Override
    public FamilyModel assemble(DataLoader data) {
        RunSpec.DataSpec files = data.spec().data();
        List<SeriesTable> dataTables = new ArrayList<>();
        if (files.macro().isPresent()) {
            dataTables.add(data.table("macro", files.macro().get()));
        }
        if (files.factors().isPresent()) {
            SeriesTable factors = data.table("factors", files.factors().get());
            ReturnTransforms.checkPlausible(factors, ReturnKind.EXCESS, files.units());
            dataTables.add(ReturnTransforms.toDecimal(factors, files.units()));
        }
        if (dataTables.isEmpty()) {
            throw data.missingKey("data", "macro", "the expression family needs data columns for its SDF",
                    "add macro = \"...csv\" and/or factors = \"...csv\" under [data]");
        }
        SeriesTable assets = payoff == Payoff.GROSS ? data.grossAtFrequencyOf(dataTables.get(0))
                : data.excessReturns("payoff = \"excess\" prices excess returns");
        DataLoader.Aligned aligned = data.align(assets, dataTables);
        Map<String, double[]> columns = new LinkedHashMap<>();
        for (int i = 0; i < dataTables.size(); i++) {
            double[][] values = aligned.otherColumns(i);
            List<String> names = dataTables.get(i).columnNames();
            for (int j = 0; j < names.size(); j++) {
                if (columns.put(names.get(j), values[j]) != null) {
                    throw InputException.in(dataTables.get(i).source()).line(1).column(names.get(j))
                            .problem("the column \"" + names.get(j) + "\" appears in both the macro and the factors "
                                    + "file, so the SDF formula would be ambiguous", "rename one of the two columns");
                }
            }
        }
        try {
            return new FamilyModel(new ExpressionSdfErrors(sdf, parameters, columns, aligned.assetRows(),
                    assets.columnNames(), payoff), aligned, Map.of());
        } catch (ExpressionSdfErrors.ExpressionException e) {
            List<String> known = new ArrayList<>(parameters);
            known.addAll(columns.keySet());
            String hint = e.name() == null ? "" : Suggestions.didYouMean(e.name(), known);
            throw InputException.in(data.spec().modelFile()).line(data.spec().lineOf("model", "sdf"))
                    .problem("the sdf formula cannot be used: " + e.getMessage(),
                            "use only the parameters " + parameters + " and the data columns " + columns.keySet()
                                    + hint);
        }
    }
}
