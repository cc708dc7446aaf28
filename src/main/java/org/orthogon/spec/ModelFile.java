package org.orthogon.spec;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.stream.Collectors;
import org.orthogon.data.InputException;
import org.orthogon.data.ReturnKind;
import org.orthogon.data.Suggestions;
import org.orthogon.data.Units;
import org.orthogon.gmm.EstimationMethod;
import org.orthogon.gmm.InitialWeight;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.longrun.Kernel;
import org.orthogon.longrun.LongRunOptions;
import org.orthogon.spec.RunSpec.DataSpec;
import org.orthogon.spec.RunSpec.EstimationSpec;
import tools.jackson.core.JacksonException;
import tools.jackson.core.TokenStreamLocation;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.JsonNodeFactory;

/**
 * Reads a model file (TOML; every key is described in docs/model-file.md) into a {@link RunSpec}. Every refusal is an
 * {@link InputException} naming the model file, the line of the offending key and the fix; unknown
 * keys are errors with a "did you mean" suggestion, never silently ignored.
 */
public final class ModelFile {
    private static final Set<String> TOP_LEVEL = Set.of("title", "data", "model", "estimation", "stability");
    private static final List<String> DATA_KEYS = List.of("returns", "assets", "returns_kind", "units", "riskfree",
            "riskfree_column", "factors", "macro", "instruments", "wealth", "start", "end", "returns_table", "deflator",
            "deflator_column", "instrument_lags");
    /** The [model] keys: those every family reads, then each family's own, in registration order. */
    private static final List<String> MODEL_KEYS = modelKeys();
    private static final List<String> ESTIMATION_KEYS = List.of("method", "initial_weight", "kernel", "bandwidth",
            "lags", "prewhiten", "centered", "restrictions", "confidence_level", "max_iterations", "hj_seed", "hj_draws",
            "small_sample_correction");
    private static final List<String> STABILITY_KEYS = List.of("splits", "trimming", "window", "step", "expanding");
    private static final List<String> INITIAL_WEIGHTS = List.of("identity", "second-moment");
    private static final List<String> RETURN_KINDS = Arrays.stream(ReturnKind.values()).map(ReturnKind::id).toList();
    private static final List<String> UNITS = Arrays.stream(Units.values()).map(Units::id).toList();

    private static List<String> modelKeys() {
        List<String> keys = new ArrayList<>(ModelCommon.KEYS);
        for (Family family : ModelSpec.FAMILIES) {
            family.keys().stream().filter(key -> !keys.contains(key)).forEach(keys::add);
        }
        return List.copyOf(keys);
    }

    private final Path file;
    private final List<String> lines;
    private final JsonNode root;

    private ModelFile(Path file, List<String> lines, JsonNode root) {
        this.file = file;
        this.lines = lines;
        this.root = root;
    }

    /** Reads and validates {@code file}. */
    public static RunSpec read(Path file) {
        String text = readUtf8(file);
        JsonNode root;
        try {
            root = TomlTree.read(text);
        } catch (JacksonException e) {
            TokenStreamLocation location = e.getLocation();
            int line = location == null ? 0 : Math.max(location.getLineNr(), 0);
            throw InputException.in(file).line(line)
                    .problem("this is not valid TOML: " + e.getOriginalMessage(),
                            "fix the syntax (key = value, strings in double quotes, [section] headers)");
        }
        if (root == null || !root.isObject()) {
            throw InputException.in(file).problem("the model file is empty",
                    "write at least a [data] section with returns and a [model] section with family");
        }
        return new ModelFile(file, text.lines().toList(), root).parse();
    }

    private static String readUtf8(Path file) {
        byte[] bytes;
        try {
            if (Files.isDirectory(file)) {
                throw InputException.in(file).problem("this is a folder, not a model file",
                        "give the path of a .toml model file");
            }
            bytes = Files.readAllBytes(file);
        } catch (NoSuchFileException e) {
            throw InputException.in(file).problem("the model file does not exist",
                    "check the path; ready model files are in models/");
        } catch (AccessDeniedException e) {
            throw InputException.in(file).problem("the model file cannot be read (permission denied)",
                    "make the file readable");
        } catch (IOException e) {
            throw InputException.in(file).problem("the model file cannot be read: " + e.getMessage(),
                    "check the path and permissions");
        }
        try {
            String text = StandardCharsets.UTF_8.newDecoder()
                    .onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT)
                    .decode(ByteBuffer.wrap(bytes)).toString();
            return text.startsWith("\uFEFF") ? text.substring(1) : text;
        } catch (CharacterCodingException e) {
            throw InputException.in(file).line(firstBadUtf8Line(bytes))
                    .problem("the model file is not UTF-8 text", "save the file as UTF-8");
        }
    }

    private static int firstBadUtf8Line(byte[] bytes) {
        int line = 1;
        int start = 0;
        for (int i = 0; i <= bytes.length; i++) {
            if (i == bytes.length || bytes[i] == '\n') {
                try {
                    StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                            .decode(ByteBuffer.wrap(bytes, start, i - start));
                } catch (CharacterCodingException e) {
                    return line;
                }
                line++;
                start = i + 1;
            }
        }
        return 0;
    }

    private RunSpec parse() {
        rejectUnknown(null, root, new ArrayList<>(TOP_LEVEL));
        JsonNode data = requiredSection("data", "returns = \"...csv\"");
        JsonNode model = requiredSection("model", "family = \"power-utility\"");
        JsonNode estimation = root.has("estimation") ? section("estimation") : null;
        rejectUnknown("data", data, DATA_KEYS);
        rejectUnknown("model", model, MODEL_KEYS);
        if (estimation != null) {
            rejectUnknown("estimation", estimation, ESTIMATION_KEYS);
        }
        JsonNode stability = root.has("stability") ? section("stability") : null;
        if (stability != null) {
            rejectUnknown("stability", stability, STABILITY_KEYS);
        }
        String title = root.has("title") ? string(null, root, "title") : fileStem();
        DataSpec dataSpec = parseData(data);
        ModelSpec modelSpec = parseModel(model);
        EstimationSpec estimationSpec = parseEstimation(estimation, modelSpec);
        StabilitySpec stabilitySpec = stability == null ? StabilitySpec.defaults() : parseStability(stability);
        Map<String, Integer> keyLines = new LinkedHashMap<>();
        for (Map.Entry<String, List<String>> section : Map.of("data", DATA_KEYS, "model", MODEL_KEYS,
                "estimation", ESTIMATION_KEYS, "stability", STABILITY_KEYS).entrySet()) {
            int header = lineOf(section.getKey(), null);
            if (header > 0 && root.has(section.getKey())) {
                keyLines.put(section.getKey(), header);
            }
            for (String key : section.getValue()) {
                int line = lineOf(section.getKey(), key);
                if (line > 0 && root.path(section.getKey()).has(key)) {
                    keyLines.put(section.getKey() + "." + key, line);
                }
            }
        }
        return new RunSpec(file, title, dataSpec, modelSpec, estimationSpec, stabilitySpec, keyLines);
    }

    private DataSpec parseData(JsonNode data) {
        if (!data.has("returns")) {
            throw error("data", null, "[data] has no returns file",
                    "add returns = \"path/to/returns.csv\" (a wide CSV: a date column, then one column per test asset)");
        }
        return new DataSpec(
                path("data", data, "returns"),
                stringList("data", data, "assets"),
                ReturnKind.fromId(choice("data", data, "returns_kind", RETURN_KINDS, "gross")),
                Units.fromId(choice("data", data, "units", UNITS, "decimal")),
                optionalPath(data, "riskfree"),
                optionalString("data", data, "riskfree_column"),
                optionalPath(data, "factors"),
                optionalPath(data, "macro"),
                optionalPath(data, "instruments"),
                optionalPath(data, "wealth"),
                optionalString("data", data, "start"),
                optionalString("data", data, "end"),
                optionalString("data", data, "returns_table"),
                optionalPath(data, "deflator"),
                optionalString("data", data, "deflator_column"),
                instrumentLags(data));
    }

    private ModelSpec parseModel(JsonNode model) {
        List<String> ids = ModelSpec.FAMILIES.stream().map(Family::id).toList();
        if (!model.has("family")) {
            throw error("model", null, "[model] has no family",
                    "add family = " + ids.stream().map(id -> "\"" + id + "\"").collect(Collectors.joining(", ")));
        }
        String familyId = string("model", model, "family");
        Family family = ModelSpec.family(familyId);
        if (family == null) {
            throw error("model", "family", "unknown family \"" + familyId + "\"",
                    "use one of " + String.join(", ", ids) + Suggestions.didYouMean(familyId, ids));
        }
        rejectKeysOfOtherFamilies(family, model);
        Map<String, Double> startValues = new LinkedHashMap<>();
        if (model.has("start_values")) {
            JsonNode values = model.get("start_values");
            if (!values.isObject()) {
                throw error("model", "start_values", "start_values must be a table of numbers",
                        "write start_values = { beta = 0.99, gamma = 2.0 }");
            }
            for (Map.Entry<String, JsonNode> entry : values.properties()) {
                if (!entry.getValue().isNumber() || !Double.isFinite(entry.getValue().asDouble())) {
                    throw error("model", "start_values", "start value of " + entry.getKey() + " is not a finite number",
                            "write a number, e.g. " + entry.getKey() + " = 2.0");
                }
                startValues.put(entry.getKey(), entry.getValue().asDouble());
            }
        }
        ModelCommon common = new ModelCommon(stringList("model", model, "instrument_columns"), startValues,
                bounds(model));
        return family.reader().read(new ModelSection(this, "model", model), common);
    }

    /**
     * Refuses a [model] key, or a [data] key only some family uses, that the chosen family does not
     * read: a mistake worth naming rather than a value silently ignored.
     */
    private void rejectKeysOfOtherFamilies(Family family, JsonNode model) {
        for (String key : model.propertyNames()) {
            if (!ModelCommon.KEYS.contains(key) && !family.keys().contains(key)) {
                throw error("model", key, key + " is not used by the " + family.id() + " family",
                        "remove it, or choose the family that uses it (" + familiesUsing(key, Family::keys) + ")");
            }
        }
        for (Family other : ModelSpec.FAMILIES) {
            for (String key : other.dataKeys()) {
                if (!family.dataKeys().contains(key) && root.path("data").has(key)) {
                    throw error("data", key, key + " is not used by the " + family.id() + " family",
                            "remove it, or use family = \"" + familiesUsing(key, Family::dataKeys) + "\"");
                }
            }
        }
    }

    private static String familiesUsing(String key, java.util.function.Function<Family, List<String>> keys) {
        return ModelSpec.FAMILIES.stream().filter(f -> keys.apply(f).contains(key)).map(Family::id).sorted()
                .collect(Collectors.joining(", "));
    }

    /**
     * The default long-run covariance when the file names no kernel, lags or bandwidth: the
     * heteroskedasticity-consistent S for the Euler-equation families, whose one-period pricing errors are
     * martingale differences under their null (docs/methods.md, "Many moments"), Bartlett with 4 lags for the
     * others, whose unconditional null implies no such thing. A lag count or bandwidth without a kernel means
     * Bartlett for every family.
     */
    static String defaultKernel(ModelSpec model, JsonNode estimation) {
        boolean lagsGiven = estimation.has("lags") || estimation.has("bandwidth");
        return model.martingaleDifferenceErrors() && !lagsGiven ? Kernel.NONE.id() : Kernel.BARTLETT.id();
    }

    private EstimationSpec parseEstimation(JsonNode estimation, ModelSpec model) {
        JsonNode node = estimation == null ? JsonNodeFactory.instance.objectNode() : estimation;
        for (String key : node.propertyNames()) {
            model.estimationKeyRefusal(key).ifPresent(refusal -> {
                throw error("estimation", key, key + " cannot be used with the " + model.family().id() + " family: "
                        + refusal.problem(), refusal.fix());
            });
        }
        String methodId = choice("estimation", node, "method",
                Arrays.stream(EstimationMethod.values()).map(EstimationMethod::id).toList(), model.defaultMethod().id());
        model.refusal(EstimationMethod.fromId(methodId)).ifPresent(refusal -> {
            throw error("estimation", "method", "method = \"" + methodId + "\" cannot be used with the "
                    + model.family().id() + " family: " + refusal.problem(), refusal.fix());
        });
        String weight = choice("estimation", node, "initial_weight", INITIAL_WEIGHTS, "identity");
        String kernelId = choice("estimation", node, "kernel",
                Arrays.stream(Kernel.values()).map(Kernel::id).toList(), defaultKernel(model, node));
        Kernel kernel = Kernel.fromId(kernelId);
        if (node.has("bandwidth") && node.has("lags")) {
            throw error("estimation", "lags", "both bandwidth and lags are given",
                    "keep one: lags = L (a lag count) or bandwidth = b (the number in k(j/b))");
        }
        BandwidthRule rule = kernel.defaultBandwidth();
        String key = node.has("lags") ? "lags" : "bandwidth";
        if (node.has("lags")) {
            JsonNode lags = node.get("lags");
            if (!lags.isIntegralNumber() || lags.asLong() < 0 || lags.asLong() > 100_000) {
                throw error("estimation", "lags", "lags must be a whole number >= 0, found " + lags,
                        "write lags = 4, for example");
            }
            rule = new BandwidthRule.Lags(lags.asInt());
        } else if (node.has("bandwidth")) {
            JsonNode bandwidth = node.get("bandwidth");
            String text = bandwidth.isNumber() ? bandwidth.asString() : bandwidth.isString() ? bandwidth.asString() : "";
            rule = parseBandwidth(text, msg -> error("estimation", "bandwidth", msg,
                    "write bandwidth = 5.0, \"andrews\" or \"newey-west\""));
        }
        boolean given = node.has("lags") || node.has("bandwidth");
        if (given && !kernel.usesBandwidth() && !rule.equals(new BandwidthRule.Lags(0))) {
            throw error("estimation", key, "kernel = \"" + kernel.id() + "\" uses no lags, so " + key
                    + " has no effect", "remove " + key + ", or choose a kernel that uses lags (" + Kernel.idsWithBandwidth()
                    + ")");
        }
        String conflict = LongRunOptions.conflict(kernel, rule).orElse(null);
        if (conflict != null) {
            throw error("estimation", key, conflict, "write " + String.join(", or ",
                    LongRunOptions.acceptedChoices(kernel)) + " under [estimation]");
        }
        double level = node.has("confidence_level") ? node.get("confidence_level").asDouble() : 0.95;
        if (node.has("confidence_level") && !(node.get("confidence_level").isNumber() && level > 0 && level < 1)) {
            throw error("estimation", "confidence_level", "confidence_level must be a number between 0 and 1, found "
                    + node.get("confidence_level"), "write confidence_level = 0.95");
        }
        return new EstimationSpec(EstimationMethod.fromId(methodId), InitialWeight.fromId(weight), kernel, rule, given,
                bool("estimation", node, "prewhiten", false), bool("estimation", node, "centered", true),
                stringList("estimation", node, "restrictions"), level,
                wholeNumber(node, "max_iterations", 1, 100, "max_iterations = 100"),
                wholeNumber(node, "hj_seed", 0, 20240101, "hj_seed = 20240101"),
                wholeNumber(node, "hj_draws", 1000, 100_000, "hj_draws = 100000"),
                bool("estimation", node, "small_sample_correction", false));
    }

    private int wholeNumber(JsonNode node, String key, int minimum, int fallback, String example) {
        if (!node.has(key)) {
            return fallback;
        }
        JsonNode value = node.get(key);
        if (!value.isIntegralNumber() || value.asLong() < minimum || value.asLong() > Integer.MAX_VALUE) {
            throw error("estimation", key, key + " must be a whole number of at least " + minimum + ", found " + value,
                    "write " + example);
        }
        return value.asInt();
    }

    /** [data] instrument_lags = { z_cons = 2 }: how many periods each instrument is lagged (default 1). */
    private Map<String, Integer> instrumentLags(JsonNode data) {
        Map<String, Integer> lags = new LinkedHashMap<>();
        if (!data.has("instrument_lags")) {
            return lags;
        }
        JsonNode table = data.get("instrument_lags");
        if (!table.isObject()) {
            throw error("data", "instrument_lags", "instrument_lags must be a table of whole numbers",
                    "write instrument_lags = { z_cons = 2 } (an instrument must be known before the period it scales)");
        }
        for (Map.Entry<String, JsonNode> entry : table.properties()) {
            JsonNode value = entry.getValue();
            if (!value.isIntegralNumber() || value.asInt() < 1) {
                throw error("data", "instrument_lags", "the lag of " + entry.getKey() + " must be a whole number >= 1 "
                        + "(a lead would use information not yet known), found " + value,
                        "write " + entry.getKey() + " = 1 or more");
            }
            lags.put(entry.getKey(), value.asInt());
        }
        return lags;
    }

    /** [model] bounds = { beta = [0.0, 2.0] }: closed bounds per parameter, checked later against the family. */
    private Map<String, double[]> bounds(JsonNode model) {
        Map<String, double[]> bounds = new LinkedHashMap<>();
        if (!model.has("bounds")) {
            return bounds;
        }
        JsonNode table = model.get("bounds");
        String example = "write bounds = { beta = [0.0, 2.0] } (use -1e308 or 1e308 for an open side)";
        if (!table.isObject()) {
            throw error("model", "bounds", "bounds must be a table of [lower, upper] pairs", example);
        }
        for (Map.Entry<String, JsonNode> entry : table.properties()) {
            JsonNode pair = entry.getValue();
            if (!pair.isArray() || pair.size() != 2 || !pair.get(0).isNumber() || !pair.get(1).isNumber()
                    || !(pair.get(0).asDouble() < pair.get(1).asDouble())) {
                throw error("model", "bounds", "the bounds of " + entry.getKey() + " must be [lower, upper] with "
                        + "lower < upper, found " + pair, example);
            }
            bounds.put(entry.getKey(), new double[] {pair.get(0).asDouble(), pair.get(1).asDouble()});
        }
        return bounds;
    }

    private StabilitySpec parseStability(JsonNode node) {
        double trimming = StabilitySpec.DEFAULT_TRIMMING;
        if (node.has("trimming")) {
            JsonNode value = node.get("trimming");
            String problem = value.isNumber() ? StabilitySpec.trimmingProblem(value.asDouble()).orElse(null)
                    : "trimming must be a number between 0 and 0.5, found " + value;
            if (problem != null) {
                throw error("stability", "trimming", problem,
                        "write trimming = 0.15 (each side of a break holds at least 15% of the sample)");
            }
            trimming = value.asDouble();
        }
        Optional<Integer> window = Optional.empty();
        if (node.has("window")) {
            window = Optional.of(wholeNumber("stability", node, "window", StabilitySpec::windowProblem,
                    "window = 120 (observations per rolling window)"));
        }
        int step = node.has("step") ? wholeNumber("stability", node, "step", StabilitySpec::stepProblem, "step = 12") : 1;
        return new StabilitySpec(stringList("stability", node, "splits"), trimming, window, step,
                bool("stability", node, "expanding", false), java.util.Set.of());
    }

    private int wholeNumber(String section, JsonNode node, String key,
            java.util.function.LongFunction<Optional<String>> problem, String example) {
        JsonNode value = node.get(key);
        String why = value.isIntegralNumber() ? problem.apply(value.asLong()).orElse(null)
                : key + " must be a whole number, found " + value;
        if (why != null) {
            throw error(section, key, why, "write " + example);
        }
        return value.asInt();
    }

    /**
     * Parses a bandwidth choice: a positive number b, "andrews" or "newey-west". Shared with the
     * command line so both spell it the same way.
     */
    public static BandwidthRule parseBandwidth(String text, java.util.function.Function<String, InputException> fail) {
        switch (text) {
            case "andrews":
                return new BandwidthRule.Andrews();
            case "newey-west":
                return new BandwidthRule.NeweyWest();
            default:
                try {
                    double b = Double.parseDouble(text);
                    if (b > 0 && Double.isFinite(b)) {
                        return new BandwidthRule.Fixed(b);
                    }
                } catch (NumberFormatException ignored) {
                    // falls through to the refusal below
                }
                throw fail.apply("bandwidth \"" + text + "\" is neither a positive number nor a rule name");
        }
    }

    private JsonNode requiredSection(String name, String example) {
        if (!root.has(name)) {
            throw InputException.in(file).problem("the model file has no [" + name + "] section",
                    "add a [" + name + "] section, e.g.\n    [" + name + "]\n    " + example);
        }
        return section(name);
    }

    private JsonNode section(String name) {
        JsonNode node = root.get(name);
        if (!node.isObject()) {
            throw error(null, name, name + " must be a [" + name + "] section, not a value",
                    "write [" + name + "] on its own line followed by its keys");
        }
        return node;
    }

    private void rejectUnknown(String section, JsonNode node, List<String> known) {
        for (String key : node.propertyNames()) {
            if (!known.contains(key)) {
                String where = section == null ? "at the top level" : "in [" + section + "]";
                throw error(section, key, "unknown key \"" + key + "\" " + where,
                        "remove it" + Suggestions.didYouMean(key, known) + "; known keys: " + String.join(", ", known));
            }
        }
    }

    String string(String section, JsonNode node, String key) {
        JsonNode value = node.get(key);
        if (!value.isString()) {
            throw error(section, key, key + " must be a string in double quotes, found " + value,
                    "write " + key + " = \"...\"");
        }
        return value.asString();
    }

    Optional<String> optionalString(String section, JsonNode node, String key) {
        return node.has(key) ? Optional.of(string(section, node, key)) : Optional.empty();
    }

    String choice(String section, JsonNode node, String key, List<String> allowed, String fallback) {
        if (!node.has(key)) {
            return fallback;
        }
        String value = string(section, node, key);
        if (!allowed.contains(value)) {
            throw error(section, key, key + " = \"" + value + "\" is not a known choice",
                    "use one of " + String.join(", ", allowed) + Suggestions.didYouMean(value, allowed));
        }
        return value;
    }

    boolean bool(String section, JsonNode node, String key, boolean fallback) {
        if (!node.has(key)) {
            return fallback;
        }
        JsonNode value = node.get(key);
        if (!value.isBoolean()) {
            throw error(section, key, key + " must be true or false, found " + value, "write " + key + " = true");
        }
        return value.asBoolean();
    }

    List<String> stringList(String section, JsonNode node, String key) {
        if (!node.has(key)) {
            return List.of();
        }
        JsonNode value = node.get(key);
        if (!value.isArray()) {
            throw error(section, key, key + " must be a list of column names", "write " + key + " = [\"A\", \"B\"]");
        }
        List<String> names = new ArrayList<>();
        for (JsonNode element : value) {
            if (!element.isString()) {
                throw error(section, key, key + " must hold column names in double quotes, found " + element,
                        "write " + key + " = [\"A\", \"B\"]");
            }
            if (names.contains(element.asString())) {
                throw error(section, key, key + " names \"" + element.asString() + "\" twice", "list each column once");
            }
            names.add(element.asString());
        }
        return List.copyOf(names);
    }

    private Path path(String section, JsonNode node, String key) {
        String text = string(section, node, key);
        if (text.isBlank()) {
            throw error(section, key, key + " is empty", "write the path of a CSV file, relative to the model file");
        }
        Path folder = file.toAbsolutePath().getParent();
        try {
            return folder.resolve(text).normalize();
        } catch (InvalidPathException e) {
            // A NUL (or, on some systems, another reserved character) makes the text no path at all.
            throw error(section, key, key + " is not a usable path: " + e.getReason(),
                    "write the path of a CSV file, relative to the model file, without control characters");
        }
    }

    private Optional<Path> optionalPath(JsonNode node, String key) {
        return node.has(key) ? Optional.of(path("data", node, key)) : Optional.empty();
    }

    private String fileStem() {
        String name = file.getFileName().toString();
        return name.endsWith(".toml") ? name.substring(0, name.length() - 5) : name;
    }

    /** An error about {@code key} of {@code section}, located on its line in the model file. */
    InputException error(String section, String key, String problem, String fix) {
        return InputException.in(file).line(lineOf(section, key)).problem(problem, fix);
    }

    /**
     * The 1-based line where {@code key} is assigned inside {@code [section]} (or the section header
     * when {@code key} is null); 0 when it cannot be found. The TOML tree keeps no positions, so the
     * raw lines are searched; dotted and inline-table forms fall back to the section header.
     */
    int lineOf(String section, String key) {
        String current = null;
        int header = 0;
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i).strip();
            if (line.startsWith("[") && !line.startsWith("[[")) {
                int close = line.indexOf(']');
                current = close > 0 ? line.substring(1, close).strip() : null;
                if (section != null && section.equals(current)) {
                    header = i + 1;
                }
                if (key != null && section == null && key.equals(current)) {
                    return i + 1;
                }
                continue;
            }
            boolean inSection = section == null ? current == null : section.equals(current);
            if (inSection && key != null && assigns(line, key)) {
                return i + 1;
            }
        }
        return header;
    }

    private static boolean assigns(String line, String key) {
        String unquoted = line.startsWith("\"") && line.indexOf('"', 1) > 0
                ? line.substring(1, line.indexOf('"', 1)) + line.substring(line.indexOf('"', 1) + 1)
                : line;
        if (!unquoted.startsWith(key)) {
            return false;
        }
        String rest = unquoted.substring(key.length()).stripLeading();
        return rest.startsWith("=") || rest.startsWith(".");
    }
}
