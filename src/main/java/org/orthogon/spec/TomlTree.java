package org.orthogon.spec;

import tools.jackson.core.JacksonException;
import tools.jackson.core.JsonParser;
import tools.jackson.core.JsonToken;
import tools.jackson.core.ObjectReadContext;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.node.ArrayNode;
import tools.jackson.databind.node.JsonNodeFactory;
import tools.jackson.databind.node.ObjectNode;
import tools.jackson.dataformat.toml.TomlFactory;

/**
 * A TOML document as a Jackson tree, read with the TOML module's own parser and built node by node.
 * It gives the tree {@code TomlMapper.readTree} gives (TomlTreeTest compares the two on every bundled
 * model file and on documents of every TOML value type) without building an object mapper, whose
 * start-up (deserializer lookup and caches) was the larger part of reading a model file in a
 * command-line run (docs/benchmarks.md). Syntax errors are the parser's, with their line numbers.
 */
final class TomlTree {
    private static final TomlFactory TOML = new TomlFactory();
    private static final JsonNodeFactory NODES = JsonNodeFactory.instance;

    private TomlTree() {
    }

    /**
     * The document's root table, or null for a document without any value.
     *
     * @throws JacksonException for text that is not TOML
     */
    static JsonNode read(String text) {
        try (JsonParser parser = TOML.createParser(ObjectReadContext.empty(), text)) {
            JsonToken first = parser.nextToken();
            return first == null ? null : value(parser, first);
        }
    }

    private static JsonNode value(JsonParser parser, JsonToken token) {
        return switch (token) {
            case START_OBJECT -> {
                ObjectNode table = NODES.objectNode();
                for (JsonToken next = parser.nextToken(); next != JsonToken.END_OBJECT; next = parser.nextToken()) {
                    String key = parser.currentName();
                    table.set(key, value(parser, parser.nextToken()));
                }
                yield table;
            }
            case START_ARRAY -> {
                ArrayNode array = NODES.arrayNode();
                for (JsonToken next = parser.nextToken(); next != JsonToken.END_ARRAY; next = parser.nextToken()) {
                    array.add(value(parser, next));
                }
                yield array;
            }
            case VALUE_STRING -> NODES.stringNode(parser.getString());
            case VALUE_NUMBER_INT -> switch (parser.getNumberType()) {
                case INT -> NODES.numberNode(parser.getIntValue());
                case LONG -> NODES.numberNode(parser.getLongValue());
                default -> NODES.numberNode(parser.getBigIntegerValue());
            };
            case VALUE_NUMBER_FLOAT -> switch (parser.getNumberType()) {
                case BIG_DECIMAL -> NODES.numberNode(parser.getDecimalValue());
                case FLOAT -> NODES.numberNode(parser.getFloatValue());
                default -> NODES.numberNode(parser.getDoubleValue());
            };
            case VALUE_TRUE -> NODES.booleanNode(true);
            case VALUE_FALSE -> NODES.booleanNode(false);
            case VALUE_NULL -> NODES.nullNode();
            case VALUE_EMBEDDED_OBJECT -> NODES.pojoNode(parser.getEmbeddedObject());
            default -> throw new IllegalStateException("unexpected token " + token + " in a TOML tree");
        };
    }
}
