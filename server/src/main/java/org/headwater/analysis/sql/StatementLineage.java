package org.headwater.analysis.sql;

import java.util.List;
import java.util.Objects;
import java.util.Set;

/**
 * The lineage of one statement of a script.
 *
 * @param kind what the statement does
 * @param target the table or view written or defined; null for a bare SELECT or an unparsed statement
 * @param columns the output columns in order, each with its source columns
 * @param influencing columns that decide which rows or groups appear without being copied into
 *     them: WHERE, JOIN ON/USING, GROUP BY, HAVING, QUALIFY, aggregate FILTER, window PARTITION BY
 *     and ORDER BY, DISTINCT ON, and ORDER BY when LIMIT/OFFSET/FETCH cuts the result
 * @param sourceTables every table or view the statement reads (views created earlier in the same
 *     script are looked through, so their own sources appear instead)
 * @param warnings what could not be resolved or was resolved by assumption, in order of discovery
 * @param line the 1-based line of the script on which the statement starts
 */
public record StatementLineage(
        Kind kind,
        QualifiedName target,
        List<OutputColumn> columns,
        Set<ColumnRef> influencing,
        Set<QualifiedName> sourceTables,
        List<String> warnings,
        int line) {

    /** What a statement does, as far as lineage is concerned. */
    public enum Kind {
        CREATE_VIEW,
        CREATE_TABLE_AS,
        INSERT_SELECT,
        CREATE_TABLE,
        SELECT,
        /** The statement could not be parsed; {@code warnings} says why. */
        UNPARSED
    }

    public StatementLineage {
        Objects.requireNonNull(kind, "kind");
        columns = List.copyOf(columns);
        influencing = Set.copyOf(influencing);
        sourceTables = Set.copyOf(sourceTables);
        warnings = List.copyOf(warnings);
    }

    /** The output column called {@code name}, for callers that know the names they expect. */
    public OutputColumn column(String name) {
        return columns.stream()
                .filter(c -> c.name().equals(name))
                .findFirst()
                .orElseThrow(() -> new IllegalArgumentException("no output column " + name + " in " + target));
    }
}
