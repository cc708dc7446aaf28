package org.orthogon.report;

import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Map;
import org.orthogon.gmm.GmmFit;
import org.orthogon.longrun.BandwidthRule;
import org.orthogon.spec.InputSummary;
import org.orthogon.spec.RunSpec;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * manifest.json: what is needed to repeat a run and to know that its inputs are unchanged. The
 * SHA-256 of the model file and of every data file, every estimation option in effect after
 * command-line overrides, the arguments, the Orthogon and Java versions, the seeds, the time, and
 * the SHA-256 of every file written beside it.
 */
public final class Manifest {
    private Manifest() {
    }

    /**
     * What a command knows about its own run.
     *
     * @param command   the verb ("fit", "compare", ...)
     * @param arguments the command-line arguments as given
     * @param version   the Orthogon version
     * @param started   when the run started
     * @param seeds     every random seed the run used, by purpose (empty when nothing was random)
     */
    public record Run(String command, List<String> arguments, String version, Instant started,
            Map<String, Long> seeds) {
        public Run {
            arguments = List.copyOf(arguments);
            seeds = Map.copyOf(seeds);
        }
    }

    /**
     * The seeds a fit drew with, by purpose: the Hansen-Jagannathan p-value is simulated, so its seed
     * belongs in the manifest ("hj_distance"); empty when the fit has no HJ distance.
     */
    public static Map<String, Long> seeds(GmmFit fit) {
        return fit.hj().map(hj -> Map.of("hj_distance", hj.seed())).orElse(Map.of());
    }

    /**
     * The Hansen-Jagannathan seeds of several fits: one "hj_distance" entry when they all drew with the
     * same seed (every period of one model file), else one "hj_distance_<n>" per fit, numbered from 1
     * in the order given (models compared side by side with their own seeds).
     */
    public static Map<String, Long> seeds(List<GmmFit> fits) {
        List<Long> used = fits.stream().flatMap(fit -> fit.hj().stream()).map(hj -> hj.seed()).distinct().toList();
        if (used.size() <= 1) {
            return used.isEmpty() ? Map.of() : Map.of("hj_distance", used.get(0));
        }
        Map<String, Long> seeds = new java.util.TreeMap<>();
        for (int i = 0; i < fits.size(); i++) {
            int n = i + 1;
            fits.get(i).hj().ifPresent(hj -> seeds.put("hj_distance_" + n, hj.seed()));
        }
        return seeds;
    }

    /**
     * The manifest of a run over one or more model files.
     *
     * @param run     the run's facts
     * @param specs   each model file's specification as used (after overrides)
     * @param inputs  for each spec, the data files it read (same order as specs)
     * @param outputs the files written into the folder with their SHA-256
     */
    public static ObjectNode of(Run run, List<RunSpec> specs, List<List<InputSummary>> inputs,
            Map<String, String> outputs) {
        ObjectNode root = JsonNodeFactory.instance.objectNode();
        root.put("orthogon_version", run.version());
        root.put("command", run.command());
        ArrayNode arguments = root.putArray("arguments");
        run.arguments().forEach(arguments::add);
        root.put("started", run.started().truncatedTo(ChronoUnit.MILLIS).toString());
        root.put("java_version", System.getProperty("java.version"));
        root.put("java_vendor", System.getProperty("java.vendor"));
        root.put("os", System.getProperty("os.name") + " " + System.getProperty("os.arch"));
        ObjectNode seeds = root.putObject("seeds");
        run.seeds().entrySet().stream().sorted(Map.Entry.comparingByKey())
                .forEach(e -> seeds.put(e.getKey(), e.getValue()));
        ArrayNode models = root.putArray("models");
        for (int i = 0; i < specs.size(); i++) {
            RunSpec spec = specs.get(i);
            ObjectNode model = models.addObject();
            model.put("title", spec.title());
            model.put("family", spec.model().family().id());
            ArrayNode files = model.putArray("inputs");
            file(files.addObject(), "model", spec.modelFile());
            for (InputSummary input : inputs.get(i)) {
                file(files.addObject(), input.role(), input.file());
            }
            options(model.putObject("estimation"), spec.estimation());
        }
        ObjectNode written = root.putObject("outputs");
        outputs.entrySet().stream().sorted(Map.Entry.comparingByKey())
                .forEach(e -> written.put(e.getKey(), e.getValue()));
        return root;
    }

    private static void file(ObjectNode node, String role, Path path) {
        node.put("role", role);
        node.put("path", CheckReport.display(path));
        node.put("sha256", Hashes.sha256(path));
    }

    private static void options(ObjectNode node, RunSpec.EstimationSpec e) {
        node.put("method", e.method().id());
        node.put("initial_weight", e.initialWeight().id());
        node.put("kernel", e.kernel().id());
        BandwidthRule rule = e.bandwidth();
        if (rule instanceof BandwidthRule.Lags lags) {
            node.put("lags", lags.lags());
        } else if (rule instanceof BandwidthRule.Fixed fixed) {
            node.put("bandwidth", fixed.bandwidth());
        } else {
            node.put("bandwidth", e.bandwidthLabel());
        }
        node.put("prewhiten", e.prewhiten());
        node.put("centered", e.centered());
    }
}
