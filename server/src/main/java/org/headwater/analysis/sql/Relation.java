package org.headwater.analysis.sql;

import java.util.List;
import java.util.Optional;

/**
 * A relation a query's FROM clause makes visible.
 *
 * @param alias the alias it was given, or null
 * @param name the table, view or CTE name it was referenced by, or null for a subquery
 * @param columns its columns as far as known
 * @param complete whether {@code columns} is known to be all of them
 * @param fallback the table a column missing from {@code columns} is attributed to: the table
 *     itself for a base table, the table behind an unexpandable {@code *} for a subquery, else null
 */
record Relation(String alias, QualifiedName name, List<RelColumn> columns, boolean complete, QualifiedName fallback) {

    Relation {
        columns = List.copyOf(columns);
    }

    static Relation derived(String alias, QualifiedName name, QueryResult query) {
        return new Relation(alias, name, query.columns(), query.openTable() == null, query.openTable());
    }

    /** Whether {@code qualifier} (as in {@code qualifier.column}) denotes this relation. */
    boolean isCalled(QualifiedName qualifier) {
        if (alias != null) {
            return qualifier.parts().size() == 1 && qualifier.name().equals(alias);
        }
        return name != null && (qualifier.isSuffixOf(name) || name.isSuffixOf(qualifier));
    }

    Optional<RelColumn> column(String columnName) {
        return Identifiers.indexOf(columns.stream().map(RelColumn::name).toList(), columnName).map(columns::get);
    }

    /** How warnings name it. */
    String label() {
        return alias != null ? alias : name != null ? name.toString() : "subquery";
    }
}
