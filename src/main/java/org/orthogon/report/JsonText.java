package org.orthogon.report;

import java.io.StringWriter;
import java.util.Map;
import tools.jackson.core.JsonGenerator;
import tools.jackson.core.ObjectWriteContext;
import tools.jackson.core.PrettyPrinter;
import tools.jackson.core.json.JsonFactory;
import tools.jackson.core.util.DefaultPrettyPrinter;
import tools.jackson.databind.JsonNode;

/**
 * A JSON tree as indented text, written token by token with Jackson's generator and default pretty printer:
 * the bytes an object mapper with indented output writes (JsonTextTest compares them on the results of
 * every verb), without building a mapper, whose start-up was a visible part of a short command-line run
 * (docs/benchmarks.md).
 */
final class JsonText {
    private static final JsonFactory JSON = new JsonFactory();

    private JsonText() {
    }

    /** The indented JSON text of {@code node}, without a final newline. */
    static String of(JsonNode node) {
        StringWriter out = new StringWriter();
        ObjectWriteContext indented = new ObjectWriteContext.Base() {
            @Override
            public PrettyPrinter getPrettyPrinter() {
                return new DefaultPrettyPrinter();
            }

            @Override
            public boolean hasPrettyPrinter() {
                return true;
            }
        };
        try (JsonGenerator generator = JSON.createGenerator(indented, out)) {
            write(generator, node);
        }
        return out.toString();
    }

    private static void write(JsonGenerator generator, JsonNode node) {
        switch (node.getNodeType()) {
            case OBJECT -> {
                generator.writeStartObject();
                for (Map.Entry<String, JsonNode> property : node.properties()) {
                    generator.writeName(property.getKey());
                    write(generator, property.getValue());
                }
                generator.writeEndObject();
            }
            case ARRAY -> {
                generator.writeStartArray();
                for (JsonNode element : node) {
                    write(generator, element);
                }
                generator.writeEndArray();
            }
            case STRING -> generator.writeString(node.asString());
            case BOOLEAN -> generator.writeBoolean(node.booleanValue());
            case NULL -> generator.writeNull();
            case NUMBER -> {
                if (node.isInt() || node.isShort()) {
                    generator.writeNumber(node.intValue());
                } else if (node.isLong()) {
                    generator.writeNumber(node.longValue());
                } else if (node.isBigInteger()) {
                    generator.writeNumber(node.bigIntegerValue());
                } else if (node.isBigDecimal()) {
                    generator.writeNumber(node.decimalValue());
                } else if (node.isFloat()) {
                    generator.writeNumber(node.floatValue());
                } else {
                    generator.writeNumber(node.doubleValue());
                }
            }
            default -> throw new IllegalArgumentException("no JSON text for a " + node.getNodeType() + " node");
        }
    }
}
