package org.headwater.analysis.sql;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.analysis.sql.LineageAssertions.direct;
import static org.headwater.analysis.sql.LineageAssertions.schema;
import static org.headwater.analysis.sql.LineageAssertions.single;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** How names resolve: case, quoting, ambiguity, and schemas nobody knows. */
class NameResolutionTest {

    private static final SchemaLookup KNOWN = schema(Map.of(
            "a", List.of("id", "x"),
            "b", List.of("id", "y")));

    @Test
    void unquotedIdentifiersFoldToLowerCase() {
        StatementLineage lineage = single("SELECT X AS Total FROM A", KNOWN);

        // expected: PostgreSQL folds unquoted names to lower case (manual 4.1.1 "Identifiers and Key Words")
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("total");
        assertThat(lineage.column("total").origins()).containsExactly(direct("a", "x"));
    }

    @Test
    void quotedIdentifiersKeepTheirCase() {
        StatementLineage lineage = single("select \"Mixed\" as \"Out\" from \"Tbl\"", SchemaLookup.none());

        // expected: quoted identifiers are case-sensitive (same manual section)
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("Out");
        assertThat(lineage.column("Out").origins()).containsExactly(direct("Tbl", "Mixed"));
    }

    @Test
    void anAmbiguousNameIsLeftUnresolvedWithAWarning() {
        StatementLineage lineage = single("select id from a, b", KNOWN);

        assertThat(lineage.column("id").origins()).isEmpty();
        assertThat(lineage.warnings()).containsExactly("column id is ambiguous: it is in a and b");
    }

    @Test
    void aNameOnlyOneKnownTableHasResolvesThere() {
        StatementLineage lineage = single("select y from a, b", KNOWN);

        assertThat(lineage.column("y").origins()).containsExactly(direct("b", "y"));
        assertThat(lineage.warnings()).isEmpty();
    }

    @Test
    void aNameNoKnownTableHasGoesToTheOneUnknownTable() {
        StatementLineage lineage = single("select z from a, mystery", KNOWN);

        assertThat(lineage.column("z").origins()).containsExactly(direct("mystery", "z"));
        assertThat(lineage.warnings()).containsExactly("columns of mystery are not known");
    }

    @Test
    void aNameAmongSeveralUnknownTablesIsLeftUnresolved() {
        StatementLineage lineage = single("select z from m1, m2", SchemaLookup.none());

        assertThat(lineage.column("z").origins()).isEmpty();
        assertThat(lineage.warnings()).contains("column z could be in any of m1, m2, whose columns are not known; left unresolved");
    }

    @Test
    void aNameMissingFromTheOnlyKnownTableIsAttributedToItWithAWarning() {
        StatementLineage lineage = single("select nope from a", KNOWN);

        assertThat(lineage.column("nope").origins()).containsExactly(direct("a", "nope"));
        assertThat(lineage.warnings()).containsExactly("column nope is not among the known columns of a; attributed to a");
    }

    @Test
    void anUnknownQualifierIsReported() {
        StatementLineage lineage = single("select q.x from a", KNOWN);

        assertThat(lineage.columns().get(0).origins()).isEmpty();
        assertThat(lineage.warnings()).containsExactly("no table or alias q for column q.x");
    }

    @Test
    void catalogNamesInAnotherCaseStillMatch() {
        StatementLineage lineage = single("select amount from ledger", schema(Map.of("ledger", List.of("AMOUNT"))));

        assertThat(lineage.columns().get(0).origins()).containsExactly(direct("ledger", "AMOUNT"));
        assertThat(lineage.warnings()).isEmpty();
    }

    @Test
    void innerScopeWinsOverTheEnclosingQuery() {
        StatementLineage lineage = single(
                "select x from a where exists (select 1 from b where id = a.id and y > 0)", KNOWN);

        // expected: correlated names resolve innermost first (SQL:2016 6.6 <identifier chain>, from memory)
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(
                LineageAssertions.ref("b", "id"), LineageAssertions.ref("a", "id"), LineageAssertions.ref("b", "y"));
    }

    @Test
    void aTableCreatedInASchemaIsFoundByItsBareName() {
        List<StatementLineage> script = new SqlLineageAnalyzer().analyze("""
                create table sales.facts (v int);
                select * from facts;
                """, SchemaLookup.none());

        assertThat(script.get(1).columns().get(0).origins()).containsExactly(direct("sales.facts", "v"));
    }
}
