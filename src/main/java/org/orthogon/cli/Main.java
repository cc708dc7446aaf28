package org.orthogon.cli;

import java.io.PrintWriter;
import java.util.LinkedHashMap;
import java.util.Map;
import org.orthogon.data.InputException;
import org.orthogon.data.Suggestions;
import org.orthogon.gmm.EstimationException;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The command line: {@code java -jar orthogon.jar <verb> ...}. Exit codes: 0 success, 2 bad input or
 * usage, 3 estimation failed, 1 a bug in Orthogon (docs/errors.md).
 */
@Command(name = "orthogon", mixinStandardHelpOptions = true, versionProvider = Version.class,
        description = "Tests whether a stochastic discount factor prices a set of test assets, by GMM.")
public final class Main {
    /**
     * The verbs, in the order help lists them. Creating a command line makes picocli reflect over every
     * registered command's options and mixins, which is a good part of a short run's start, so only the
     * verb named first on the command line is registered; anything else (help, --version, a typo) gets
     * them all.
     */
    private static final Map<String, Class<?>> VERBS = verbs();

    private static Map<String, Class<?>> verbs() {
        Map<String, Class<?>> verbs = new LinkedHashMap<>();
        verbs.put("fit", FitCommand.class);
        verbs.put("compare", CompareCommand.class);
        verbs.put("two-pass", TwoPassCommand.class);
        verbs.put("stability", StabilityCommand.class);
        verbs.put("montecarlo", MonteCarloCommand.class);
        verbs.put("check", CheckCommand.class);
        verbs.put("simulate", SimulateCommand.class);
        verbs.put("help", CommandLine.HelpCommand.class);
        return verbs;
    }

    public static final int EXIT_OK = 0;
    public static final int EXIT_BUG = 1;
    public static final int EXIT_INPUT = 2;
    public static final int EXIT_ESTIMATION = 3;

    public static void main(String[] args) {
        System.setProperty("java.awt.headless", "true");
        System.exit(run(new PrintWriter(System.out, true), new PrintWriter(System.err, true), args));
    }

    /** Runs one command with the given streams; returns the exit code. Used by main and by the tests. */
    public static int run(PrintWriter out, PrintWriter err, String... args) {
        boolean debug = java.util.Arrays.asList(args).contains("--debug");
        CommandLine line = new CommandLine(new Main());
        String first = args.length == 0 ? "" : args[0];
        if (VERBS.containsKey(first) && !first.equals("help")) {
            line.addSubcommand(first, VERBS.get(first));
        } else {
            VERBS.forEach(line::addSubcommand);
        }
        line.setOut(out);
        line.setErr(err);
        line.setParameterExceptionHandler((ex, arguments) -> {
            err.println("usage error: " + ex.getMessage());
            err.println("  fix: see `" + ex.getCommandLine().getCommandSpec().qualifiedName() + " --help`");
            return EXIT_INPUT;
        });
        String unknownVerb = unknownVerb(line, args);
        if (unknownVerb != null) {
            err.println("error: " + unknownVerb);
            err.println("  fix: start with one of the verbs " + String.join(", ", verbs(line))
                    + ", e.g. `orthogon fit MODEL.toml`; see `orthogon --help`");
            err.flush();
            return EXIT_INPUT;
        }
        line.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            if (ex instanceof InputException input) {
                err.println("error: " + input.getMessage());
                return EXIT_INPUT;
            }
            if (ex instanceof EstimationException estimation) {
                err.println("estimation failed: " + estimation.getMessage());
                for (String diagnostic : estimation.diagnostics()) {
                    err.println("  " + diagnostic);
                }
                err.println("  fix: " + estimation.fix());
                return EXIT_ESTIMATION;
            }
            err.println("internal error (a bug in Orthogon): " + ex);
            if (debug) {
                ex.printStackTrace(err);
            } else {
                err.println("  run again with --debug for the stack trace, and report it");
            }
            return EXIT_BUG;
        });
        int code = line.execute(args);
        out.flush();
        err.flush();
        return code;
    }

    /**
     * Why the first argument cannot start a run, or null: a word that is neither an option nor a verb
     * (the program's own name typed twice, a misspelt verb). Checked before parsing, because a --help
     * further on would otherwise print the top-level help and report success.
     */
    private static String unknownVerb(CommandLine line, String[] args) {
        if (args.length == 0 || args[0].startsWith("-") || line.getSubcommands().containsKey(args[0])) {
            return null;
        }
        if (args[0].equals(line.getCommandName())) {
            return "\"" + args[0] + "\" is the program's own name, not a verb (is it written twice?)";
        }
        return "\"" + args[0] + "\" is not a verb" + Suggestions.didYouMean(args[0], verbs(line));
    }

    private static java.util.List<String> verbs(CommandLine line) {
        return line.getSubcommands().keySet().stream().filter(name -> !name.equals("help")).toList();
    }
}
