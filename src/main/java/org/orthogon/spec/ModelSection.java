package org.orthogon.spec;

import java.util.List;
import java.util.Optional;
import org.orthogon.data.InputException;
import tools.jackson.databind.JsonNode;

/**
 * One section of a model file as a family reader sees it: typed values, and refusals located at the
 * key's line (or the section header when the key is missing), so every family words its errors the
 * same way.
 */
public final class ModelSection {
    private final ModelFile file;
    private final String name;
    private final JsonNode node;

    ModelSection(ModelFile file, String name, JsonNode node) {
        this.file = file;
        this.name = name;
        this.node = node;
    }

    /** Whether the key is written in the section. */
    public boolean has(String key) {
        return node.has(key);
    }

    /** A string value, or empty when the key is absent; refuses a value that is not a string. */
    public Optional<String> optionalString(String key) {
        return file.optionalString(name, node, key);
    }

    /** A string value that must be present: refused with {@code problem} and {@code fix} when absent. */
    public String requiredString(String key, String problem, String fix) {
        return optionalString(key).orElseThrow(() -> error(key, problem, fix));
    }

    /** A list of names (empty when absent); refuses a value that is not a list of strings or repeats a name. */
    public List<String> stringList(String key) {
        return file.stringList(name, node, key);
    }

    /** One of {@code allowed}, {@code fallback} when absent; refuses anything else with a did-you-mean. */
    public String choice(String key, List<String> allowed, String fallback) {
        return file.choice(name, node, key, allowed, fallback);
    }

    /** true or false, {@code fallback} when absent; refuses any other value. */
    public boolean bool(String key, boolean fallback) {
        return file.bool(name, node, key, fallback);
    }

    /** A refusal about {@code key}, located at its line, or at the section header when it is not written. */
    public InputException error(String key, String problem, String fix) {
        return file.error(name, key, problem, fix);
    }
}
