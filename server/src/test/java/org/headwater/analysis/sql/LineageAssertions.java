package org.headwater.analysis.sql;

import java.util.List;
import java.util.Map;
import java.util.Optional;

/** Small builders that keep the lineage tests' expected values readable. */
final class LineageAssertions {

    private LineageAssertions() {}

    static ColumnRef ref(String table, String column) {
        return new ColumnRef(QualifiedName.of(table.split("\\.")), column);
    }

    static ColumnOrigin direct(String table, String column) {
        return new ColumnOrigin(ref(table, column), false);
    }

    static ColumnOrigin derived(String table, String column) {
        return new ColumnOrigin(ref(table, column), true);
    }

    static QualifiedName table(String dotted) {
        return QualifiedName.of(dotted.split("\\."));
    }

    /** A catalog that knows exactly these tables, by dotted name. */
    static SchemaLookup schema(Map<String, List<String>> tables) {
        return name -> Optional.ofNullable(tables.get(name.toString()));
    }

    static StatementLineage single(String sql, SchemaLookup known) {
        List<StatementLineage> all = new SqlLineageAnalyzer().analyze(sql, known);
        if (all.size() != 1) {
            throw new AssertionError("expected one statement, got " + all);
        }
        return all.get(0);
    }
}
