package org.headwater.harvest.jdbc;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Function;
import org.headwater.analysis.sql.ColumnOrigin;
import org.headwater.analysis.sql.ColumnRef;
import org.headwater.analysis.sql.OutputColumn;
import org.headwater.analysis.sql.QualifiedName;
import org.headwater.analysis.sql.SchemaLookup;
import org.headwater.analysis.sql.SqlLineageAnalyzer;
import org.headwater.analysis.sql.StatementLineage;
import org.headwater.ingest.Observation.ColumnFlow;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.model.Evidence;

/**
 * Column lineage of database views: each view's definition, as the database prints it, goes through the
 * SQL analyzer with the database's own tables and views as the schema lookup. Every view is analysed on
 * its own, so its origins name the relations it reads directly (a view over a view points at that view,
 * which has its own edges), and every edge is {@code static} evidence without a script: the definition is
 * code read, not a run observed.
 */
final class ViewLineage {

    /** The edges into one view, or why there are none. */
    record Result(List<EdgeSeen> edges, String problem) {
    }

    private final SqlLineageAnalyzer analyzer = new SqlLineageAnalyzer();
    private final RelationNames names;
    private final Function<Relation, String> uriOf;

    ViewLineage(List<Relation> relations, Function<Relation, String> uriOf) {
        this.names = new RelationNames(relations);
        this.uriOf = uriOf;
    }

    Result of(Relation view) {
        if (view.viewDefinition() == null) {
            return new Result(List.of(), "the database gave no definition for view " + view.qualified());
        }
        SchemaLookup lookup = table -> names.find(table, view.schema())
                .map(r -> r.columns().stream().map(Relation.Column::name).toList());
        String definition = view.viewDefinition().strip();
        String statement = "CREATE VIEW " + quote(view.schema()) + "." + quote(view.name()) + " AS " + definition;
        List<StatementLineage> analysed = analyzer.analyze(statement, lookup);
        Optional<StatementLineage> found = analysed.stream()
                .filter(s -> s.kind() == StatementLineage.Kind.CREATE_VIEW).findFirst();
        if (found.isEmpty()) {
            String why = analysed.isEmpty() ? "nothing to analyse" : String.join("; ", analysed.get(0).warnings());
            return new Result(List.of(), "cannot analyse the definition of view " + view.qualified() + ": " + why);
        }
        StatementLineage lineage = found.get();
        String target = uriOf.apply(view);
        Map<String, List<ColumnFlow>> bySource = new LinkedHashMap<>();
        List<String> unknown = new ArrayList<>();
        for (QualifiedName table : lineage.sourceTables()) {
            sourceUri(table, view, unknown).ifPresent(u -> bySource.computeIfAbsent(u, k -> new ArrayList<>()));
        }
        // Output columns take the view's own column names, position by position, as the database lists them.
        List<String> viewColumns = view.columns().stream().map(Relation.Column::name).toList();
        for (OutputColumn c : lineage.columns()) {
            String targetColumn = c.ordinal() <= viewColumns.size() ? viewColumns.get(c.ordinal() - 1) : c.name();
            for (ColumnOrigin o : c.origins()) {
                add(bySource, o.source(), view, unknown,
                        new ColumnFlow(columnName(o.source(), view), targetColumn,
                                o.derived() ? ColumnRole.DERIVED : ColumnRole.DIRECT));
            }
        }
        for (ColumnRef i : lineage.influencing()) {
            add(bySource, i, view, unknown, new ColumnFlow(columnName(i, view), null, ColumnRole.INFLUENCING));
        }
        List<EdgeSeen> edges = new ArrayList<>();
        bySource.forEach((source, flows) -> {
            if (!source.equals(target)) {
                edges.add(new EdgeSeen(source, target, null, null, null, Evidence.STATIC, 1.0, flows));
            }
        });
        String problem = unknown.isEmpty() ? null
                : "view " + view.qualified() + " reads relations the harvest did not see: " + String.join(", ", unknown);
        return new Result(edges, problem);
    }

    private void add(Map<String, List<ColumnFlow>> bySource, ColumnRef ref, Relation view, List<String> unknown,
            ColumnFlow flow) {
        sourceUri(ref.table(), view, unknown).ifPresent(u -> bySource.computeIfAbsent(u, k -> new ArrayList<>()).add(flow));
    }

    private Optional<String> sourceUri(QualifiedName table, Relation view, List<String> unknown) {
        Optional<Relation> r = names.find(table, view.schema());
        if (r.isEmpty() && !unknown.contains(table.toString())) {
            unknown.add(table.toString());
        }
        return r.map(uriOf);
    }

    /** The column's name as the database spells it (the analyzer lower-cases unquoted names). */
    private String columnName(ColumnRef ref, Relation view) {
        return names.find(ref.table(), view.schema())
                .flatMap(r -> r.columns().stream().map(Relation.Column::name)
                        .filter(n -> n.equals(ref.column())).findFirst()
                        .or(() -> r.columns().stream().map(Relation.Column::name)
                                .filter(n -> n.equalsIgnoreCase(ref.column())).findFirst()))
                .orElse(ref.column());
    }

    private static String quote(String identifier) {
        return "\"" + identifier.replace("\"", "\"\"") + "\"";
    }
}
