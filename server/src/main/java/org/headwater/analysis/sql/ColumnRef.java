package org.headwater.analysis.sql;

import java.util.Objects;

/** A column of a named table or view. */
public record ColumnRef(QualifiedName table, String column) {

    public ColumnRef {
        Objects.requireNonNull(table, "table");
        Objects.requireNonNull(column, "column");
    }

    @Override
    public String toString() {
        return table + "." + column;
    }
}
