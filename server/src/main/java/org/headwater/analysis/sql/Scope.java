package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;

/**
 * The relations one query level can see, and how a column reference resolves among them.
 * The parent is the enclosing query's scope, for correlated subqueries.
 */
final class Scope {

    private final List<Relation> relations;
    /** Columns that USING or NATURAL joins made one, by name: an unqualified name means them. */
    private final Map<String, RelColumn> joined;
    private final Scope parent;

    Scope(List<Relation> relations, Map<String, RelColumn> joined, Scope parent) {
        this.relations = List.copyOf(relations);
        this.joined = new LinkedHashMap<>(joined);
        this.parent = parent;
    }

    static Scope empty(Scope parent) {
        return new Scope(List.of(), Map.of(), parent);
    }

    List<Relation> relations() {
        return relations;
    }

    /** Whether a bare {@code column} names a known input column at this query level. */
    boolean knows(String column) {
        return joined.containsKey(column) || relations.stream().anyMatch(r -> r.column(column).isPresent());
    }

    /** The origins of {@code qualifier.column} ({@code qualifier} may be null), or none with a warning. */
    Set<ColumnOrigin> resolve(QualifiedName qualifier, String column, Warnings warnings) {
        return qualifier == null ? resolveUnqualified(column, warnings) : resolveQualified(qualifier, column, warnings);
    }

    private Set<ColumnOrigin> resolveQualified(QualifiedName qualifier, String column, Warnings warnings) {
        Optional<Relation> found = relation(qualifier);
        if (found.isEmpty()) {
            warnings.add("no table or alias " + qualifier + " for column " + qualifier + "." + column);
            return Set.of();
        }
        Relation relation = found.get();
        Optional<RelColumn> known = relation.column(column);
        if (known.isPresent()) {
            return known.get().origins();
        }
        if (relation.fallback() == null) {
            warnings.add("column " + column + " is not a column of " + relation.label());
            return Set.of();
        }
        if (relation.complete()) {
            warnings.add("column " + column + " is not among the known columns of " + relation.label()
                    + "; attributed to " + relation.fallback());
        }
        return Set.of(new ColumnOrigin(new ColumnRef(relation.fallback(), column), false));
    }

    /** The relation {@code qualifier} denotes, innermost query level first. */
    Optional<Relation> relation(QualifiedName qualifier) {
        for (Scope scope = this; scope != null; scope = scope.parent) {
            List<Relation> matches = scope.relations.stream().filter(r -> r.isCalled(qualifier)).toList();
            if (!matches.isEmpty()) {
                return Optional.of(matches.get(0));
            }
        }
        return Optional.empty();
    }

    /**
     * Innermost query level first, as SQL resolves names: at each level a name found among known
     * columns wins; failing that, it belongs to the one relation there whose columns are not all
     * known. Failing every level, it goes to the only table of the query, with a warning: never
     * to a guess among several.
     */
    private Set<ColumnOrigin> resolveUnqualified(String column, Warnings warnings) {
        for (Scope scope = this; scope != null; scope = scope.parent) {
            RelColumn usingColumn = scope.joined.get(column);
            if (usingColumn != null) {
                return usingColumn.origins();
            }
            List<Relation> matches = new ArrayList<>();
            for (Relation relation : scope.relations) {
                relation.column(column).ifPresent(c -> matches.add(relation));
            }
            if (matches.size() == 1) {
                return matches.get(0).column(column).orElseThrow().origins();
            }
            if (matches.size() > 1) {
                warnings.add("column " + column + " is ambiguous: it is in "
                        + String.join(" and ", matches.stream().map(Relation::label).toList()));
                return Set.of();
            }
            List<Relation> open = scope.relations.stream().filter(r -> !r.complete() && r.fallback() != null).toList();
            if (open.size() == 1) {
                return Set.of(new ColumnOrigin(new ColumnRef(open.get(0).fallback(), column), false));
            }
            if (open.size() > 1) {
                warnings.add("column " + column + " could be in any of "
                        + String.join(", ", open.stream().map(Relation::label).toList())
                        + ", whose columns are not known; left unresolved");
                return Set.of();
            }
        }
        if (relations.size() == 1 && relations.get(0).fallback() != null) {
            Relation only = relations.get(0);
            warnings.add("column " + column + " is not among the known columns of " + only.label()
                    + "; attributed to " + only.fallback());
            return Set.of(new ColumnOrigin(new ColumnRef(only.fallback(), column), false));
        }
        warnings.add("column " + column + " is not a column of any table in the query; left unresolved");
        return Set.of();
    }

    /** The columns {@code *} stands for: joined columns first, then each relation's others, in order. */
    List<RelColumn> expandAll(Warnings warnings) {
        List<RelColumn> columns = new ArrayList<>(joined.values());
        for (Relation relation : relations) {
            warnIfIncomplete(relation, warnings);
            for (RelColumn column : relation.columns()) {
                if (!joined.containsKey(column.name())) {
                    columns.add(column);
                }
            }
        }
        return columns;
    }

    static void warnIfIncomplete(Relation relation, Warnings warnings) {
        if (!relation.complete()) {
            warnings.add("cannot expand * over " + relation.label() + ": its columns are not known");
        }
    }
}
