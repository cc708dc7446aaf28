package org.orthogon.spec;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import tools.jackson.core.JacksonException;
import tools.jackson.databind.JsonNode;
import tools.jackson.dataformat.toml.TomlMapper;

/**
 * The model-file reader's TOML tree against the Jackson TOML module's own {@code TomlMapper.readTree}
 * (the reference: the library's documented way to read TOML into a tree): the same tree, node types
 * included, for every bundled model file and for documents with every TOML value type (TOML 1.0
 * specification, toml.io), and the same refusal, message and line, for broken documents.
 */
class TomlTreeTest {
    private static final TomlMapper REFERENCE = TomlMapper.builder().build();

    @Test
    void everyBundledModelFileGivesTheReferenceTree() throws IOException {
        List<Path> models;
        try (Stream<Path> files = Files.list(Path.of("models"))) {
            models = files.filter(f -> f.toString().endsWith(".toml")).sorted().toList();
        }
        assertThat(models).hasSizeGreaterThan(5);
        for (Path model : models) {
            assertSameTree(Files.readString(model));
        }
    }

    @Test
    void everyValueTypeGivesTheReferenceTree() {
        assertSameTree("""
                title = "basic \\"quoted\\" \\u00e9"
                literal = 'C:\\path'
                multi = \"\"\"
                two
                lines\"\"\"
                small = 42
                negative = -17
                large = 9007199254740993
                largest = 9223372036854775807
                hex = 0xDEADBEEF
                octal = 0o755
                binary = 0b1101
                underscored = 1_000_000
                float = 3.14159
                exponent = -2.5e-3
                big = 1e300
                tiny = 5e-324
                negative_zero = -0.0
                infinite = inf
                minus_infinite = -inf
                not_a_number = nan
                yes = true
                no = false
                when = 1979-05-27T07:32:00-08:00
                local_datetime = 1979-05-27T07:32:00
                day = 1979-05-27
                clock = 07:32:00
                list = [1, 2, 3]
                nested = [[1, 2], ["a", "b"], []]
                floats = [0.1, 0.2, 1e-10]
                inline = { x = 1, y = { z = "deep" } }
                dotted.key.path = "value"

                [data]
                returns = "returns.csv"

                [model.sub]
                factor_columns = ["MKT", "SIZE"]

                [[sample]]
                from = "1962-01"

                [[sample]]
                to = "2024-12"
                """);
        assertSameTree("");
        assertSameTree("# only a comment\n");
    }

    @Test
    void brokenDocumentsAreRefusedAsTheReferenceRefusesThem() {
        int refused = 0;
        for (String broken : List.of("key = ", "a = 1\na = 2\n", "[table\nx = 1", "x = \"open", "x = 1979-13-45",
                "x = [1, 2", "= 3", "x = 99999999999999999999", "[a]\n[a]\n", "x = 1 y = 2")) {
            JacksonException expected = catchThrowableOfType(JacksonException.class, () -> REFERENCE.readTree(broken));
            JacksonException actual = catchThrowableOfType(JacksonException.class, () -> TomlTree.read(broken));
            if (expected == null) { // the module takes a date it does not check as text; then the trees agree
                assertThat(actual).as(broken).isNull();
                assertSameTree(broken);
                continue;
            }
            assertThat(actual).as(broken).isNotNull();
            assertThat(actual.getOriginalMessage()).as(broken).isEqualTo(expected.getOriginalMessage());
            assertThat(actual.getLocation().getLineNr()).as(broken).isEqualTo(expected.getLocation().getLineNr());
            refused++;
        }
        assertThat(refused).isGreaterThanOrEqualTo(8);
    }

    private static void assertSameTree(String toml) {
        JsonNode expected = REFERENCE.readTree(toml);
        JsonNode actual = TomlTree.read(toml);
        if (expected == null || expected.isMissingNode() || expected.isEmpty() && expected.isObject()) {
            assertThat(actual == null || actual.isEmpty()).as(toml).isTrue();
            return;
        }
        assertThat(actual).as(toml).isEqualTo(expected);
        assertSameNodeTypes(expected, actual, "");
    }

    /** equals() of numeric nodes compares values; the node types must match too (an int stays an IntNode). */
    private static void assertSameNodeTypes(JsonNode expected, JsonNode actual, String path) {
        assertThat(actual.getClass()).as(path).isEqualTo(expected.getClass());
        if (expected.isObject()) {
            for (String name : expected.propertyNames()) {
                assertSameNodeTypes(expected.get(name), actual.get(name), path + "." + name);
            }
        } else if (expected.isArray()) {
            for (int i = 0; i < expected.size(); i++) {
                assertSameNodeTypes(expected.get(i), actual.get(i), path + "[" + i + "]");
            }
        }
    }
}
