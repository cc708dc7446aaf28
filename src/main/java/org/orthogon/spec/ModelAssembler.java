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
import org.orthogon.data.Units;
import org.orthogon.moments.LinearFactorErrors;
import org.orthogon.moments.ObservationErrors;
import org.orthogon.moments.PowerUtilityErrors;
import org.orthogon.moments.ScaledMoments;

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

    private ModelAssembler(RunSpec spec) {
        this.spec = spec;
    }

    /** Reads and aligns the data of {@code spec} and builds its moment conditions. */
    public static PreparedRun prepare(RunSpec spec) {
        ModelAssembler assembler = new ModelAssembler(spec);
        return switch (spec.model().family()) {
            case POWER_UTILITY -> assembler.preparePowerUtility();
            case LINEAR_FACTOR -> assembler.prepareLinearFactor();
        };
    }

    private PreparedRun preparePowerUtility() {
        RunSpec.DataSpec data = spec.data();
        String consumptionColumn = spec.model().consumptionColumn().orElseThrow(() -> missingKey("model",
                "consumption_column", "the power-utility family needs consumption growth",
                "add consumption_column = \"cons_growth\" under [model] (gross growth C_t/C_{t-1})"));
        Path macroFile = data.macro().orElseThrow(() -> missingKey("data", "macro",
                "the power-utility family needs a macro file with consumption growth",
                "add macro = \"path/to/consumption.csv\" under [data]"));
        rejectUnused("factor_columns", spec.model().factorColumns());

        ReturnsWithRate returns = readReturnsWithRate();
        SeriesTable gross = ReturnTransforms.toGross(returns.returns(), ReturnKind.fromId(data.returnsKind()),
                returns.riskfreeGross());
        SeriesTable macro = select("consumption_column", readTable("macro", macroFile),
                List.of(consumptionColumn));
        ColumnChecks.requireVarying(macro, "consumption");
        if (gross.frequency().isFinerThan(macro.frequency())) {
            CompoundedSeries compounded = ReturnTransforms.compound(gross, macro.frequency());
            notes.add(gross.frequency().id() + " returns compounded to " + macro.frequency().id()
                    + " to match the consumption series");
            notes.addAll(compounded.notes());
            gross = compounded.table();
        } else if (macro.frequency().isFinerThan(gross.frequency())) {
            throw InputException.in(macroFile).problem("consumption is " + macro.frequency().id()
                    + " but the returns are " + gross.frequency().id(),
                    "give consumption growth at the frequency of the returns (or a finer return series)");
        }
        Aligned aligned = align(gross, List.of(macro));
        double[] growth = aligned.otherColumns(0)[0];
        for (int t = 0; t < growth.length; t++) {
            if (!(growth[t] > 0)) {
                throw InputException.in(macroFile).line(aligned.fileLine(1, t)).column(consumptionColumn)
                        .problem("consumption growth must be gross growth C_t/C_{t-1} > 0, found " + growth[t],
                                "give gross growth (e.g. 1.004), not net growth or log growth");
            }
        }
        ObservationErrors errors = new PowerUtilityErrors(aligned.assetRows(), growth, gross.columnNames());
        double[] start = startValues(PowerUtilityErrors.PARAMETERS, Map.of("beta", 0.99, "gamma", 2.0));
        return finish(errors, aligned, start);
    }

    private PreparedRun prepareLinearFactor() {
        RunSpec.DataSpec data = spec.data();
        List<String> factorColumns = spec.model().factorColumns();
        if (factorColumns.isEmpty()) {
            throw missingKey("model", "factor_columns", "the linear-factor family needs factors",
                    "add factor_columns = [\"MKT\"] under [model], naming columns of the factors file");
        }
        Path factorFile = data.factors().orElseThrow(() -> missingKey("data", "factors",
                "the linear-factor family needs a factors file", "add factors = \"path/to/factors.csv\" under [data]"));
        if (spec.model().consumptionColumn().isPresent()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", "consumption_column"))
                    .problem("consumption_column is not used by the linear-factor family",
                            "remove it, or use family = \"power-utility\"");
        }
        ReturnKind kind = ReturnKind.fromId(data.returnsKind());
        SeriesTable excess;
        if (kind == ReturnKind.EXCESS) {
            excess = readReturns();
        } else {
            ReturnsWithRate returns = readReturnsWithRate();
            if (returns.riskfreeGross() == null) {
                throw missingKey("data", "riskfree", "the linear-factor family prices excess returns, and "
                        + data.returnsKind() + " returns need a risk-free rate to become excess returns",
                        "add riskfree = \"path/to/riskfree.csv\" under [data], or give excess returns with "
                                + "returns_kind = \"excess\"");
            }
            excess = ReturnTransforms.excess(ReturnTransforms.toGross(returns.returns(), kind, null),
                    returns.riskfreeGross());
        }
        Units units = Units.fromId(data.units());
        SeriesTable factors = select("factor_columns", readTable("factors", factorFile), factorColumns);
        ReturnTransforms.checkPlausible(factors, ReturnKind.EXCESS, units);
        ColumnChecks.requireVarying(factors, "factor");
        ColumnChecks.requireIndependent(factors, "factor");
        factors = ReturnTransforms.toDecimal(factors, units);
        Aligned aligned = align(excess, List.of(factors));
        double[][] factorRows = transpose(aligned.otherColumns(0));
        ObservationErrors errors = new LinearFactorErrors(aligned.assetRows(), factorRows, excess.columnNames(),
                factorColumns);
        double[] start = startValues(errors.parameterNames(), Map.of());
        return finish(errors, aligned, start);
    }

    private SeriesTable readReturns() {
        RunSpec.DataSpec data = spec.data();
        SeriesTable returns = readTable("returns", data.returns());
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
        List<String> instrumentColumns = spec.model().instrumentColumns();
        Optional<SeriesTable> instruments = readInstruments(instrumentColumns);
        if (!instrumentColumns.isEmpty() && spec.data().instruments().isEmpty()
                && !instrumentColumns.equals(List.of(CONSTANT_INSTRUMENT))) {
            throw missingKey("data", "instruments", "instrument_columns names columns but no instruments file is given",
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
        int lag = instrumentColumns.isEmpty() ? 0 : 1;
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
        return new Aligned(sample, first, last, lag, instrumentColumns);
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
                    .problem("an instruments file is given but instrument_columns is empty",
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
        SeriesTable selected = select("instrument_columns", table, fromFile);
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
                : ScaledMoments.scaled(errors, aligned.laggedInstruments(), instrumentColumns);
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
        return new PreparedRun(moments, start, sample, notes, inputs, errors.assetNames(), labels);
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
        SeriesTable table = CsvSeries.read(file);
        inputs.add(InputSummary.of(key, table));
        return table;
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

    private void rejectUnused(String key, List<String> values) {
        if (!values.isEmpty()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("model", key))
                    .problem(key + " is not used by the " + spec.model().family().id() + " family",
                            "remove it, or choose the family that uses it");
        }
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
    private record Aligned(AlignedSample sample, int first, int last, int lag, List<String> instrumentColumns) {
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

        /** z_{t-1} for each moment row t, [t][instrument], in the order of instrument_columns. */
        double[][] laggedInstruments() {
            SeriesTable file = sample.tables().size() > 1 && hasInstrumentFile()
                    ? sample.tables().get(sample.tables().size() - 1) : null;
            double[][] rows = new double[observations()][instrumentColumns.size()];
            for (int j = 0; j < instrumentColumns.size(); j++) {
                String name = instrumentColumns.get(j);
                double[] column = name.equals(CONSTANT_INSTRUMENT) ? null : file.column(name);
                for (int t = 0; t < rows.length; t++) {
                    rows[t][j] = column == null ? 1.0 : column[first + t - lag];
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
