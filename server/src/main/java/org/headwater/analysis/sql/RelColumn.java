package org.headwater.analysis.sql;

import java.util.Set;

/** A column of a relation a query reads, with the source columns its values come from. */
record RelColumn(String name, Set<ColumnOrigin> origins) {

    RelColumn {
        origins = Set.copyOf(origins);
    }

    /** The same column under another name, as a column alias list renames it. */
    RelColumn renamed(String newName) {
        return new RelColumn(newName, origins);
    }

    /** A column of a base table: its only origin is itself, copied as is. */
    static RelColumn ofTable(QualifiedName table, String name) {
        return new RelColumn(name, Set.of(new ColumnOrigin(new ColumnRef(table, name), false)));
    }
}
