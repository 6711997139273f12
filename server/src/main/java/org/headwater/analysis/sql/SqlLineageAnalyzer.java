package org.headwater.analysis.sql;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.Set;

/**
 * Column-level lineage of a SQL script (ANSI, PostgreSQL or H2, as far as JSqlParser accepts it).
 * Statements are analysed in order, each seeing the tables and views the earlier ones created;
 * one that fails to parse yields an {@link StatementLineage.Kind#UNPARSED} record and the rest
 * of the script goes on. Routine bodies (CREATE FUNCTION, DO) are skipped.
 *
 * <p>Origins name the relations the script does not itself define as views: views created
 * earlier in the script are looked through, while tables (also those the script creates) and
 * the views only the catalog knows, through {@link SchemaLookup}, end the trail; the catalog
 * chains such edges itself. Thread-safe: it keeps no state between calls.
 */
public final class SqlLineageAnalyzer {

    /** The lineage of each lineage-bearing statement of {@code sqlScript}, in script order. */
    public List<StatementLineage> analyze(String sqlScript, SchemaLookup known) {
        Objects.requireNonNull(sqlScript, "sqlScript");
        Objects.requireNonNull(known, "known");
        StatementAnalyzer statements = new StatementAnalyzer(new ScriptCatalog(known));
        List<StatementLineage> lineage = new ArrayList<>();
        try (StatementParser parser = new StatementParser()) {
            for (ScriptSplitter.Piece piece : ScriptSplitter.split(sqlScript)) {
                if (StatementParser.isRoutine(piece.text())) {
                    continue;
                }
                StatementParser.Outcome parsed = parser.parse(piece.text());
                if (parsed.statement() == null) {
                    lineage.add(new StatementLineage(StatementLineage.Kind.UNPARSED, null, List.of(), Set.of(), Set.of(),
                            List.of("could not parse statement: " + parsed.error()), piece.line()));
                    continue;
                }
                statements.analyze(parsed.statement(), piece.line()).ifPresent(lineage::add);
            }
        }
        return lineage;
    }
}
