package org.headwater.harvest.jdbc;

import java.util.List;
import org.headwater.model.DatasetKind;

/**
 * One table or view as the database describes it.
 *
 * @param tableType the database's own word (TABLE, BASE TABLE, VIEW, MATERIALIZED VIEW...)
 * @param rowEstimate the row count from the database's statistics, or null when it keeps none
 * @param viewDefinition the view's query as the database prints it, or null for a table
 */
record Relation(String schema, String name, DatasetKind kind, String tableType, String comment,
        List<Column> columns, List<String> primaryKey, List<ForeignKey> foreignKeys, Long rowEstimate,
        String viewDefinition) {

    /** A column with the database's own type name. */
    record Column(String name, String type, boolean nullable, String comment) {
    }

    /** A declared foreign key: these columns reference those of another table. */
    record ForeignKey(String name, List<String> columns, String refSchema, String refTable, List<String> refColumns) {
    }

    String qualified() {
        return schema + "." + name;
    }
}
