package org.orthogon.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.List;
import java.util.function.UnaryOperator;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestFactory;
import org.junit.jupiter.api.io.TempDir;

/**
 * The refusal catalogue of docs/errors.md, one dynamic test per entry, named by the entry's id. Each
 * case starts from a private copy of models/ and demo-data/, breaks one thing, runs the command line
 * in-process and checks the exit code, that the one message names the file, the line (and column),
 * and a fix, that no stack trace is printed, and that no output file appears. Cases marked "accepted"
 * are inputs Orthogon reads as they are (a byte-order mark, Windows line endings).
 */
class ErrorCatalogueTest {
    private static final String POWER = "lumen-power-utility.toml";
    private static final String THREE = "lumen-three-factor.toml";
    private static final String FACTORS = "lumen-factors-monthly.csv";
    private static final String PORTFOLIOS = "lumen-portfolios-monthly.csv";
    private static final String CONSUMPTION = "lumen-consumption-quarterly.csv";
    private static final String EXPRESSION = "lumen-expression-power.toml";
    private static final String BETA = "lumen-beta-pricing.toml";

    @TempDir
    Path root;

    /**
     * One catalogue entry. {@code verb} is the command run: "fit", "stability", "two-pass" and "montecarlo" get the model file and
     * --json before the extra arguments; any other verb gets only the extra arguments.
     */
    record Case(String id, String verb, String model, Setup setup, List<String> extraArgs, int exit, String file,
            int line, List<String> mentions) {
    }

    @FunctionalInterface
    interface Setup {
        void apply(CliHarness cli) throws IOException;

        default Setup andThen(Setup next) {
            return cli -> {
                apply(cli);
                next.apply(cli);
            };
        }
    }

    private static Case refused(String id, String model, Setup setup, String file, int line, String... mentions) {
        return new Case(id, "fit", model, setup, List.of(), Main.EXIT_INPUT, file, line, List.of(mentions));
    }

    private static Case accepted(String id, String model, Setup setup) {
        return new Case(id, "fit", model, setup, List.of(), Main.EXIT_OK, null, 0, List.of());
    }

    private static Case withArgs(Case c, String... args) {
        return new Case(c.id(), c.verb(), c.model(), c.setup(), List.of(args), c.exit(), c.file(), c.line(),
                c.mentions());
    }

    private static Case onVerb(String verb, Case c) {
        return new Case(c.id(), verb, c.model(), c.setup(), c.extraArgs(), c.exit(), c.file(), c.line(), c.mentions());
    }

    private static Setup editData(String file, UnaryOperator<String> change) {
        return cli -> {
            Path path = cli.data.resolve(file);
            Files.writeString(path, change.apply(Files.readString(path)));
        };
    }

    private static Setup replaceInData(String file, String from, String to) {
        return cli -> cli.edit(cli.data.resolve(file), from, to);
    }

    private static Setup replaceInModel(String model, String from, String to) {
        return cli -> cli.edit(cli.models.resolve(model), from, to);
    }

    private static Setup writeData(String file, String text) {
        return cli -> Files.writeString(cli.data.resolve(file), text);
    }

    /** Applies {@code cell} to every numeric cell of a wide CSV (the date column is kept). */
    private static Setup mapCells(String file, UnaryOperator<String> cell) {
        return editData(file, text -> {
            StringBuilder out = new StringBuilder();
            String[] lines = text.split("\n");
            out.append(lines[0]).append('\n');
            for (int i = 1; i < lines.length; i++) {
                String[] cells = lines[i].split(",");
                out.append(cells[0]);
                for (int j = 1; j < cells.length; j++) {
                    out.append(',').append(cell.apply(cells[j]));
                }
                out.append('\n');
            }
            return out.toString();
        });
    }

    private static String plusOne(String cell) {
        return new java.math.BigDecimal(cell).add(java.math.BigDecimal.ONE).toPlainString();
    }

    /** The catalogue, in the order of docs/errors.md. */
    static List<Case> catalogue() {
        List<Case> cases = new ArrayList<>();
        // Data files: structure
        cases.add(refused("empty-file", THREE, writeData(FACTORS, ""), FACTORS, 0, "empty"));
        cases.add(refused("header-only", THREE, writeData(FACTORS, "date,MKT,SIZE,TIDE\n"), FACTORS, 0, "no data rows"));
        cases.add(refused("no-date-column", THREE, writeData(FACTORS, "MKT,SIZE,TIDE\n0.01,0.02,0.03\n0.02,0.01,0.00\n"),
                FACTORS, 0, "date"));
        cases.add(accepted("byte-order-mark", THREE, editData(FACTORS, text -> "\uFEFF" + text)));
        cases.add(refused("semicolon-separator", THREE, editData(FACTORS, text -> text.replace(',', ';')), FACTORS, 1,
                "semicolon"));
        cases.add(refused("tab-separator", THREE, editData(FACTORS, text -> text.replace(',', '\t')), FACTORS, 1, "tab"));
        cases.add(accepted("quoted-numbers", THREE, replaceInData(FACTORS, "1962-02,0.070819,0.029104,0.037514",
                "1962-02,\"0.070819\",\"0.029104\",\"0.037514\"")));
        cases.add(refused("thousands-separators", THREE, replaceInData(FACTORS, "1962-02,0.070819",
                "1962-02,\"1,070.819\""), FACTORS, 3, "column 2", "1,070.819"));
        cases.add(refused("decimal-commas", THREE, replaceInData(FACTORS, "1962-02,0.070819", "1962-02,\"0,070819\""),
                FACTORS, 3, "column 2", "decimal separator"));
        cases.add(accepted("windows-line-endings", THREE, editData(FACTORS, text -> text.replace("\n", "\r\n"))));
        cases.add(accepted("trailing-blank-lines", THREE, editData(FACTORS, text -> text + "\n\n\n")));
        cases.add(refused("nan-cell", THREE, replaceInData(FACTORS, "1962-02,0.070819", "1962-02,NaN"), FACTORS, 3,
                "column 2", "missing"));
        cases.add(refused("infinite-cell", THREE, replaceInData(FACTORS, "1962-02,0.070819", "1962-02,1e999"), FACTORS, 3,
                "column 2"));
        cases.add(refused("empty-cell", THREE, replaceInData(FACTORS, "1962-02,0.070819", "1962-02,"), FACTORS, 3,
                "column 2", "missing"));
        cases.add(refused("missing-value-code", THREE, replaceInData(PORTFOLIOS, "1962-02,0.113774", "1962-02,-99.99"),
                PORTFOLIOS, 3, "missing-value code"));
        cases.add(refused("duplicate-column-names", THREE, replaceInData(FACTORS, "date,MKT,SIZE,TIDE", "date,MKT,SIZE,MKT"),
                FACTORS, 1, "twice"));
        cases.add(refused("ragged-row", THREE, replaceInData(FACTORS, "1962-02,0.070819,", "1962-02,"), FACTORS, 3,
                "cells"));
        cases.add(refused("non-numeric-cell", THREE, replaceInData(FACTORS, "1962-02,0.070819", "1962-02,0.07o819"),
                FACTORS, 3, "column 2", "0.07o819"));
        // Data files: dates
        cases.add(refused("duplicate-dates", POWER, replaceInData(CONSUMPTION, "1962Q2,", "1962Q1,"), CONSUMPTION, 3,
                "1962Q1"));
        cases.add(refused("unsorted-dates", THREE, editData(FACTORS, text -> {
            String[] lines = text.split("\n", -1);
            String swap = lines[3];
            lines[3] = lines[4];
            lines[4] = swap;
            return String.join("\n", lines);
        }), FACTORS, 5, "sorted"));
        cases.add(refused("gap-in-monthly-index", THREE, editData(FACTORS, text -> text.replaceFirst("\n1962-03,[^\n]*", "")),
                FACTORS, 0, "1962-03"));
        cases.add(refused("mixed-frequencies-in-one-file", THREE, replaceInData(FACTORS, "\n1962-02,", "\n1962Q1,"),
                FACTORS, 3, "1962Q1"));
        cases.add(refused("unparseable-date", THREE, replaceInData(FACTORS, "\n1962-02,", "\n1962-13,"), FACTORS, 3,
                "column 1", "1962-13"));
        cases.add(refused("dates-outside-declared-sample", POWER, replaceInModel(POWER, "[model]",
                "start = \"1950-01\"\n\n[model]"), POWER, 12, "1950Q1", "outside"));
        cases.add(refused("fewer-observations-than-moments", POWER, replaceInModel(POWER, "[model]",
                "start = \"2023-01\"\n\n[model]"), POWER, 12, "8 observations", "12 moments"));
        // Data files: values
        cases.add(refused("linearly-dependent-assets", THREE, editData(PORTFOLIOS, text -> {
            StringBuilder out = new StringBuilder();
            for (String line : text.split("\n")) {
                String[] cells = line.split(",");
                cells[cells.length - 1] = line.startsWith("date") ? cells[cells.length - 1] : cells[1];
                out.append(String.join(",", cells)).append('\n');
            }
            return out.toString();
        }), PORTFOLIOS, 1, "S3T4", "linear combination"));
        cases.add(refused("constant-column", THREE, editData(FACTORS,
                text -> text.replaceAll("(?m)^(\\d{4}-\\d{2},[^,]*,[^,]*),.*$", "$1,0.01")), FACTORS, 1, "TIDE", "constant"));
        cases.add(refused("constant-consumption", POWER, editData(CONSUMPTION,
                text -> text.replaceAll("(?m)^(\\d{4}Q\\d),.*$", "$1,1.004")), CONSUMPTION, 1, "constant"));
        cases.add(refused("percent-declared-decimal", THREE, mapCells(PORTFOLIOS,
                cell -> new java.math.BigDecimal(cell).movePointRight(2).toPlainString()), PORTFOLIOS, 2, "percent"));
        cases.add(refused("decimal-declared-percent", THREE, replaceInModel(THREE, "units = \"decimal\"",
                "units = \"percent\""), "lumen-", 0, "decimal"));
        cases.add(refused("gross-declared-net", THREE, mapCells(PORTFOLIOS, ErrorCatalogueTest::plusOne), PORTFOLIOS, 2,
                "gross"));
        cases.add(refused("negative-gross-return", POWER, cli -> {
            mapCells(PORTFOLIOS, ErrorCatalogueTest::plusOne).apply(cli);
            cli.edit(cli.models.resolve(POWER), "returns_kind = \"net\"", "returns_kind = \"gross\"");
            cli.edit(cli.data.resolve(PORTFOLIOS), "\n1962-02,1.113774", "\n1962-02,-0.2");
        }, PORTFOLIOS, 3, "negative"));
        cases.add(refused("absurd-value", THREE, replaceInData(PORTFOLIOS, "1962-02,0.113774", "1962-02,12.5"), PORTFOLIOS,
                3, "1000%"));
        // Paths
        cases.add(refused("missing-data-file", POWER, replaceInModel(POWER, CONSUMPTION, "no-such-file.csv"), POWER, 10,
                "does not exist"));
        cases.add(refused("data-path-is-folder", POWER, replaceInModel(POWER, "../demo-data/" + CONSUMPTION, "../demo-data"),
                POWER, 10, "folder"));
        cases.add(refused("missing-column", POWER, replaceInModel(POWER, "\"cons_growth\"", "\"cons_grwth\""), CONSUMPTION,
                1, "cons_grwth", "did you mean \"cons_growth\""));
        cases.add(refused("model-file-missing", "no-such-model.toml", cli -> { }, "no-such-model.toml", 0, "does not exist"));
        cases.add(refused("model-path-is-folder", ".", cli -> { }, "models", 0, "folder"));
        // Model files
        cases.add(refused("unknown-key", POWER, replaceInModel(POWER, "kernel = ", "kernal = "), POWER, 19,
                "did you mean \"kernel\""));
        cases.add(refused("wrong-type", POWER, replaceInModel(POWER, "lags = 4", "lags = \"four\""), POWER, 20,
                "whole number"));
        cases.add(refused("missing-section", POWER, replaceInModel(POWER, "[model]", "[modle]"), POWER, 12, "modle"));
        cases.add(refused("non-utf8-model-file", POWER, cli -> {
            Path model = cli.models.resolve(POWER);
            byte[] text = Files.readAllBytes(model);
            byte[] bad = new byte[text.length + 3];
            System.arraycopy(text, 0, bad, 0, text.length);
            bad[text.length] = '#';
            bad[text.length + 1] = (byte) 0xC3;
            bad[text.length + 2] = '\n';
            Files.write(model, bad);
        }, POWER, 21, "UTF-8"));
        cases.add(refused("toml-syntax-error", POWER, replaceInModel(POWER, "family = \"power-utility\"",
                "family = \"power-utility"), POWER, 13, "TOML"));
        cases.add(refused("unknown-family", POWER, replaceInModel(POWER, "\"power-utility\"", "\"power-utlity\""), POWER, 13,
                "did you mean \"power-utility\""));
        cases.add(refused("lags-and-bandwidth-together", POWER, replaceInModel(POWER, "lags = 4", "lags = 4\nbandwidth = 5.0"),
                POWER, 20, "both"));
        cases.add(refused("start-values-unknown-parameter", POWER, replaceInModel(POWER, "gamma = 2.0", "gama = 2.0"), POWER,
                15, "gama", "did you mean \"gamma\""));
        cases.add(refused("family-key-of-another-family", THREE, replaceInModel(THREE, "[estimation]",
                "consumption_column = \"cons_growth\"\n\n[estimation]"), THREE, 0, "not used by the linear-factor family"));
        cases.add(refused("start-values-outside-bounds", POWER, replaceInModel(POWER, "[estimation]",
                "bounds = { gamma = [0.0, 50.0] }\n\n[estimation]").andThen(replaceInModel(POWER, "gamma = 2.0",
                "gamma = -1.0")), POWER, 15, "outside its bounds"));
        cases.add(refused("json-path-is-a-folder", POWER, cli -> Files.createDirectories(cli.root.resolve("results.json")),
                "results.json", 0, "folder"));
        cases.add(withArgs(refused("output-folder-is-a-file", POWER, cli -> Files.writeString(cli.root.resolve("report"), "x"),
                "report", 0, "file"), "--out", "{root}/report"));
        cases.add(withArgs(refused("output-folder-holds-report", POWER, cli -> {
            Files.createDirectories(cli.root.resolve("report"));
            Files.writeString(cli.root.resolve("report/report.html"), "<html></html>");
        }, "report", 0, "--overwrite"), "--out", "{root}/report"));
        cases.add(refused("bounds-unknown-parameter", POWER, replaceInModel(POWER, "[estimation]",
                "bounds = { gama = [0.0, 50.0] }\n\n[estimation]"), POWER, 17, "did you mean \"gamma\""));
        cases.add(refused("expression-unknown-name", EXPRESSION, replaceInModel(EXPRESSION, "cons_growth^(-gamma)",
                "cons_grwth^(-gamma)"), EXPRESSION, 14, "cons_grwth", "did you mean \"cons_growth\""));
        cases.add(refused("expression-syntax-error", EXPRESSION, replaceInModel(EXPRESSION, "cons_growth^(-gamma)",
                "cons_growth^(-gamma"), EXPRESSION, 14, "sdf formula"));
        cases.add(refused("restriction-unknown-parameter", THREE, replaceInModel(THREE, "lags = 4",
                "lags = 4\nrestrictions = [\"b_SIZ = 0\"]"), THREE, 21, "b_SIZ", "did you mean \"b_SIZE\""));
        cases.add(refused("fewer-moments-than-parameters", POWER, replaceInModel(POWER, "[model]",
                "assets = [\"S1T1\"]\n\n[model]"), POWER, 15, "2 parameters", "only 1 moment"));
        // Kernels and bandwidths
        cases.add(refused("lag-count-for-a-kernel-that-weights-every-lag", POWER, replaceInModel(POWER,
                "kernel = \"bartlett\"", "kernel = \"quadratic-spectral\""), POWER, 20, "weights every lag",
                "bandwidth = \"andrews\""));
        cases.add(refused("newey-west-rule-without-constants", POWER, replaceInModel(POWER, "kernel = \"bartlett\"",
                "kernel = \"tukey-hanning\"").andThen(replaceInModel(POWER, "lags = 4", "bandwidth = \"newey-west\"")),
                POWER, 20, "Newey-West", "bandwidth = \"andrews\""));
        cases.add(refused("bandwidth-for-kernel-none", POWER, replaceInModel(POWER, "kernel = \"bartlett\"",
                "kernel = \"none\""), POWER, 20, "uses no lags"));
        cases.add(withArgs(refused("kernel-option-against-the-model-files-lags", POWER, cli -> { }, POWER, 20,
                "--kernel quadratic-spectral", "--bandwidth andrews"), "--kernel", "quadratic-spectral"));
        cases.add(withArgs(refused("bandwidth-option-the-kernel-cannot-use", POWER, cli -> { }, "--lags 3", 0,
                "weights every lag", "--bandwidth andrews"), "--kernel", "quadratic-spectral", "--lags", "3"));
        cases.add(refused("sample-too-short-for-prewhitening", THREE, replaceInModel(THREE, "[model]",
                "start = \"2023-12\"\n\n[model]").andThen(replaceInModel(THREE, "lags = 4", "lags = 4\nprewhiten = true")),
                THREE, 23, "13 observations", "prewhitening"));
        // Stability options
        cases.add(withArgs(onVerb("stability", refused("stability-window-longer-than-sample", THREE, cli -> { },
                "--window", 0, "longer than the sample", "at most 756")), "--window", "5000"));
        cases.add(withArgs(onVerb("stability", refused("stability-window-too-short", THREE, cli -> { }, "--window",
                0, "too short", "at least 13")), "--window", "10", "--no-sup-wald"));
        cases.add(onVerb("stability", refused("stability-trimming-too-small", POWER, replaceInModel(POWER, "lags = 4",
                "lags = 4\n\n[stability]\ntrimming = 0.04"), POWER, 23, "as few as 11", "at least 0.052")));
        cases.add(withArgs(onVerb("stability", refused("stability-split-period-too-short", POWER, cli -> { }, "--split",
                0, "2024Q3 to 2024Q4 has 2 observations")), "--split", "2024-07", "--no-sup-wald"));
        // Verbs
        cases.add(withArgs(onVerb("orthogon", refused("program-name-twice", POWER, cli -> { }, "\"orthogon\"", 0,
                "program's own name")), "fit", "model.toml"));
        cases.add(withArgs(onVerb("simulate", refused("simulate-over-existing-files", POWER, cli -> { }, "demo-data", 0,
                "already holds", "--overwrite")), "--out", "{root}/demo-data", "--years", "1"));
        // two-pass
        cases.add(onVerb("two-pass", refused("two-pass-not-linear-factor", POWER, cli -> { }, POWER, 13,
                "power-utility", "linear-factor")));
        cases.add(onVerb("two-pass", refused("two-pass-scaled-moments", THREE, replaceInModel(THREE, "[estimation]",
                "instrument_columns = [\"const\"]\n\n[estimation]"), THREE, 17, "instrument_columns")));
        cases.add(onVerb("two-pass", refused("two-pass-too-few-assets", THREE, replaceInModel(THREE, "[model]",
                "assets = [\"S1T1\", \"S1T2\", \"S1T3\", \"S1T4\"]\n\n[model]"), THREE, 17, "K + 2")));
        cases.add(onVerb("two-pass", refused("two-pass-short-sample", THREE, replaceInModel(THREE, "[model]",
                "start = \"2023-11\"\n\n[model]"), THREE, 13, "T > N + K")));
        // The beta-pricing system (S singular by construction; closed form; no SDF)
        cases.add(refused("beta-pricing-efficient-method", BETA, replaceInModel(BETA, "method = \"one-step\"",
                "method = \"two-step\""), BETA, 25, "singular by construction", "method = \"one-step\""));
        cases.add(withArgs(refused("beta-pricing-efficient-method-option", BETA, cli -> { }, "--method iterated", 0,
                "singular by construction", "--method one-step"), "--method", "iterated"));
        cases.add(refused("beta-pricing-initial-weight", BETA, replaceInModel(BETA, "kernel = \"bartlett\"",
                "initial_weight = \"second-moment\"\nkernel = \"bartlett\""), BETA, 26, "cross_section"));
        cases.add(refused("beta-pricing-hj-settings", BETA, replaceInModel(BETA, "kernel = \"bartlett\"",
                "hj_draws = 5000\nkernel = \"bartlett\""), BETA, 26, "Hansen-Jagannathan"));
        cases.add(refused("beta-pricing-instruments", BETA, replaceInModel(BETA, "cross_section_intercept = false",
                "cross_section_intercept = false\ninstrument_columns = [\"const\"]"), BETA, 23, "instrument_columns",
                "factor_instruments"));
        cases.add(refused("beta-pricing-start-values", BETA, replaceInModel(BETA, "cross_section_intercept = false",
                "cross_section_intercept = false\nstart_values = { lambda_MKT = 0.005 }"), BETA, 23, "closed-form"));
        cases.add(refused("beta-pricing-intercept-name", BETA, replaceInModel(BETA, "cross_section_intercept = false",
                "cross_section_intercept = true").andThen(replaceInModel(BETA, "\"TIDE\"]", "\"0\"]")), BETA, 20,
                "lambda_0"));
        cases.add(refused("beta-pricing-too-few-assets", BETA, replaceInModel(BETA, "[model]",
                "assets = [\"S1T1\", \"S1T2\", \"S1T3\"]\n\n[model]"), BETA, 22, "at least 4 test assets"));
        cases.add(withArgs(refused("beta-pricing-s-sets", BETA, cli -> { }, "--s-sets", 0, "singular by construction"),
                "--s-sets"));
        cases.add(withArgs(onVerb("compare", refused("compare-beta-pricing", BETA, cli -> { }, BETA, 19,
                "beta-pricing", "linear-factor")), "{root}/models/" + THREE, "{root}/models/" + BETA));
        // Command line
        cases.add(withArgs(refused("unknown-method-option", POWER, cli -> { }, "three-step", 0, "one-step"), "--method",
                "three-step"));
        cases.add(withArgs(refused("negative-lags-option", POWER, cli -> { }, "--lags", 0, "negative"), "--lags", "-1"));
        cases.add(withArgs(refused("unknown-kernel-option", POWER, cli -> { }, "gaussian", 0, "quadratic-spectral"),
                "--kernel", "gaussian"));
        cases.add(withArgs(refused("threads-option-below-one", POWER, cli -> { }, "--threads", 0, "below one"),
                "--threads", "0"));
        // Bootstrap and Monte Carlo options
        cases.add(withArgs(refused("bootstrap-replications-out-of-range", POWER, cli -> { }, "--bootstrap", 0,
                "at least 19"), "--bootstrap", "5"));
        cases.add(withArgs(refused("block-length-below-one", POWER, cli -> { }, "--block-length", 0, "below one"),
                "--bootstrap", "99", "--block-length", "0"));
        cases.add(withArgs(refused("block-length-too-long", POWER, cli -> { }, "--block-length", 0, "at most 126"),
                "--bootstrap", "99", "--block-length", "200"));
        cases.add(withArgs(refused("block-scheme-unknown", POWER, cli -> { }, "--block-scheme", 0, "moving, circular"),
                "--bootstrap", "99", "--block-scheme", "stationary"));
        cases.add(withArgs(refused("block-option-without-bootstrap", POWER, cli -> { }, "--block-length", 0,
                "--bootstrap B"), "--block-length", "4"));
        cases.add(withArgs(onVerb("stability", refused("stability-bootstrap-without-sup-wald", POWER, cli -> { },
                "--no-sup-wald", 0, "drop --no-sup-wald")), "--bootstrap", "99", "--no-sup-wald"));
        cases.add(withArgs(onVerb("montecarlo", refused("montecarlo-replications-out-of-range", POWER, cli -> { },
                "--replications", 0, "at least 10")), "--replications", "5"));
        cases.add(withArgs(onVerb("montecarlo", refused("montecarlo-alternative-unknown-name", POWER, cli -> { },
                "\"S9T9\"", 0, "neither a moment nor a parameter")), "--replications", "10", "--alternative",
                "S9T9 = 0.01"));
        cases.add(withArgs(onVerb("montecarlo", refused("montecarlo-alternative-not-a-number", POWER, cli -> { },
                "S1T1", 0, "not a finite number")), "--replications", "10", "--alternative", "S1T1 = abc"));
        cases.add(withArgs(onVerb("montecarlo", refused("montecarlo-alternative-syntax", POWER, cli -> { },
                "--alternative", 0, "NAME = VALUE")), "--replications", "10", "--alternative", "S1T1 0.01"));
        cases.add(withArgs(refused("s-range-unknown-parameter", POWER, cli -> { }, "--s-range", 0, "gama",
                "did you mean \"gamma\""), "--s-sets", "--s-range", "gama=0:40"));
        cases.add(withArgs(refused("s-range-malformed", POWER, cli -> { }, "--s-range", 0, "NAME=LOW:HIGH"),
                "--s-sets", "--s-range", "gamma=40:0"));
        cases.add(withArgs(refused("s-range-outside-bounds", POWER, cli -> { }, "--s-range", 0, "outside the bounds"),
                "--s-sets", "--s-range", "beta=-2:-1"));
        cases.add(withArgs(refused("s-points-too-few", POWER, cli -> { }, "--s-points", 0, "at least 11"),
                "--s-sets", "--s-points", "5"));
        return cases;
    }

    @TestFactory
    Stream<DynamicTest> everyCatalogueEntry() {
        return catalogue().stream().map(c -> DynamicTest.dynamicTest(c.id(), () -> run(c)));
    }

    private void run(Case c) throws IOException {
        Path caseRoot = Files.createDirectories(root.resolve(c.id()));
        CliHarness cli = new CliHarness(caseRoot);
        c.setup().apply(cli);
        Path json = caseRoot.resolve("results.json");
        List<String> args = new ArrayList<>(List.of(c.verb()));
        if (List.of("fit", "stability", "two-pass", "montecarlo").contains(c.verb())) {
            args.addAll(List.of(cli.models.resolve(c.model()).normalize().toString(), "--json", json.toString()));
        }
        c.extraArgs().forEach(arg -> args.add(arg.replace("{root}", caseRoot.toString())));
        CliHarness.Result result = cli.run(args.toArray(String[]::new));
        if (c.exit() == Main.EXIT_OK) {
            assertThat(result.code()).as("%s is accepted: %s", c.id(), result.err()).isZero();
            assertThat(json).exists();
            return;
        }
        String err = result.err();
        assertThat(result.code()).as("%s: %s", c.id(), err).isEqualTo(c.exit());
        assertThat(err).as(c.id()).startsWith("error: ").contains(c.file()).contains("fix:");
        assertThat(err).as(c.id()).doesNotContain("Exception").doesNotContain("\tat ");
        assertThat(err.lines().count()).as("%s: one message of at most two lines: %s", c.id(), err).isLessThanOrEqualTo(2);
        if (c.line() > 0) {
            Matcher line = Pattern.compile("line (\\d+)").matcher(err);
            assertThat(line.find()).as("%s names a line: %s", c.id(), err).isTrue();
            assertThat(Integer.parseInt(line.group(1))).as("%s: %s", c.id(), err).isEqualTo(c.line());
        }
        for (String mention : c.mentions()) {
            assertThat(err).as(c.id()).contains(mention);
        }
        assertThat(result.out()).as(c.id()).isEmpty();
        assertThat(Files.isRegularFile(json)).as("%s writes no output", c.id()).isFalse();
        if (System.getProperty("orthogon.printCatalogue") != null) {
            System.out.println("CATALOGUE " + c.id() + " | " + err.replace(caseRoot.toString(), "").replace("\n", " / "));
        }
    }

    @Test
    void docsListEveryCatalogueEntryAndNoOther() throws IOException {
        String docs = Files.readString(Paths.get("docs/errors.md"), StandardCharsets.UTF_8);
        List<String> documented = Pattern.compile("(?m)^### `([a-z0-9-]+)`").matcher(docs).results()
                .map(m -> m.group(1)).toList();
        List<String> tested = catalogue().stream().map(Case::id).toList();
        assertThat(documented).containsExactlyInAnyOrderElementsOf(tested);
        assertThat(tested).hasSizeGreaterThanOrEqualTo(40);
    }
}
