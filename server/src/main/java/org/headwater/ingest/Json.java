package org.headwater.ingest;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.util.Collection;
import java.util.List;
import java.util.Map;
import org.headwater.model.ColumnDef;

/** Canonical JSON text for values kept in the store, so that equal facts compare equal as strings. */
public final class Json {
    private static final ObjectMapper CANONICAL = new ObjectMapper()
            .configure(SerializationFeature.ORDER_MAP_ENTRIES_BY_KEYS, true);

    private Json() {
    }

    /** Sorted-key JSON of a map, or null for an empty or absent one. */
    public static String canonical(Map<String, ?> details) {
        if (details == null || details.isEmpty()) {
            return null;
        }
        return write(details);
    }

    /** A column list as a JSON array of {name, dataType, nullable}, or null for no columns known. */
    static String columns(List<ColumnDef> columns) {
        return columns == null ? null : write(columns);
    }

    static String stringArray(Collection<String> values) {
        return write(values);
    }

    private static String write(Object value) {
        try {
            return CANONICAL.writeValueAsString(value);
        } catch (JsonProcessingException e) {
            throw new IllegalArgumentException("Not representable as JSON: " + value, e);
        }
    }
}
