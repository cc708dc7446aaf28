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

/**
 * Reads a run's data for the families: reads the files named under [data], checks units and kinds,
 * forms gross or excess returns, compounds monthly returns when the macro series is quarterly,
 * deflates, aligns every series on common dates, applies the sample bounds and lags the instruments.
 * It knows no family: each family's {@link ModelSpec#assemble} asks it for the series it prices.
 * Every refusal is an {@link InputException} naming the file, line and fix. One loader serves one
 * preparation; it records what it did ({@link #notes()}) and what it read ({@link #inputs()}).
 */
public final class DataLoader {
    /** The built-in instrument column of ones. */
    public static final String CONSTANT_INSTRUMENT = "const";

    private final RunSpec spec;
    /** What the preparation did that a reader should know, in the order it happened. */
    private final List<String> notes = new ArrayList<>();
    /** Every data file read, for `check` and the run's provenance. */
    private final List<InputSummary> inputs = new ArrayList<>();

    DataLoader(RunSpec spec) {
        this.spec = spec;
    }

    /** The run being prepared. */
    public RunSpec spec() {
        return spec;
    }

    /** What the preparation did that a reader should know, in the order it happened. */
    List<String> notes() {
        return List.copyOf(notes);
    }

    /** Every data file read. */
    List<InputSummary> inputs() {
        return List.copyOf(inputs);
    }

    /**
     * The macro file's consumption growth, one column named {@link Consumption#growthName()}: the
     * growth column as given, or growth built from levels (per capita, deflated), refusing a constant one.
     */
    public SeriesTable consumption(Consumption consumption) {
        Path macroFile = spec.data().macro().orElseThrow(() -> missingKey("data", "macro",
                "the " + spec.model().family().id() + " family needs a macro file with consumption",
                "add macro = \"path/to/consumption.csv\" under [data]"));
        SeriesTable macro;
        if (consumption.fromLevels()) {
            SeriesTable levels = readTable("macro", macroFile);
            String level = consumption.levelColumn().get();
            List<String> needed = new ArrayList<>(List.of(level));
            consumption.population().ifPresent(needed::add);
            consumption.priceLevel().ifPresent(needed::add);
            select("model", "consumption_level_column", levels, needed);
            TableWithNotes growth = SeriesTransforms.perCapitaGrowth(levels, level,
                    consumption.population().orElse(null), consumption.priceLevel().orElse(null),
                    consumption.growthName());
            notes.add("consumption growth built from the levels in " + macroFile.getFileName()
                    + (consumption.population().isPresent() ? ", per capita" : "")
                    + (consumption.priceLevel().isPresent() ? ", deflated" : ""));
            notes.addAll(growth.notes());
            macro = growth.table();
        } else {
            macro = select("model", "consumption_column", readTable("macro", macroFile),
                    List.of(consumption.growthName()));
        }
        ColumnChecks.requireVarying(macro, "consumption");
        return macro;
    }

    /** Consumption growth on the moment rows, refusing a non-positive value at its file line. */
    public double[] positiveGrowth(Aligned aligned, String consumptionColumn) {
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
    public SeriesTable grossAtFrequencyOf(SeriesTable other) {
        ReturnsWithRate returns = returnsWithRate();
        SeriesTable gross = ReturnTransforms.toGross(returns.returns(), spec.data().returnsKind(),
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
    public SeriesTable excessReturns(String why) {
        RunSpec.DataSpec data = spec.data();
        if (data.deflator().isPresent()) {
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "deflator"))
                    .problem(why + "; a deflator applies to gross returns, and an excess return needs none (the "
                            + "price level cancels)", "remove deflator, or price gross returns");
        }
        ReturnKind kind = data.returnsKind();
        if (kind == ReturnKind.EXCESS) {
            return readReturns();
        }
        ReturnsWithRate returns = returnsWithRate();
        if (returns.riskfreeGross() == null) {
            throw missingKey("data", "riskfree", why + ", and " + data.returnsKind().id()
                    + " returns need a risk-free rate to become excess returns",
                    "add riskfree = \"path/to/riskfree.csv\" under [data], or give excess returns with "
                            + "returns_kind = \"excess\"");
        }
        return ReturnTransforms.excess(ReturnTransforms.toGross(returns.returns(), kind, null), returns.riskfreeGross());
    }

    /** The factors file's columns {@code factorColumns}, checked (excess returns, varying, independent), in decimals. */
    public SeriesTable factors(List<String> factorColumns) {
        Path factorFile = spec.data().factors().orElseThrow(() -> missingKey("data", "factors",
                "the " + spec.model().family().id() + " family needs a factors file",
                "add factors = \"path/to/factors.csv\" under [data]"));
        Units units = spec.data().units();
        SeriesTable factors = select("model", "factor_columns", readTable("factors", factorFile), factorColumns);
        ReturnTransforms.checkPlausible(factors, ReturnKind.EXCESS, units);
        ColumnChecks.requireVarying(factors, "factor");
        ColumnChecks.requireIndependent(factors, "factor");
        return ReturnTransforms.toDecimal(factors, units);
    }

    /** {@code table} with one more column (used to carry the risk-free rate through alignment). */
    public static SeriesTable withColumn(SeriesTable table, String name, double[] values) {
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
        ReturnKind kind = data.returnsKind();
        Units units = data.units();
        ReturnTransforms.checkPlausible(returns, kind, units);
        ColumnChecks.requireVarying(returns, "test-asset");
        ColumnChecks.requireIndependent(returns, "test-asset");
        return ReturnTransforms.toDecimal(returns, units);
    }

    /**
     * The returns and, when a risk-free file is given, the gross risk-free rate on the dates both
     * share (the rate is a net rate per period in the declared units).
     */
    public ReturnsWithRate returnsWithRate() {
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

    /**
     * The returns and the gross risk-free rate on the dates both share.
     *
     * @param riskfreeGross 1 + the net rate per period, or null when no risk-free file is given
     */
    public record ReturnsWithRate(SeriesTable returns, double[] riskfreeGross) {
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
            Optional<String> likely = likelyRiskfreeColumn(table);
            throw InputException.in(spec.modelFile()).line(spec.lineOf("data", "riskfree"))
                    .problem("the risk-free file has " + table.columnNames().size() + " columns "
                            + table.columnNames() + " and no riskfree_column says which to use",
                            likely.map(name -> "add riskfree_column = \"" + name + "\" under [data] (the column that "
                                    + "looks like a risk-free rate), or name another of " + table.columnNames())
                                    .orElse("add riskfree_column = \"...\" under [data], naming the column of "
                                            + table.columnNames() + " that holds the risk-free rate"));
        }
        Units units = data.units();
        SeriesTable rate = data.riskfreeColumn().isPresent()
                ? select("data", "riskfree_column", table, List.of(column)) : table.select(List.of(column));
        ReturnTransforms.checkPlausibleRiskfree(rate, ReturnKind.NET, units);
        return Optional.of(ReturnTransforms.toDecimal(rate, units));
    }

    /** Whether a column name says "risk-free rate": RF, rf_rate, riskfree, risk-free, T-bill, tbill3m, ... */
    private static boolean namedLikeRiskfree(String name) {
        String letters = name.toLowerCase(java.util.Locale.ROOT).replaceAll("[^a-z]", "");
        return letters.equals("rf") || letters.startsWith("rfrate") || letters.equals("rfr")
                || letters.contains("riskfree") || letters.contains("tbill");
    }

    /**
     * The column of a multi-column file most likely to hold the risk-free rate, so the fix never
     * proposes, say, the market return: one whose name says so, else the only column that never falls
     * below zero and moves least (a T-bill rate is positive and smooth); empty when nothing fits.
     */
    static Optional<String> likelyRiskfreeColumn(SeriesTable table) {
        List<String> named = table.columnNames().stream().filter(DataLoader::namedLikeRiskfree).toList();
        if (named.size() == 1) {
            return Optional.of(named.get(0));
        }
        String best = null;
        double smallest = Double.POSITIVE_INFINITY;
        double runnerUp = Double.POSITIVE_INFINITY;
        for (int j = 0; j < table.columnNames().size(); j++) {
            double[] values = table.columns()[j];
            double mean = java.util.Arrays.stream(values).average().orElse(Double.NaN);
            double spread = Math.sqrt(java.util.Arrays.stream(values).map(v -> (v - mean) * (v - mean)).average()
                    .orElse(Double.NaN));
            boolean positive = java.util.Arrays.stream(values).allMatch(v -> v >= 0);
            if (!positive || !(spread < Double.POSITIVE_INFINITY)) {
                continue;
            }
            if (spread < smallest) {
                runnerUp = smallest;
                smallest = spread;
                best = table.columnNames().get(j);
            } else {
                runnerUp = Math.min(runnerUp, spread);
            }
        }
        // Only a clear winner is proposed: a rate that moves far less than every other candidate.
        return best != null && smallest * 3 < runnerUp ? Optional.of(best) : Optional.empty();
    }

    /**
     * Aligns the test-asset returns with the other series and the instruments, applies the sample
     * bounds to the dates of the moments, and lags the instruments: the moment dated t uses z_{t-1},
     * so with instruments the row before the first moment must exist in every file.
     */
    public Aligned align(SeriesTable assets, List<SeriesTable> others) {
        // Instruments scale the moments (instrument_columns) or the factors (factor_instruments); both
        // come from the one instruments file and are lagged by one period.
        List<String> instrumentColumns = spec.model().instrumentsNeeded();
        Optional<SeriesTable> instruments = readInstruments(instrumentColumns);
        if (instrumentColumns.stream().anyMatch(c -> !c.equals(CONSTANT_INSTRUMENT)) && spec.data().instruments().isEmpty()) {
            String key = spec.model().instrumentsKey();
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
        SeriesTable selected = select("model", spec.model().instrumentsKey(), table, fromFile);
        if (columns.contains(CONSTANT_INSTRUMENT)) {
            // A constant instrument beside "const" would duplicate it and make S singular.
            ColumnChecks.requireVarying(selected, "instrument");
        }
        ColumnChecks.requireIndependent(selected, "instrument");
        return Optional.of(selected);
    }

    /**
     * Reads a data file named under [data]; a path that does not exist or is a folder is reported at
     * the model-file line that names it, because that line is where the fix goes.
     */
    /**
     * Reads the data file named by the [data] key {@code key}.
     */
    public SeriesTable table(String key, Path file) {
        return readTable(key, file);
    }

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

    /** Selects columns, saying which model-file key asked for a missing one. */
    public SeriesTable select(String section, String key, SeriesTable table, List<String> names) {
        try {
            return table.select(names);
        } catch (InputException e) {
            throw e.withContext("(asked for by " + key + " in " + spec.modelFile().getFileName() + ", line "
                    + spec.lineOf(section, key) + ")");
        }
    }

    /** A refusal about a key the family needs, at its line or its section's header. */
    public InputException missingKey(String section, String key, String problem, String fix) {
        int line = spec.lineOf(section, key);
        return InputException.in(spec.modelFile()).line(line).problem(problem, fix);
    }

    /** Columns [j][t] as rows [t][j]. */
    public static double[][] transpose(double[][] columns) {
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
    public record Aligned(AlignedSample sample, int first, int last, int lag, List<String> instrumentColumns,
            Map<String, Integer> instrumentLags) {
        public int observations() {
            return last - first + 1;
        }

        /** Test-asset values, [t][asset], over the moment rows. */
        public double[][] assetRows() {
            return transpose(cut(sample.tables().get(0).columns(), first));
        }

        /** Columns [j][t] of the {@code index}-th other series over the moment rows. */
        public double[][] otherColumns(int index) {
            return cut(sample.tables().get(1 + index).columns(), first);
        }

        /** The file line of moment row t in the {@code table}-th aligned table. */
        int fileLine(int table, int t) {
            return sample.tables().get(table).lineOf(first + t);
        }

        /** z_{t-1} for each moment row t, [t][instrument], in the order of {@code names}. */
        public double[][] laggedInstruments(List<String> names) {
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
