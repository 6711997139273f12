package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.List;
import java.util.Set;

/**
 * What analysing a query yields. {@code openTable} is set when {@code columns} is incomplete
 * because the query selects {@code *} from a table whose columns are unknown: a name the list
 * lacks is then taken to be a column of that table.
 */
record QueryResult(
        List<RelColumn> columns, QualifiedName openTable, Set<ColumnRef> influencing, Set<QualifiedName> sources) {

    QueryResult {
        columns = List.copyOf(columns);
        influencing = Set.copyOf(influencing);
        sources = Set.copyOf(sources);
    }

    /** The same result with columns renamed by a column alias list, as far as the list goes. */
    QueryResult renamed(List<String> names, Warnings warnings, String what) {
        if (names.isEmpty()) {
            return this;
        }
        if (names.size() != columns.size() && openTable == null) {
            warnings.add(what + " names " + names.size() + " columns but its query has " + columns.size());
        }
        List<RelColumn> renamed = new ArrayList<>();
        for (int i = 0; i < columns.size(); i++) {
            renamed.add(i < names.size() ? columns.get(i).renamed(names.get(i)) : columns.get(i));
        }
        return new QueryResult(renamed, openTable, influencing, sources);
    }
}
