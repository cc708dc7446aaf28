package org.orthogon.report;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.Writer;
import java.math.BigDecimal;
import java.math.BigInteger;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.orthogon.cli.Main;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.SerializationFeature;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;

/**
 * The results writer's JSON text against Jackson's own object mapper with indented output (the reference:
 * the library's documented way to write a tree), byte for byte, on the results of every verb and on a tree
 * with every kind of value the results can hold.
 */
class JsonTextTest {
    private static final JsonMapper REFERENCE = JsonMapper.builder().enable(SerializationFeature.INDENT_OUTPUT).build();

    @TempDir
    Path dir;

    @Test
    void theResultsOfEveryVerbAreWrittenAsTheMapperWritesThem() throws Exception {
        List<List<String>> runs = List.of(
                List.of("fit", "models/lumen-power-utility.toml"),
                List.of("fit", "models/lumen-three-factor-demeaned.toml"),
                List.of("compare", "models/lumen-three-factor.toml", "models/lumen-market-only.toml"),
                List.of("two-pass", "models/lumen-two-pass.toml"),
                List.of("stability", "models/lumen-three-factor.toml", "--window", "240", "--step", "120"));
        int n = 0;
        for (List<String> run : runs) {
            Path json = dir.resolve("run" + n++ + ".json");
            String[] args = java.util.stream.Stream.concat(run.stream(), java.util.stream.Stream.of("--json",
                    json.toString(), "--quiet")).toArray(String[]::new);
            StringWriter err = new StringWriter();
            int code = Main.run(new PrintWriter(Writer.nullWriter()), new PrintWriter(err), args);
            assertThat(code).as(run + ": " + err).isZero();
            String written = Files.readString(json);
            JsonNode tree = REFERENCE.readTree(written);
            assertThat(written).as(run.toString()).isEqualTo(REFERENCE.writeValueAsString(tree) + "\n");
            assertThat(JsonText.of(tree)).isEqualTo(REFERENCE.writeValueAsString(tree));
        }
    }

    @Test
    void everyKindOfValueIsWrittenAsTheMapperWritesIt() {
        ObjectNode root = JsonNodeFactory.instance.objectNode();
        root.put("text", "quote \" backslash \\ tab \t newline \n é ∑ \u0001");
        root.put("int", -42);
        root.put("long", 9_007_199_254_740_993L);
        root.put("big_integer", new BigInteger("123456789012345678901234567890"));
        root.put("decimal", new BigDecimal("0.000000000000000000001"));
        root.put("double", 0.1 + 0.2);
        root.put("negative_zero", -0.0);
        root.put("whole_double", 3.0);
        root.put("tiny", Double.MIN_VALUE);
        root.put("huge", Double.MAX_VALUE);
        root.put("exponent", 1.5e-12);
        root.put("float", 0.1f);
        root.put("yes", true);
        root.putNull("nothing");
        root.putObject("empty_object");
        root.putArray("empty_array");
        root.putArray("nested").add(1).add(2.5).add("x").addNull().addArray().add(JsonNodeFactory.instance.objectNode()
                .put("deep", List.of(1).size()));
        assertThat(JsonText.of(root)).isEqualTo(REFERENCE.writeValueAsString(root));
        assertThat(JsonText.of(JsonNodeFactory.instance.arrayNode())).isEqualTo(REFERENCE.writeValueAsString(
                JsonNodeFactory.instance.arrayNode()));
    }
}
