package org.headwater.ops;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.InputStream;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.headwater.store.Store;
import org.headwater.store.StoreDialect;
import org.jooq.DSLContext;
import org.jooq.Field;
import org.jooq.Table;
import org.jooq.impl.DSL;

/**
 * Loads a {@link CatalogExport} document into an empty store, row by row as exported (the bulk path:
 * history and change log are kept exactly, which re-ingesting observations could not do), in one
 * transaction, then moves each identity column past the highest imported id.
 */
public final class CatalogImport {
    private static final ObjectMapper JSON = new ObjectMapper();

    private CatalogImport() {
    }

    /** The document cannot be imported; the message says why. Nothing was written. */
    public static final class ImportException extends RuntimeException {
        ImportException(String message) {
            super(message);
        }
    }

    /** Imports; returns the number of rows written. */
    public static long read(Store store, InputStream in) throws IOException {
        Map<String, Table<?>> tables = new HashMap<>();
        for (Table<?> t : CatalogTables.inDependencyOrder()) {
            tables.put(CatalogTables.name(t), t);
        }
        for (Table<?> t : tables.values()) {
            if (store.dsl().fetchExists(t)) {
                throw new ImportException("The store is not empty (table " + CatalogTables.name(t)
                        + " has rows): import only into a new catalog");
            }
        }
        try (JsonParser p = JSON.getFactory().createParser(in)) {
            return store.dsl().transactionResult(c -> load(c.dsl(), store.dialect(), tables, p));
        } catch (org.jooq.exception.DataAccessException e) {
            throw e.getCause() instanceof ImportException ie ? ie : e;
        }
    }

    private static long load(DSLContext db, StoreDialect dialect, Map<String, Table<?>> tables, JsonParser p)
            throws IOException {
        expect(p.nextToken() == JsonToken.START_OBJECT, "a JSON object");
        long rows = 0;
        boolean formatSeen = false;
        while (p.nextToken() == JsonToken.FIELD_NAME) {
            String key = p.currentName();
            p.nextToken();
            switch (key) {
                case "format" -> {
                    expect(CatalogExport.FORMAT.equals(p.getValueAsString()), "\"format\": \"" + CatalogExport.FORMAT + "\"");
                    formatSeen = true;
                }
                case "version" -> expect(p.getIntValue() == CatalogExport.VERSION,
                        "\"version\": " + CatalogExport.VERSION + " (this build reads no other)");
                case "tables" -> {
                    expect(formatSeen, "\"format\" before \"tables\"");
                    rows += tables(db, tables, p);
                }
                default -> p.skipChildren();
            }
        }
        for (Table<?> t : tables.values()) {
            restartIdentity(db, dialect, t);
        }
        return rows;
    }

    private static long tables(DSLContext db, Map<String, Table<?>> tables, JsonParser p) throws IOException {
        expect(p.currentToken() == JsonToken.START_OBJECT, "\"tables\" to be an object");
        long rows = 0;
        while (p.nextToken() == JsonToken.FIELD_NAME) {
            String name = p.currentName();
            Table<?> table = tables.get(name);
            expect(table != null, "only tables this catalog has; \"" + name + "\" is not one of them");
            expect(p.nextToken() == JsonToken.START_ARRAY, "\"" + name + "\" to be an array of rows");
            Map<String, Field<?>> fields = new HashMap<>();
            for (Field<?> f : table.fields()) {
                fields.put(f.getName().toLowerCase(Locale.ROOT), f);
            }
            while (p.nextToken() == JsonToken.START_OBJECT) {
                JsonNode row = JSON.readTree(p);
                var insert = db.insertInto(table).set(values(name, fields, row));
                insert.execute();
                rows++;
            }
        }
        return rows;
    }

    private static Map<Field<?>, Object> values(String table, Map<String, Field<?>> fields, JsonNode row) {
        Map<Field<?>, Object> values = new HashMap<>();
        row.fields().forEachRemaining(e -> {
            Field<?> f = fields.get(e.getKey());
            expect(f != null, "only columns table " + table + " has; \"" + e.getKey() + "\" is not one of them");
            values.put(f, value(f, e.getValue()));
        });
        return values;
    }

    private static Object value(Field<?> f, JsonNode v) {
        if (v.isNull()) {
            return null;
        }
        Class<?> type = f.getType();
        if (type == OffsetDateTime.class) {
            return OffsetDateTime.ofInstant(Instant.parse(v.asText()), ZoneOffset.UTC);
        }
        if (type == Long.class) {
            return v.asLong();
        }
        if (type == Integer.class) {
            return v.asInt();
        }
        if (type == Double.class) {
            return v.asDouble();
        }
        if (type == Boolean.class) {
            return v.asBoolean();
        }
        return v.asText();
    }

    private static void restartIdentity(DSLContext db, StoreDialect dialect, Table<?> table) {
        if (table.getIdentity() == null) {
            return;
        }
        Field<?> id = table.getIdentity().getField();
        Long max = db.select(DSL.max(id.coerce(Long.class))).from(table).fetchOne(0, Long.class);
        if (max == null) {
            return;
        }
        String t = CatalogTables.name(table);
        String c = id.getName().toLowerCase(Locale.ROOT);
        if (dialect == StoreDialect.POSTGRESQL) {
            db.fetch("select setval(pg_get_serial_sequence(?, ?), ?)", t, c, max);
        } else {
            db.execute("alter table " + t + " alter column " + c + " restart with " + (max + 1));
        }
    }

    private static void expect(boolean ok, String what) {
        if (!ok) {
            throw new ImportException("Not a Headwater catalog export: expected " + what);
        }
    }

    static List<String> tableNames() {
        return CatalogTables.inDependencyOrder().stream().map(CatalogTables::name).toList();
    }
}
