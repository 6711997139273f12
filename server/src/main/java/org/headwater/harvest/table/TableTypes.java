package org.headwater.harvest.table;

import com.fasterxml.jackson.databind.JsonNode;

/**
 * Type words of the table formats' schema JSON. Primitive types are kept as the format spells them
 * ({@code long}, {@code decimal(10,2)}, {@code timestamptz}); nested types are named by their kind.
 */
final class TableTypes {
    private TableTypes() {
    }

    /** A type node: a string for primitives, an object with {@code type} (struct, array, list, map) for nested ones. */
    static String word(JsonNode type) {
        if (type == null || type.isNull()) {
            return "unknown";
        }
        if (type.isTextual()) {
            return type.asText();
        }
        return type.path("type").asText("unknown");
    }
}
