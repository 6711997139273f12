package org.headwater.harvest.jdbc;

import java.sql.Connection;
import java.sql.DatabaseMetaData;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import org.headwater.model.DatasetKind;

/**
 * Reads a database's structure through {@link DatabaseMetaData}, one schema at a time with one call per kind
 * of fact (tables, columns, primary keys, foreign keys), plus the dialect's catalog queries for row-count
 * estimates and view definitions. Only metadata is read; never a row of a user's table.
 */
final class MetadataReader {

    /** What one pass over the database found. */
    record Snapshot(String product, String productVersion, List<Relation> relations, Set<String> readSchemas,
            Map<String, String> unreadableSchemas, int excluded) {
    }

    /** The database's table-type words this harvester keeps, and the dataset kind each becomes. */
    private static final Map<String, DatasetKind> KINDS = Map.of(
            "TABLE", DatasetKind.TABLE,
            "BASE TABLE", DatasetKind.TABLE,
            "PARTITIONED TABLE", DatasetKind.TABLE,
            "FOREIGN TABLE", DatasetKind.TABLE,
            "VIEW", DatasetKind.VIEW,
            "MATERIALIZED VIEW", DatasetKind.VIEW);

    private final Dialect dialect;
    private final TableGlobs globs;

    MetadataReader(Dialect dialect, TableGlobs globs) {
        this.dialect = dialect;
        this.globs = globs;
    }

    Snapshot read(Connection connection) throws SQLException {
        DatabaseMetaData meta = connection.getMetaData();
        String catalog = connection.getCatalog();
        Set<String> unusable = names(connection, dialect.unusableSchemas());
        Map<String, Long> estimates = byName(connection, dialect.rowEstimates(), true);
        Map<String, String> definitions = byName(connection, dialect.viewDefinitions(), false);
        Map<String, List<String>> keys = keyColumns(connection, dialect.primaryKeys());
        List<Relation> relations = new ArrayList<>();
        Set<String> read = new TreeSet<>();
        Map<String, String> unreadable = new TreeMap<>();
        int excluded = 0;
        for (String schema : schemas(meta)) {
            if (unusable.contains(schema)) {
                unreadable.put(schema, "permission denied for schema " + schema
                        + ": the harvest user has no USAGE on it; its tables were not read and keep their previous state");
                continue;
            }
            try {
                SchemaRead one = readSchema(meta, catalog, schema, estimates, definitions, keys);
                relations.addAll(one.relations);
                excluded += one.excluded;
                read.add(schema);
            } catch (SQLException e) {
                unreadable.put(schema, "cannot read schema " + schema + ": " + e.getMessage());
            }
        }
        return new Snapshot(meta.getDatabaseProductName(), meta.getDatabaseProductVersion(), relations, read,
                unreadable, excluded);
    }

    private record SchemaRead(List<Relation> relations, int excluded) {
    }

    private SchemaRead readSchema(DatabaseMetaData meta, String catalog, String schema, Map<String, Long> estimates,
            Map<String, String> definitions, Map<String, List<String>> keys) throws SQLException {
        String pattern = escape(meta, schema);
        Map<String, String[]> tables = new LinkedHashMap<>(); // name -> {type, comment}
        int excluded = 0;
        try (ResultSet rs = meta.getTables(catalog, pattern, "%", null)) {
            while (rs.next()) {
                if (!schema.equals(rs.getString("TABLE_SCHEM"))) {
                    continue;
                }
                String name = rs.getString("TABLE_NAME");
                String type = rs.getString("TABLE_TYPE");
                if (type == null || !KINDS.containsKey(type.toUpperCase(Locale.ROOT))) {
                    continue;
                }
                if (!globs.accepts(schema, name)) {
                    excluded++;
                    continue;
                }
                tables.put(name, new String[] {type.toUpperCase(Locale.ROOT), blankToNull(rs.getString("REMARKS"))});
            }
        }
        Map<String, List<Relation.Column>> columns = new HashMap<>();
        try (ResultSet rs = meta.getColumns(catalog, pattern, "%", "%")) {
            while (rs.next()) {
                String table = rs.getString("TABLE_NAME");
                if (!schema.equals(rs.getString("TABLE_SCHEM")) || !tables.containsKey(table)) {
                    continue;
                }
                columns.computeIfAbsent(table, k -> new ArrayList<>()).add(new Relation.Column(rs.getString("COLUMN_NAME"),
                        rs.getString("TYPE_NAME"), rs.getInt("NULLABLE") != DatabaseMetaData.columnNoNulls,
                        blankToNull(rs.getString("REMARKS"))));
            }
        }
        Map<String, List<String>> primaryKeys = keys != null ? inSchema(keys, schema)
                : primaryKeys(meta, catalog, schema, tables.keySet());
        Map<String, List<Relation.ForeignKey>> foreignKeys = foreignKeys(meta, catalog, schema, tables.keySet());
        List<Relation> relations = new ArrayList<>();
        for (Map.Entry<String, String[]> t : tables.entrySet()) {
            String key = schema + "." + t.getKey();
            DatasetKind kind = KINDS.get(t.getValue()[0]);
            relations.add(new Relation(schema, t.getKey(), kind, t.getValue()[0], t.getValue()[1],
                    columns.getOrDefault(t.getKey(), List.of()), primaryKeys.getOrDefault(t.getKey(), List.of()),
                    foreignKeys.getOrDefault(t.getKey(), List.of()),
                    kind == DatasetKind.TABLE || t.getValue()[0].equals("MATERIALIZED VIEW") ? estimates.get(key) : null,
                    kind == DatasetKind.VIEW ? definitions.get(key) : null));
        }
        return new SchemaRead(relations, excluded);
    }

    /** Primary keys of the whole schema in one call where the driver allows a null table name, else per table. */
    private static Map<String, List<String>> primaryKeys(DatabaseMetaData meta, String catalog, String schema,
            Set<String> tables) throws SQLException {
        Map<String, TreeMap<Integer, String>> keys = new HashMap<>();
        KeyReader pk = table -> {
            try (ResultSet rs = meta.getPrimaryKeys(catalog, schema, table)) {
                while (rs.next()) {
                    keys.computeIfAbsent(rs.getString("TABLE_NAME"), k -> new TreeMap<>())
                            .put(rs.getInt("KEY_SEQ"), rs.getString("COLUMN_NAME"));
                }
            }
        };
        readKeys(pk, tables);
        Map<String, List<String>> out = new HashMap<>();
        keys.forEach((t, cols) -> out.put(t, List.copyOf(cols.values())));
        return out;
    }

    private static Map<String, List<Relation.ForeignKey>> foreignKeys(DatabaseMetaData meta, String catalog,
            String schema, Set<String> tables) throws SQLException {
        // table -> key name -> (seq -> {column, refSchema, refTable, refColumn})
        Map<String, Map<String, TreeMap<Integer, String[]>>> keys = new HashMap<>();
        KeyReader fk = table -> {
            try (ResultSet rs = meta.getImportedKeys(catalog, schema, table)) {
                while (rs.next()) {
                    String name = rs.getString("FK_NAME");
                    String refTable = rs.getString("PKTABLE_NAME");
                    keys.computeIfAbsent(rs.getString("FKTABLE_NAME"), k -> new TreeMap<>())
                            .computeIfAbsent(name != null ? name : refTable, k -> new TreeMap<>())
                            .put(rs.getInt("KEY_SEQ"), new String[] {rs.getString("FKCOLUMN_NAME"),
                                    rs.getString("PKTABLE_SCHEM"), refTable, rs.getString("PKCOLUMN_NAME")});
                }
            }
        };
        readKeys(fk, tables);
        Map<String, List<Relation.ForeignKey>> out = new HashMap<>();
        keys.forEach((table, byName) -> byName.forEach((name, parts) -> {
            String[] first = parts.firstEntry().getValue();
            out.computeIfAbsent(table, k -> new ArrayList<>()).add(new Relation.ForeignKey(name,
                    parts.values().stream().map(p -> p[0]).toList(), first[1], first[2],
                    parts.values().stream().map(p -> p[3]).toList()));
        }));
        return out;
    }

    @FunctionalInterface
    private interface KeyReader {
        void read(String table) throws SQLException;
    }

    private static void readKeys(KeyReader reader, Set<String> tables) throws SQLException {
        if (tables.isEmpty()) {
            return;
        }
        try {
            reader.read(null);
        } catch (SQLException e) {
            // JDBC asks for an exact table name; drivers that insist get one call per table.
            for (String table : tables) {
                reader.read(table);
            }
        }
    }

    private List<String> schemas(DatabaseMetaData meta) throws SQLException {
        List<String> schemas = new ArrayList<>();
        try (ResultSet rs = meta.getSchemas()) {
            while (rs.next()) {
                String schema = rs.getString("TABLE_SCHEM");
                if (schema != null && !dialect.isSystemSchema(schema)) {
                    schemas.add(schema);
                }
            }
        }
        return schemas;
    }

    private static Set<String> names(Connection connection, String sql) throws SQLException {
        Set<String> names = new TreeSet<>();
        if (sql == null) {
            return names;
        }
        try (Statement s = connection.createStatement(); ResultSet rs = s.executeQuery(sql)) {
            while (rs.next()) {
                names.add(rs.getString(1));
            }
        }
        return names;
    }

    /** Rows of (schema, name, value) keyed by {@code schema.name}. */
    @SuppressWarnings("unchecked")
    private static <T> Map<String, T> byName(Connection connection, String sql, boolean number) throws SQLException {
        Map<String, T> values = new HashMap<>();
        if (sql == null) {
            return values;
        }
        try (Statement s = connection.createStatement(); ResultSet rs = s.executeQuery(sql)) {
            while (rs.next()) {
                Object value = number ? (Object) rs.getObject(3) : rs.getString(3);
                if (value == null) {
                    continue;
                }
                values.put(rs.getString(1) + "." + rs.getString(2),
                        (T) (number ? Long.valueOf(((Number) value).longValue()) : value));
            }
        }
        return values;
    }

    /** Rows of (schema, table, column) in key order, as lists keyed by {@code schema.table}; null without a query. */
    private static Map<String, List<String>> keyColumns(Connection connection, String sql) throws SQLException {
        if (sql == null) {
            return null;
        }
        Map<String, List<String>> keys = new HashMap<>();
        try (Statement s = connection.createStatement(); ResultSet rs = s.executeQuery(sql)) {
            while (rs.next()) {
                keys.computeIfAbsent(rs.getString(1) + "\u0000" + rs.getString(2), k -> new ArrayList<>()).add(rs.getString(3));
            }
        }
        return keys;
    }

    private static Map<String, List<String>> inSchema(Map<String, List<String>> keys, String schema) {
        Map<String, List<String>> out = new HashMap<>();
        String prefix = schema + "\u0000";
        keys.forEach((k, v) -> {
            if (k.startsWith(prefix)) {
                out.put(k.substring(prefix.length()), List.copyOf(v));
            }
        });
        return out;
    }

    private static String escape(DatabaseMetaData meta, String schema) throws SQLException {
        String esc = meta.getSearchStringEscape();
        if (esc == null || esc.isEmpty()) {
            return schema;
        }
        return schema.replace(esc, esc + esc).replace("_", esc + "_").replace("%", esc + "%");
    }

    private static String blankToNull(String s) {
        return s == null || s.isBlank() ? null : s;
    }
}
