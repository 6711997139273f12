package org.headwater.analysis.sql;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.analysis.sql.LineageAssertions.derived;
import static org.headwater.analysis.sql.LineageAssertions.direct;
import static org.headwater.analysis.sql.LineageAssertions.ref;
import static org.headwater.analysis.sql.LineageAssertions.schema;

import java.util.List;
import java.util.Map;
import org.headwater.analysis.sql.StatementLineage.Kind;
import org.junit.jupiter.api.Test;

/** PostgreSQL and H2 spellings that JSqlParser accepts, each from the dialect's manual (from memory). */
class DialectLineageTest {

    private static final SchemaLookup KNOWN = schema(Map.of("t", List.of("a", "b", "c")));
    private final SqlLineageAnalyzer analyzer = new SqlLineageAnalyzer();

    @Test
    void postgresqlScript() {
        List<StatementLineage> script = analyzer.analyze("""
                create temporary table if not exists staged (a int, b text, c numeric(10, 2) default 0);
                insert into staged (a, b, c)
                  select a, b::text, coalesce(c, 0) from t where b ilike 'x%'
                  on conflict do nothing;
                create view v as select a, string_agg(b, ',' order by c) as bs from staged group by a;
                """, KNOWN);

        assertThat(script).extracting(StatementLineage::kind)
                .containsExactly(Kind.CREATE_TABLE, Kind.INSERT_SELECT, Kind.CREATE_VIEW);
        assertThat(script.get(0).columns()).extracting(OutputColumn::name).containsExactly("a", "b", "c");
        StatementLineage insert = script.get(1);
        assertThat(insert.column("b").origins()).containsExactly(derived("t", "b"));
        assertThat(insert.column("c").origins()).containsExactly(derived("t", "c"));
        assertThat(insert.influencing()).containsExactly(ref("t", "b"));
        // string_agg's ORDER BY orders its input, so c is read into the value
        assertThat(script.get(2).column("bs").origins())
                .containsExactlyInAnyOrder(derived("staged", "b"), derived("staged", "c"));
        assertThat(script).allSatisfy(s -> assertThat(s.warnings()).isEmpty());
    }

    @Test
    void h2Script() {
        List<StatementLineage> script = analyzer.analyze("""
                CREATE MEMORY TABLE PUBLIC.EVENTS(ID BIGINT AUTO_INCREMENT, NAME VARCHAR(100));
                CREATE TABLE PUBLIC.NAMES AS SELECT TOP 10 NAME FROM PUBLIC.EVENTS ORDER BY ID DESC;
                """, SchemaLookup.none());

        assertThat(script).extracting(StatementLineage::kind).containsExactly(Kind.CREATE_TABLE, Kind.CREATE_TABLE_AS);
        StatementLineage names = script.get(1);
        assertThat(names.target()).isEqualTo(LineageAssertions.table("public.names"));
        assertThat(names.column("name").origins()).containsExactly(direct("public.events", "name"));
        // TOP cuts the ordered rows, so the ORDER BY key decides which names are kept
        assertThat(names.influencing()).containsExactly(ref("public.events", "id"));
    }
}
