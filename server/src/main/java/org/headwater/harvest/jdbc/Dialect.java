package org.headwater.harvest.jdbc;

import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * What a database needs beyond {@link java.sql.DatabaseMetaData}: catalog queries for row-count estimates
 * and view definitions, the schemas the user may not use, and its system schemas. Each query returns
 * (schema, name, value) rows, or the schema names alone for {@code unusableSchemas}; a null query means
 * the database offers no such thing and the harvest does without. {@code primaryKeys} returns (schema, table,
 * column) in key order; when null, {@code DatabaseMetaData.getPrimaryKeys} is used.
 *
 * @param setup statements run first on the harvest's own connection
 * @param rowEstimateSource where the estimates come from, as recorded in a dataset's details
 */
record Dialect(String word, List<String> setup, String rowEstimates, String rowEstimateSource,
        String viewDefinitions, String primaryKeys, String unusableSchemas, Set<String> systemSchemas, Map<String, String> connectSettings) {

    // search_path '' makes pg_get_viewdef qualify every relation with its schema, so names in view
    // definitions resolve without guessing the search path the view was created under.
    static final Dialect POSTGRESQL = new Dialect("postgresql",
            List.of("set search_path = ''"),
            "select n.nspname, c.relname, case when c.reltuples >= 0 then c.reltuples::bigint else s.n_live_tup end"
                    + " from pg_catalog.pg_class c join pg_catalog.pg_namespace n on n.oid = c.relnamespace"
                    + " left join pg_catalog.pg_stat_all_tables s on s.relid = c.oid"
                    + " where c.relkind in ('r', 'p', 'm', 'f')",
            "pg_class.reltuples, else pg_stat_all_tables.n_live_tup",
            "select n.nspname, c.relname, pg_catalog.pg_get_viewdef(c.oid, true)"
                    + " from pg_catalog.pg_class c join pg_catalog.pg_namespace n on n.oid = c.relnamespace"
                    + " where c.relkind in ('v', 'm')",
            // pgjdbc's getPrimaryKeys takes about 1 s per schema of 200 tables; the catalog answers at once.
            "select n.nspname, c.relname, a.attname from pg_catalog.pg_constraint k"
                    + " join pg_catalog.pg_class c on c.oid = k.conrelid"
                    + " join pg_catalog.pg_namespace n on n.oid = c.relnamespace"
                    + " cross join lateral unnest(k.conkey) with ordinality as key_column(attnum, position)"
                    + " join pg_catalog.pg_attribute a on a.attrelid = c.oid and a.attnum = key_column.attnum"
                    + " where k.contype = 'p' order by n.nspname, c.relname, key_column.position",
            "select nspname from pg_catalog.pg_namespace where not pg_catalog.has_schema_privilege(oid, 'USAGE')",
            Set.of("pg_catalog", "information_schema", "pg_toast"),
            Map.of("connectTimeout", "10", "ApplicationName", "headwater"));

    static final Dialect H2 = new Dialect("h2",
            List.of(),
            "select TABLE_SCHEMA, TABLE_NAME, ROW_COUNT_ESTIMATE from INFORMATION_SCHEMA.TABLES"
                    + " where ROW_COUNT_ESTIMATE is not null",
            "INFORMATION_SCHEMA.TABLES.ROW_COUNT_ESTIMATE",
            "select TABLE_SCHEMA, TABLE_NAME, VIEW_DEFINITION from INFORMATION_SCHEMA.VIEWS",
            null,
            null,
            Set.of("information_schema"),
            Map.of());

    /** Any other database: standard metadata only, no estimates, no view definitions. */
    static final Dialect GENERIC = new Dialect("jdbc", List.of(), null, null, null, null, null,
            Set.of("information_schema"), Map.of());

    /** The dialect for a JDBC URL, so that connection settings can be chosen before connecting. */
    static Dialect forUrl(String jdbcUrl) {
        String url = jdbcUrl.toLowerCase(Locale.ROOT);
        if (url.startsWith("jdbc:postgresql:")) {
            return POSTGRESQL;
        }
        return url.startsWith("jdbc:h2:") ? H2 : GENERIC;
    }

    boolean isSystemSchema(String schema) {
        String s = schema.toLowerCase(Locale.ROOT);
        return systemSchemas.contains(s) || s.startsWith("pg_temp_") || s.startsWith("pg_toast_temp_");
    }
}
