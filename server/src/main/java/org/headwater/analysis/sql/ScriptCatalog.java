package org.headwater.analysis.sql;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

/**
 * The tables and views a script has defined so far, in front of what the catalog already knows.
 * Views are kept with their analysed query so later statements look through them to the tables
 * beneath; tables (including materialised views) keep only their column names, because their
 * rows are stored and lineage stops at them.
 */
final class ScriptCatalog {

    /** Something the script defined. */
    sealed interface Definition permits TableDefinition, ViewDefinition {
        QualifiedName name();

        List<String> columnNames();
    }

    record TableDefinition(QualifiedName name, List<String> columnNames) implements Definition {
        TableDefinition {
            columnNames = List.copyOf(columnNames);
        }
    }

    record ViewDefinition(QualifiedName name, QueryResult query) implements Definition {
        @Override
        public List<String> columnNames() {
            return query.columns().stream().map(RelColumn::name).toList();
        }
    }

    private final SchemaLookup known;
    private final Map<QualifiedName, Definition> defined = new LinkedHashMap<>();

    ScriptCatalog(SchemaLookup known) {
        this.known = known;
    }

    void define(Definition definition) {
        defined.remove(definition.name());
        defined.put(definition.name(), definition);
    }

    void drop(QualifiedName reference) {
        find(reference).ifPresent(d -> defined.remove(d.name()));
    }

    /**
     * The script's definition {@code reference} denotes: the same name, else the only one that
     * agrees with it on the trailing parts ({@code t} for {@code s.t}), since the script's search
     * path is not known.
     */
    Optional<Definition> find(QualifiedName reference) {
        Definition exact = defined.get(reference);
        if (exact != null) {
            return Optional.of(exact);
        }
        List<Definition> candidates = defined.values().stream()
                .filter(d -> reference.isSuffixOf(d.name()) || d.name().isSuffixOf(reference))
                .toList();
        return candidates.size() == 1 ? Optional.of(candidates.get(0)) : Optional.empty();
    }

    /** The columns of a table or view the catalog knows from before the script. */
    Optional<List<String>> catalogColumns(QualifiedName reference) {
        return known.columnsOf(reference).map(List::copyOf);
    }

    /** The columns of a table or view, from the script first, then from the catalog. */
    Optional<List<String>> columnsOf(QualifiedName reference) {
        Optional<Definition> definition = find(reference);
        if (definition.isPresent()) {
            return Optional.of(definition.get().columnNames());
        }
        return known.columnsOf(reference).map(List::copyOf);
    }
}
