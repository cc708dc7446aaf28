package org.orthogon.spec;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.orthogon.data.AlignedSample;
import org.orthogon.data.ColumnChecks;
import org.orthogon.data.Alignment;
import org.orthogon.data.CompoundedSeries;
import org.orthogon.data.CsvSeries;
import org.orthogon.data.Frequency;
import org.orthogon.data.InputException;
import org.orthogon.data.Suggestions;
import org.orthogon.data.Period;
import org.orthogon.data.ReturnKind;
import org.orthogon.data.ReturnTransforms;
import org.orthogon.data.SeriesTable;
import org.orthogon.data.SectionedTables;
import org.orthogon.data.SeriesTransforms;
import org.orthogon.data.TableWithNotes;
import org.orthogon.data.TwoColumnSeries;
import org.orthogon.data.Units;
import org.orthogon.moments.DemeanedFactorErrors;
import org.orthogon.moments.ExpressionSdfErrors;
import org.orthogon.moments.GrossFactorErrors;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.RecursiveUtilityErrors;
import org.orthogon.moments.ScaledFactors;
import org.orthogon.moments.ObservationErrors;
import org.orthogon.moments.PowerUtilityErrors;
import org.orthogon.moments.ScaledMoments;
import org.orthogon.twopass.FactorSample;

/**
 * Turns a {@link RunSpec} into moment conditions on an aligned sample: reads the files, checks units
 * and kinds, forms gross or excess returns, compounds monthly returns when the macro series is
 * quarterly, aligns every series on common dates, applies the sample bounds and lags the instruments
 * by one period. Every refusal is an {@link InputException} naming the file, line and fix.
 */
public final class ModelAssembler {
    /** The built-in instrument column of ones. */
    public static final String CONSTANT_INSTRUMENT = "const";

    private final RunSpec spec;
    /** What the preparation did that a reader should know, in the order it happened. */
    private final List<String> notes = new ArrayList<>();
    /** Every data file read, for `check` and the run's provenance. */
    private final List<InputSummary> inputs = new ArrayList<>();
    /** Linear-factor models: excess returns and factors on the moment rows, for the two-pass regressions. */
    private FactorSample factorSample;

    private ModelAssembler(RunSpec spec) {
        this.spec = spec;
    }

    /** Reads and aligns the data of {@code spec} and builds its moment conditions. */
    public static PreparedRun prepare(RunSpec spec) {
        ModelAssembler assembler = new ModelAssembler(spec);
        assembler.rejectKeysOfOtherFamilies();
        return switch (spec.model().family()) {
            case POWER_UTILITY -> assembler.preparePowerUtility();
            case RECURSIVE_UTILITY -> assembler.prepareRecursiveUtility();
            case LINEAR_FACTOR -> assembler.prepareLinearFactor();
            case EXPRESSION -> assembler.prepareExpression();
        };
    }

    /** The [model] keys each family reads; any other [model] key present is a mistake worth naming. */
    private static final Map<RunSpec.Family, List<String>> MODEL_KEYS_OF = Map.of(
            RunSpec.Family.POWER_UTILITY, List.of("family", "consumption_column", "consumption_level_column",
                    "population_column", "price_column", "instrument_columns", "start_values", "bounds"),
            RunSpec.Family.RECURSIVE_UTILITY, List.of("family", "consumption_column", "consumption_level_column",
                    "population_column", "price_column", "wealth_column", "instrument_columns", "start_values", "bounds"),
            RunSpec.Family.LINEAR_FACTOR, List.of("family", "factor_columns", "form", "factor_instruments",
                    "instrument_columns", "start_values", "bounds"),
            RunSpec.Family.EXPRESSION, List.of("family", "sdf", "parameters", "payoff", "instrument_columns",
                    "start_values", "bounds"));

    private void rejectKeysOfOtherFamilies() {
        RunSpec.Family family = spec.model().family();
        List<String> allowed = MODEL_KEYS_OF.get(family);
        for (String key : spec.keyLines().keySet()) {
            if (key.startsWith("model.") && !allowed.contains(key.substring(6))) {
                String name = key.substring(6);
                throw InputException.in(spec.modelFile()).line(spec.lineOf("model", name))
                        .problem(name + " is not used by the " + family.id() + " family",
                                "remove it, or choose the family that uses it (" + familiesUsing(name) + ")");
            }
        }
        if (spec.data().wealth().isPresent() && family != RunSpec.Family.RECURSIVE_UTILITY) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "wealth"))
                    .problem("wealth is not used by the " + family.id() + " family",
                            "remove it, or use family = \"recursive-utility\"");
        }
    }

    private static String familiesUsing(String key) {
        return MODEL_KEYS_OF.entrySet().stream().filter(e -> e.getValue().contains(key))
                .map(e -> e.getKey().id()).sorted().collect(java.util.stream.Collectors.joining(", "));
    }

    private PreparedRun preparePowerUtility() {
        String consumptionColumn = consumptionColumn();
        SeriesTable macro = readConsumption(consumptionColumn);
        SeriesTable gross = grossAtFrequencyOf(macro);
        Aligned aligned = align(gross, List.of(macro));
        double[] growth = positiveGrowth(aligned, consumptionColumn);
        ObservationErrors errors = new PowerUtilityErrors(aligned.assetRows(), growth, gross.columnNames());
        double[] start = startValues(PowerUtilityErrors.PARAMETERS, Map.of("beta", 0.99, "gamma", 2.0));
        return finish(errors, aligned, start);
    }

    private PreparedRun prepareRecursiveUtility() {
        String consumptionColumn = consumptionColumn();
        String wealthColumn = spec.model().wealthColumn().orElseThrow(() -> missingKey("model", "wealth_column",
                "the recursive-utility family needs a wealth-return proxy",
                "add wealth_column = \"wealth_return\" under [model], naming a gross return column of the wealth file"));
        Path wealthFile = spec.data().wealth().orElseThrow(() -> missingKey("data", "wealth",
                "the recursive-utility family needs a file with the wealth-return proxy",
                "add wealth = \"path/to/wealth.csv\" under [data] (gross returns at the consumption frequency)"));
        SeriesTable macro = readConsumption(consumptionColumn);
        SeriesTable gross = grossAtFrequencyOf(macro);
        Units units = Units.fromId(spec.data().units());
        SeriesTable wealth = select("wealth_column", readTable("wealth", wealthFile), List.of(wealthColumn));
        ReturnTransforms.checkPlausible(wealth, ReturnKind.GROSS, units);
        wealth = ReturnTransforms.toDecimal(wealth, units);
        Aligned aligned = align(gross, List.of(macro, wealth));
        double[] growth = positiveGrowth(aligned, consumptionColumn);
        ObservationErrors errors = new RecursiveUtilityErrors(aligned.assetRows(), growth,
                aligned.otherColumns(1)[0], gross.columnNames(), wealthColumn);
        double[] start = startValues(RecursiveUtilityErrors.PARAMETERS, Map.of("beta", 0.99, "gamma", 2.0, "psi", 0.5));
        return finish(errors, aligned, start);
    }

    private PreparedRun prepareLinearFactor() {
        List<String> factorColumns = spec.model().factorColumns();
        if (factorColumns.isEmpty()) {
            throw missingKey("model", "factor_columns", "the linear-factor family needs factors",
                    "add factor_columns = [\"MKT\"] under [model], naming columns of the factors file");
        }
        String form = spec.model().form();
        SeriesTable assets;
        double[] riskfreeGross = null;
        if (form.equals("gross")) {
            ReturnsWithRate returns = readReturnsWithRate();
            if (returns.riskfreeGross() == null) {
                throw missingKey("data", "riskfree", "the gross form m = a - b'F prices the risk-free asset too",
                        "add riskfree = \"path/to/riskfree.csv\" under [data]");
            }
            assets = ReturnTransforms.toGross(returns.returns(), ReturnKind.fromId(spec.data().returnsKind()),
                    returns.riskfreeGross());
            riskfreeGross = returns.riskfreeGross();
            assets = withColumn(assets, "__riskfree", riskfreeGross);
        } else {
            assets = excessReturns("the linear-factor family (form \"" + form + "\") prices excess returns");
        }
        SeriesTable factors = readFactors(factorColumns);
        Aligned aligned = align(assets, List.of(factors));
        double[][] factorRows = transpose(aligned.otherColumns(0));
        List<String> factorNames = factorColumns;
        if (!spec.model().factorInstruments().isEmpty()) {
            ScaledFactors scaled = ScaledFactors.expand(factorRows, factorColumns,
                    aligned.laggedInstruments(spec.model().factorInstruments()), spec.model().factorInstruments());
            factorRows = scaled.values();
            factorNames = scaled.names();
        }
        ObservationErrors errors;
        double[] defaults;
        if (form.equals("gross")) {
            double[][] rows = aligned.assetRows();
            int n = rows[0].length - 1;
            double[][] risky = new double[rows.length][n];
            double[] rate = new double[rows.length];
            for (int t = 0; t < rows.length; t++) {
                System.arraycopy(rows[t], 0, risky[t], 0, n);
                rate[t] = rows[t][n];
            }
            String rateName = spec.data().riskfreeColumn().orElse("riskfree");
            errors = new GrossFactorErrors(risky, rate, factorRows, assets.columnNames().subList(0, n), rateName,
                    factorNames);
            double[][] excess = new double[rows.length][n];
            for (int t = 0; t < rows.length; t++) {
                for (int i = 0; i < n; i++) {
                    excess[t][i] = risky[t][i] - rate[t];
                }
            }
            factorSample = new FactorSample(assets.columnNames().subList(0, n), factorNames, excess, factorRows);
            defaults = new double[errors.parameterNames().size()];
            defaults[0] = 1.0;
        } else if (form.equals("demeaned")) {
            DemeanedFactorErrors demeaned = new DemeanedFactorErrors(aligned.assetRows(), factorRows,
                    assets.columnNames(), factorNames);
            errors = demeaned;
            defaults = new double[errors.parameterNames().size()];
            double[] means = demeaned.sampleFactorMeans();
            System.arraycopy(means, 0, defaults, factorNames.size(), means.length);
        } else {
            errors = new LinearFactorErrors(aligned.assetRows(), factorRows, assets.columnNames(), factorNames);
            defaults = new double[errors.parameterNames().size()];
        }
        if (factorSample == null) {
            factorSample = new FactorSample(assets.columnNames(), factorNames, aligned.assetRows(), factorRows);
        }
        Map<String, Double> defaultMap = new LinkedHashMap<>();
        for (int i = 0; i < defaults.length; i++) {
            defaultMap.put(errors.parameterNames().get(i), defaults[i]);
        }
        return finish(errors, aligned, startValues(errors.parameterNames(), defaultMap));
    }

    private PreparedRun prepareExpression() {
        String formula = spec.model().sdf().orElseThrow(() -> missingKey("model", "sdf",
                "the expression family needs an SDF formula",
                "add sdf = \"beta * cons_growth^(-gamma)\" under [model], over data columns and parameters"));
        List<String> parameters = spec.model().parameters();
        if (parameters.isEmpty()) {
            throw missingKey("model", "parameters", "the expression family needs the list of its parameters",
                    "add parameters = [\"beta\", \"gamma\"] under [model]");
        }
        boolean grossPayoff = spec.model().payoff().equals("gross");
        List<SeriesTable> dataTables = new ArrayList<>();
        if (spec.data().macro().isPresent()) {
            dataTables.add(readTable("macro", spec.data().macro().get()));
        }
        if (spec.data().factors().isPresent()) {
            SeriesTable factors = readTable("factors", spec.data().factors().get());
            Units units = Units.fromId(spec.data().units());
            ReturnTransforms.checkPlausible(factors, ReturnKind.EXCESS, units);
            dataTables.add(ReturnTransforms.toDecimal(factors, units));
        }
        if (dataTables.isEmpty()) {
            throw missingKey("data", "macro", "the expression family needs data columns for its SDF",
                    "add macro = \"...csv\" and/or factors = \"...csv\" under [data]");
        }
        SeriesTable assets = grossPayoff ? grossAtFrequencyOf(dataTables.get(0))
                : excessReturns("payoff = \"excess\" prices excess returns");
        Aligned aligned = align(assets, dataTables);
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
        ObservationErrors errors;
        try {
            errors = new ExpressionSdfErrors(formula, parameters, columns, aligned.assetRows(), assets.columnNames(),
                    grossPayoff ? ExpressionSdfErrors.PayoffKind.GROSS : ExpressionSdfErrors.PayoffKind.EXCESS);
        } catch (ExpressionSdfErrors.ExpressionException e) {
            List<String> known = new ArrayList<>(parameters);
            known.addAll(columns.keySet());
            String hint = e.name() == null ? "" : Suggestions.didYouMean(e.name(), known);
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "sdf"))
                    .problem("the sdf formula cannot be used: " + e.getMessage(),
                            "use only the parameters " + parameters + " and the data columns " + columns.keySet()
                                    + hint);
        }
        return finish(errors, aligned, startValues(parameters, Map.of()));
    }

    /** Name of the growth series the Euler equations use: the given column, or the one built from levels. */
    private String consumptionColumn() {
        RunSpec.ModelSpec model = spec.model();
        if (model.consumptionColumn().isPresent() && model.consumptionLevelColumn().isPresent()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "consumption_level_column"))
                    .problem("both consumption_column (growth) and consumption_level_column (levels) are given",
                            "keep one: growth C_t/C_{t-1} in consumption_column, or levels in consumption_level_column");
        }
        if (model.consumptionLevelColumn().isPresent()) {
            return GROWTH_FROM_LEVELS;
        }
        if (model.populationColumn().isPresent() || model.priceColumn().isPresent()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model",
                    model.populationColumn().isPresent() ? "population_column" : "price_column"))
                    .problem("population_column and price_column apply to consumption levels, but no "
                            + "consumption_level_column is given", "add consumption_level_column = \"...\" under [model]");
        }
        return model.consumptionColumn().orElseThrow(() -> missingKey("model", "consumption_column",
                "the " + spec.model().family().id() + " family needs consumption growth",
                "add consumption_column = \"cons_growth\" under [model] (gross growth C_t/C_{t-1}), or "
                        + "consumption_level_column for levels"));
    }

    /** Name of the growth column built from consumption levels. */
    private static final String GROWTH_FROM_LEVELS = "cons_growth_from_levels";

    private SeriesTable readConsumption(String consumptionColumn) {
        Path macroFile = spec.data().macro().orElseThrow(() -> missingKey("data", "macro",
                "the " + spec.model().family().id() + " family needs a macro file with consumption",
                "add macro = \"path/to/consumption.csv\" under [data]"));
        SeriesTable macro;
        if (consumptionColumn.equals(GROWTH_FROM_LEVELS)) {
            RunSpec.ModelSpec model = spec.model();
            SeriesTable levels = readTable("macro", macroFile);
            List<String> needed = new ArrayList<>(List.of(model.consumptionLevelColumn().get()));
            model.populationColumn().ifPresent(needed::add);
            model.priceColumn().ifPresent(needed::add);
            select("consumption_level_column", levels, needed);
            TableWithNotes growth = SeriesTransforms.perCapitaGrowth(levels, model.consumptionLevelColumn().get(),
                    model.populationColumn().orElse(null), model.priceColumn().orElse(null), GROWTH_FROM_LEVELS);
            notes.add("consumption growth built from the levels in " + macroFile.getFileName()
                    + (model.populationColumn().isPresent() ? ", per capita" : "")
                    + (model.priceColumn().isPresent() ? ", deflated" : ""));
            notes.addAll(growth.notes());
            macro = growth.table();
        } else {
            macro = select("consumption_column", readTable("macro", macroFile), List.of(consumptionColumn));
        }
        ColumnChecks.requireVarying(macro, "consumption");
        return macro;
    }

    /** Consumption growth on the moment rows, refusing a non-positive value at its file line. */
    private double[] positiveGrowth(Aligned aligned, String consumptionColumn) {
        double[] growth = aligned.otherColumns(0)[0];
        for (int t = 0; t < growth.length; t++) {
            if (!(growth[t] > 0)) {
                throw InputException.in(aligned.sample().tables().get(1).source()).line(aligned.fileLine(1, t))
                        .column(consumptionColumn)
                        .problem("consumption growth must be gross growth C_t/C_{t-1} > 0, found " + growth[t],
                                "give gross growth (e.g. 1.004), not net growth or log growth");
            }
        }
        return growth;
    }

    /**
     * The test assets' gross returns at the frequency of {@code other} (the macro series): compounded
     * when the returns are finer, refused when they are coarser.
     */
    private SeriesTable grossAtFrequencyOf(SeriesTable other) {
        ReturnsWithRate returns = readReturnsWithRate();
        SeriesTable gross = ReturnTransforms.toGross(returns.returns(), ReturnKind.fromId(spec.data().returnsKind()),
                returns.riskfreeGross());
        Optional<SeriesTable> deflator = readDeflator();
        if (deflator.isPresent() && deflator.get().frequency() == gross.frequency()) {
            gross = deflate(gross, deflator.get());
            deflator = Optional.empty();
        }
        if (gross.frequency().isFinerThan(other.frequency())) {
            CompoundedSeries compounded = ReturnTransforms.compound(gross, other.frequency());
            notes.add(gross.frequency().id() + " returns compounded to " + other.frequency().id()
                    + " to match " + other.source().getFileName());
            notes.addAll(compounded.notes());
            gross = compounded.table();
        }
        if (deflator.isPresent()) {
            gross = deflate(gross, deflator.get());
        }
        if (gross.frequency() == other.frequency()) {
            return gross;
        }
        if (other.frequency().isFinerThan(gross.frequency())) {
            throw InputException.in(other.source()).problem(other.source().getFileName() + " is "
                    + other.frequency().id() + " but the returns are " + gross.frequency().id(),
                    "give the macro series at the frequency of the returns (or a finer return series)");
        }
        return gross;
    }

    private Optional<SeriesTable> readDeflator() {
        if (spec.data().deflator().isEmpty()) {
            if (spec.data().deflatorColumn().isPresent()) {
                throw missingKey("data", "deflator_column", "deflator_column is given but no deflator file",
                        "add deflator = \"path/to/deflator.csv\" under [data]");
            }
            return Optional.empty();
        }
        SeriesTable table = readTable("deflator", spec.data().deflator().get());
        String column = spec.data().deflatorColumn().orElseGet(() -> {
            if (table.columnNames().size() != 1) {
                throw missingKey("data", "deflator", "the deflator file has " + table.columnNames().size()
                        + " columns and no deflator_column says which is the price level",
                        "add deflator_column = \"" + table.columnNames().get(0) + "\" under [data]");
            }
            return table.columnNames().get(0);
        });
        return Optional.of(select("data", "deflator_column", table, List.of(column)));
    }

    /** Nominal gross returns to real ones with the deflator P: R_real = R P_{t-1} / P_t. */
    private SeriesTable deflate(SeriesTable gross, SeriesTable deflator) {
        if (!deflator.frequency().equals(gross.frequency())) {
            throw InputException.in(deflator.source()).problem("the deflator is " + deflator.frequency().id()
                    + " but the returns are " + gross.frequency().id() + " after compounding",
                    "give the deflator at the frequency of the returns or of the macro series");
        }
        TableWithNotes real = SeriesTransforms.realReturns(gross, deflator, deflator.columnNames().get(0));
        notes.add("returns deflated to real returns with " + deflator.source().getFileName());
        notes.addAll(real.notes());
        return real.table();
    }

    /** The test assets as excess returns: as given, or net/gross minus the risk-free rate. */
    private SeriesTable excessReturns(String why) {
        RunSpec.DataSpec data = spec.data();
        if (data.deflator().isPresent()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "deflator"))
                    .problem(why + "; a deflator applies to gross returns, and an excess return needs none (the "
                            + "price level cancels)", "remove deflator, or price gross returns");
        }
        ReturnKind kind = ReturnKind.fromId(data.returnsKind());
        if (kind == ReturnKind.EXCESS) {
            return readReturns();
        }
        ReturnsWithRate returns = readReturnsWithRate();
        if (returns.riskfreeGross() == null) {
            throw missingKey("data", "riskfree", why + ", and " + data.returnsKind()
                    + " returns need a risk-free rate to become excess returns",
                    "add riskfree = \"path/to/riskfree.csv\" under [data], or give excess returns with "
                            + "returns_kind = \"excess\"");
        }
        return ReturnTransforms.excess(ReturnTransforms.toGross(returns.returns(), kind, null), returns.riskfreeGross());
    }

    private SeriesTable readFactors(List<String> factorColumns) {
        Path factorFile = spec.data().factors().orElseThrow(() -> missingKey("data", "factors",
                "the linear-factor family needs a factors file", "add factors = \"path/to/factors.csv\" under [data]"));
        Units units = Units.fromId(spec.data().units());
        SeriesTable factors = select("factor_columns", readTable("factors", factorFile), factorColumns);
        ReturnTransforms.checkPlausible(factors, ReturnKind.EXCESS, units);
        ColumnChecks.requireVarying(factors, "factor");
        ColumnChecks.requireIndependent(factors, "factor");
        return ReturnTransforms.toDecimal(factors, units);
    }

    /** {@code table} with one more column (used to carry the risk-free rate through alignment). */
    private static SeriesTable withColumn(SeriesTable table, String name, double[] values) {
        List<String> names = new ArrayList<>(table.columnNames());
        names.add(name);
        double[][] columns = java.util.Arrays.copyOf(table.columns(), names.size());
        columns[names.size() - 1] = values.clone();
        return new SeriesTable(table.source(), table.frequency(), table.dates(), names, columns, table.lineNumbers());
    }

    private SeriesTable readReturns() {
        RunSpec.DataSpec data = spec.data();
        SeriesTable returns = readTable("returns", data.returns());
        if (!data.assets().isEmpty()) {
            returns = select("data", "assets", returns, data.assets());
        }
        ReturnKind kind = ReturnKind.fromId(data.returnsKind());
        Units units = Units.fromId(data.units());
        ReturnTransforms.checkPlausible(returns, kind, units);
        ColumnChecks.requireVarying(returns, "test-asset");
        ColumnChecks.requireIndependent(returns, "test-asset");
        return ReturnTransforms.toDecimal(returns, units);
    }

    /**
     * The returns and, when a risk-free file is given, the gross risk-free rate on the dates both
     * share (the rate is a net rate per period in the declared units).
     */
    private ReturnsWithRate readReturnsWithRate() {
        SeriesTable returns = readReturns();
        Optional<SeriesTable> riskfree = readRiskfree();
        if (riskfree.isEmpty()) {
            return new ReturnsWithRate(returns, null);
        }
        AlignedSample pair = Alignment.align(List.of(returns, riskfree.get()), null, null);
        double[] rate = pair.tables().get(1).columns()[0];
        double[] gross = new double[rate.length];
        for (int t = 0; t < rate.length; t++) {
            gross[t] = 1.0 + rate[t];
        }
        return new ReturnsWithRate(pair.tables().get(0), gross);
    }

    private record ReturnsWithRate(SeriesTable returns, double[] riskfreeGross) {
    }

    private Optional<SeriesTable> readRiskfree() {
        RunSpec.DataSpec data = spec.data();
        if (data.riskfree().isEmpty()) {
            return Optional.empty();
        }
        SeriesTable table = readTable("riskfree", data.riskfree().get());
        String column;
        if (data.riskfreeColumn().isPresent()) {
            column = data.riskfreeColumn().get();
        } else if (table.columnNames().size() == 1) {
            column = table.columnNames().get(0);
        } else {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "riskfree"))
                    .problem("the risk-free file has " + table.columnNames().size() + " columns "
                            + table.columnNames() + " and no riskfree_column says which to use",
                            "add riskfree_column = \"" + table.columnNames().get(0) + "\" under [data]");
        }
        Units units = Units.fromId(data.units());
        SeriesTable rate = data.riskfreeColumn().isPresent()
                ? select("data", "riskfree_column", table, List.of(column)) : table.select(List.of(column));
        ReturnTransforms.checkPlausibleRiskfree(rate, ReturnKind.NET, units);
        return Optional.of(ReturnTransforms.toDecimal(rate, units));
    }

    /**
     * Aligns the test-asset returns with the other series and the instruments, applies the sample
     * bounds to the dates of the moments, and lags the instruments: the moment dated t uses z_{t-1},
     * so with instruments the row before the first moment must exist in every file.
     */
    private Aligned align(SeriesTable assets, List<SeriesTable> others) {
        // Instruments scale the moments (instrument_columns) or the factors (factor_instruments); both
        // come from the one instruments file and are lagged by one period.
        List<String> instrumentColumns = new ArrayList<>(spec.model().instrumentColumns());
        for (String name : spec.model().factorInstruments()) {
            if (!instrumentColumns.contains(name)) {
                instrumentColumns.add(name);
            }
        }
        Optional<SeriesTable> instruments = readInstruments(instrumentColumns);
        if (instrumentColumns.stream().anyMatch(c -> !c.equals(CONSTANT_INSTRUMENT)) && spec.data().instruments().isEmpty()) {
            String key = spec.model().instrumentColumns().isEmpty() ? "factor_instruments" : "instrument_columns";
            throw missingKey("data", "instruments", key + " names columns but no instruments file is given",
                    "add instruments = \"path/to/instruments.csv\" under [data], or use only \"const\"");
        }
        List<SeriesTable> tables = new ArrayList<>();
        tables.add(assets);
        tables.addAll(others);
        instruments.ifPresent(tables::add);
        AlignedSample sample = Alignment.align(tables, null, null);
        notes.addAll(sample.notes());
        List<Period> dates = sample.dates();
        Frequency frequency = assets.frequency();
        for (String name : spec.data().instrumentLags().keySet()) {
            if (!instrumentColumns.contains(name) || name.equals(CONSTANT_INSTRUMENT)) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "instrument_lags"))
                        .problem("instrument_lags names \"" + name + "\", which is not an instrument column of this model",
                                "use the instrument columns " + instrumentColumns.stream()
                                        .filter(c -> !c.equals(CONSTANT_INSTRUMENT)).toList()
                                        + Suggestions.didYouMean(name, instrumentColumns));
            }
        }
        int lag = instrumentColumns.isEmpty() ? 0 : 1;
        for (int declared : spec.data().instrumentLags().values()) {
            lag = Math.max(lag, declared);
        }
        int first = lag;
        int last = dates.size() - 1;
        if (spec.data().start().isPresent()) {
            Period start = Period.parseStart(spec.data().start().get(), frequency);
            first = Math.max(first, boundIndex("start", start, dates, lag));
        }
        if (spec.data().end().isPresent()) {
            Period end = Period.parseEnd(spec.data().end().get(), frequency);
            last = boundIndex("end", end, dates, lag);
        }
        if (first > last) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "start"))
                    .problem("the sample start " + dates.get(Math.min(first, dates.size() - 1)).label()
                            + " is after its end " + dates.get(Math.max(last, 0)).label(),
                            "correct start and end under [data]");
        }
        if (lag > 0 && spec.data().start().isEmpty()) {
            notes.add("instruments are lagged " + (lag == 1 ? "one period" : "up to " + lag + " periods")
                    + ", so the moments start at " + dates.get(first).label());
        }
        return new Aligned(sample, first, last, lag, instrumentColumns, spec.data().instrumentLags());
    }

    private int boundIndex(String key, Period bound, List<Period> dates, int lag) {
        Period earliest = dates.get(lag);
        Period latest = dates.get(dates.size() - 1);
        if (bound.compareTo(earliest) < 0 || bound.compareTo(latest) > 0) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", key))
                    .problem(key + " = " + bound.label() + " lies outside the dates all input files share ("
                            + earliest.label() + " to " + latest.label()
                            + (lag > 0 ? ", the first shared date kept back for the lagged instruments" : "") + ")",
                            "choose a " + key + " between " + earliest.label() + " and " + latest.label());
        }
        return dates.indexOf(bound);
    }

    private Optional<SeriesTable> readInstruments(List<String> columns) {
        if (spec.data().instruments().isEmpty()) {
            return Optional.empty();
        }
        if (columns.isEmpty()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "instruments"))
                    .problem("an instruments file is given but neither instrument_columns nor factor_instruments "
                            + "names a column of it",
                            "add instrument_columns = [\"const\", ...] under [model], or remove instruments");
        }
        SeriesTable table = readTable("instruments", spec.data().instruments().get());
        if (table.columnNames().contains(CONSTANT_INSTRUMENT)) {
            throw InputException.in(table.source()).line(1).column(CONSTANT_INSTRUMENT)
                    .problem("the instruments file has a column named \"const\", the name of the built-in column of ones",
                            "rename that column");
        }
        List<String> fromFile = columns.stream().filter(c -> !c.equals(CONSTANT_INSTRUMENT)).toList();
        if (fromFile.isEmpty()) {
            return Optional.of(table.select(List.of(table.columnNames().get(0))));
        }
        SeriesTable selected = select(spec.model().instrumentColumns().isEmpty() ? "factor_instruments"
                : "instrument_columns", table, fromFile);
        if (columns.contains(CONSTANT_INSTRUMENT)) {
            // A constant instrument beside "const" would duplicate it and make S singular.
            ColumnChecks.requireVarying(selected, "instrument");
        }
        ColumnChecks.requireIndependent(selected, "instrument");
        return Optional.of(selected);
    }

    private PreparedRun finish(ObservationErrors errors, Aligned aligned, double[] start) {
        List<String> instrumentColumns = spec.model().instrumentColumns();
        ScaledMoments moments = instrumentColumns.isEmpty() ? ScaledMoments.unscaled(errors)
                : ScaledMoments.scaled(errors, aligned.laggedInstruments(instrumentColumns), instrumentColumns);
        int observations = aligned.observations();
        if (observations <= moments.momentCount()) {
            int line = spec.lineOf("data", spec.data().start().isPresent() ? "start" : "returns");
            throw InputException.in(spec.modelFile()).line(line).problem("the sample has " + observations
                    + " observations but the model has " + moments.momentCount() + " moments; GMM needs more "
                    + "observations than moments to estimate S", "widen the sample (start/end under [data]), "
                    + "or use fewer test assets or instruments");
        }
        List<Period> dates = aligned.sample().dates();
        SampleInfo sample = new SampleInfo(dates.get(aligned.first()).label(), dates.get(aligned.last()).label(),
                observations, dates.get(0).frequency().id());
        List<String> labels = dates.subList(aligned.first(), aligned.last() + 1).stream().map(Period::label).toList();
        return new PreparedRun(moments, start, sample, notes, inputs,
                errors.assetNames().subList(0, errors.pricedAssets()), labels, Optional.ofNullable(factorSample));
    }

    /**
     * Reads a data file named under [data]; a path that does not exist or is a folder is reported at
     * the model-file line that names it, because that line is where the fix goes.
     */
    private SeriesTable readTable(String key, Path file) {
        if (!java.nio.file.Files.exists(file)) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", key))
                    .problem(key + " names a file that does not exist: " + file,
                            "correct the path (it is relative to the model file's folder)");
        }
        if (java.nio.file.Files.isDirectory(file)) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", key))
                    .problem(key + " names a folder, not a file: " + file, "give the path of a CSV file");
        }
        SeriesTable table;
        if (key.equals("returns") && spec.data().returnsTable().isPresent()) {
            TableWithNotes section = SectionedTables.read(file, spec.data().returnsTable().get());
            notes.add("returns read from the table \"" + spec.data().returnsTable().get() + "\" of " + file.getFileName());
            notes.addAll(section.notes());
            table = section.table();
        } else if (isTwoColumnWithMissing(file)) {
            TableWithNotes series = TwoColumnSeries.read(file, null);
            notes.addAll(series.notes());
            table = series.table();
        } else {
            table = CsvSeries.read(file);
        }
        inputs.add(InputSummary.of(key, table));
        return table;
    }

    /**
     * A date,value file that marks missing values with "." or an empty cell, which {@link TwoColumnSeries}
     * accepts at the edges of the sample; any other file is read strictly by {@link CsvSeries}.
     */
    private static boolean isTwoColumnWithMissing(Path file) {
        try (var reader = java.nio.file.Files.newBufferedReader(file, java.nio.charset.StandardCharsets.UTF_8)) {
            // Only the header is read for a wide file; a date,value file is scanned for its missing marks.
            String header = reader.readLine();
            if (header == null || header.split(",", -1).length != 2) {
                return false;
            }
            List<String> rows = reader.lines().map(String::strip).filter(line -> !line.isEmpty()).toList();
            return rows.stream().allMatch(line -> line.split(",", -1).length == 2)
                    && rows.stream().anyMatch(line -> line.endsWith(",.") || line.endsWith(","));
        } catch (java.io.IOException | java.io.UncheckedIOException e) {
            return false; // the strict reader then reports why the file cannot be read
        }
    }

    private SeriesTable select(String modelKey, SeriesTable table, List<String> names) {
        return select("model", modelKey, table, names);
    }

    /** Selects columns, saying which model-file key asked for a missing one. */
    private SeriesTable select(String section, String key, SeriesTable table, List<String> names) {
        try {
            return table.select(names);
        } catch (InputException e) {
            throw e.withContext("(asked for by " + key + " in " + spec.modelFile().getFileName() + ", line "
                    + spec.lineOf(section, key) + ")");
        }
    }

    private double[] startValues(List<String> parameters, Map<String, Double> defaults) {
        Map<String, Double> given = spec.model().startValues();
        for (String name : given.keySet()) {
            if (!parameters.contains(name)) {
                throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "start_values"))
                        .problem("start_values names \"" + name + "\", which is not a parameter of this model",
                                "use the parameter names " + parameters
                                        + Suggestions.didYouMean(name, parameters));
            }
        }
        double[] start = new double[parameters.size()];
        for (int i = 0; i < start.length; i++) {
            start[i] = given.getOrDefault(parameters.get(i), defaults.getOrDefault(parameters.get(i), 0.0));
        }
        return start;
    }

    private InputException missingKey(String section, String key, String problem, String fix) {
        int line = spec.lineOf(section, key);
        return InputException.in(spec.modelFile()).line(line).problem(problem, fix);
    }

    private static double[][] transpose(double[][] columns) {
        int rows = columns[0].length;
        double[][] out = new double[rows][columns.length];
        for (int j = 0; j < columns.length; j++) {
            for (int t = 0; t < rows; t++) {
                out[t][j] = columns[j][t];
            }
        }
        return out;
    }

    /**
     * The aligned tables (assets first, then the other series, then the instruments if any) and the
     * row range [first, last] of the moments; instruments are read one row earlier.
     */
    private record Aligned(AlignedSample sample, int first, int last, int lag, List<String> instrumentColumns,
            Map<String, Integer> instrumentLags) {
        int observations() {
            return last - first + 1;
        }

        /** Test-asset values, [t][asset], over the moment rows. */
        double[][] assetRows() {
            return transpose(cut(sample.tables().get(0).columns(), first));
        }

        /** Columns [j][t] of the {@code index}-th other series over the moment rows. */
        double[][] otherColumns(int index) {
            return cut(sample.tables().get(1 + index).columns(), first);
        }

        /** The file line of moment row t in the {@code table}-th aligned table. */
        int fileLine(int table, int t) {
            return sample.tables().get(table).lineOf(first + t);
        }

        /** z_{t-1} for each moment row t, [t][instrument], in the order of {@code names}. */
        double[][] laggedInstruments(List<String> names) {
            SeriesTable file = sample.tables().size() > 1 && hasInstrumentFile()
                    ? sample.tables().get(sample.tables().size() - 1) : null;
            double[][] rows = new double[observations()][names.size()];
            for (int j = 0; j < names.size(); j++) {
                String name = names.get(j);
                double[] column = name.equals(CONSTANT_INSTRUMENT) ? null : file.column(name);
                for (int t = 0; t < rows.length; t++) {
                    rows[t][j] = column == null ? 1.0 : column[first + t - instrumentLags.getOrDefault(name, 1)];
                }
            }
            return rows;
        }

        private boolean hasInstrumentFile() {
            return instrumentColumns.stream().anyMatch(name -> !name.equals(CONSTANT_INSTRUMENT));
        }

        private double[][] cut(double[][] columns, int from) {
            double[][] out = new double[columns.length][observations()];
            for (int j = 0; j < columns.length; j++) {
                System.arraycopy(columns[j], from, out[j], 0, observations());
            }
            return out;
        }
    }
}
