package org.headwater.ops;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import java.io.IOException;
import java.io.OutputStream;
import java.math.BigDecimal;
import java.time.OffsetDateTime;
import java.util.Locale;
import org.headwater.store.Store;
import org.jooq.Field;
import org.jooq.Record;
import org.jooq.Table;

/**
 * Writes the whole catalog as one JSON document, history included:
 *
 * <pre>
 * {"format": "headwater-catalog", "version": 1,
 *  "tables": {"source": [{"id": 1, "name": "…", …}, …], "harvest": […], …}}
 * </pre>
 *
 * Tables come in dependency order, rows in primary-key order, columns in table order; times are UTC
 * ISO-8601 instants. The same catalog always gives the same bytes, so two exports can be compared.
 */
public final class CatalogExport {
    /** The document's format name and the version of its shape. */
    public static final String FORMAT = "headwater-catalog";
    public static final int VERSION = 1;

    private CatalogExport() {
    }

    /** Writes the document; returns the number of rows written. */
    public static long write(Store store, OutputStream out) throws IOException {
        long rows = 0;
        try (JsonGenerator json = new JsonFactory().createGenerator(out, JsonEncoding.UTF8)) {
            json.useDefaultPrettyPrinter();
            json.writeStartObject();
            json.writeStringField("format", FORMAT);
            json.writeNumberField("version", VERSION);
            json.writeObjectFieldStart("tables");
            for (Table<?> table : CatalogTables.inDependencyOrder()) {
                json.writeArrayFieldStart(CatalogTables.name(table));
                var query = store.dsl().selectFrom(table);
                var ordered = table.getPrimaryKey() == null ? query : query.orderBy(table.getPrimaryKey().getFields());
                try (var cursor = ordered.fetchSize(1000).fetchLazy()) {
                    for (Record r : cursor) {
                        writeRow(json, r);
                        rows++;
                    }
                }
                json.writeEndArray();
            }
            json.writeEndObject();
            json.writeEndObject();
        }
        return rows;
    }

    private static void writeRow(JsonGenerator json, Record r) throws IOException {
        json.writeStartObject();
        for (Field<?> f : r.fields()) {
            Object v = r.get(f);
            String name = f.getName().toLowerCase(Locale.ROOT);
            if (v == null) {
                json.writeNullField(name);
            } else if (v instanceof OffsetDateTime t) {
                json.writeStringField(name, t.toInstant().toString());
            } else if (v instanceof Boolean b) {
                json.writeBooleanField(name, b);
            } else if (v instanceof Integer i) {
                json.writeNumberField(name, i);
            } else if (v instanceof Long l) {
                json.writeNumberField(name, l);
            } else if (v instanceof Double d) {
                json.writeNumberField(name, d);
            } else if (v instanceof BigDecimal d) {
                json.writeNumberField(name, d);
            } else {
                json.writeStringField(name, v.toString());
            }
        }
        json.writeEndObject();
    }
}
