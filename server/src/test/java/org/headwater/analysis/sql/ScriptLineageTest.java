package org.headwater.analysis.sql;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.analysis.sql.LineageAssertions.derived;
import static org.headwater.analysis.sql.LineageAssertions.direct;
import static org.headwater.analysis.sql.LineageAssertions.ref;
import static org.headwater.analysis.sql.LineageAssertions.schema;
import static org.headwater.analysis.sql.LineageAssertions.table;

import java.util.List;
import java.util.Map;
import org.headwater.analysis.sql.StatementLineage.Kind;
import org.junit.jupiter.api.Test;

/** Whole scripts: statement kinds, schemas created along the way, errors that do not stop the script. */
class ScriptLineageTest {

    private final SqlLineageAnalyzer analyzer = new SqlLineageAnalyzer();

    @Test
    void createTableYieldsItsColumnsWithoutOriginsAndFeedsLaterStatements() {
        List<StatementLineage> script = analyzer.analyze("""
                create table raw_events (id bigint primary key, kind varchar(20), payload text);
                create view kinds as select kind, count(*) as n from raw_events group by kind;
                """, SchemaLookup.none());

        assertThat(script).extracting(StatementLineage::kind).containsExactly(Kind.CREATE_TABLE, Kind.CREATE_VIEW);
        StatementLineage table = script.get(0);
        assertThat(table.target()).isEqualTo(table("raw_events"));
        assertThat(table.columns()).extracting(OutputColumn::name).containsExactly("id", "kind", "payload");
        assertThat(table.columns()).allSatisfy(c -> assertThat(c.origins()).isEmpty());
        assertThat(table.sourceTables()).isEmpty();

        StatementLineage view = script.get(1);
        assertThat(view.target()).isEqualTo(table("kinds"));
        assertThat(view.column("kind").origins()).containsExactly(direct("raw_events", "kind"));
        assertThat(view.warnings()).isEmpty();
    }

    @Test
    void starOverATableCreatedEarlierInTheScriptExpands() {
        List<StatementLineage> script = analyzer.analyze("""
                create table t (a int, b int);
                create table t2 as select * from t;
                """, SchemaLookup.none());

        StatementLineage ctas = script.get(1);
        assertThat(ctas.kind()).isEqualTo(Kind.CREATE_TABLE_AS);
        assertThat(ctas.target()).isEqualTo(table("t2"));
        assertThat(ctas.columns()).extracting(OutputColumn::name).containsExactly("a", "b");
        assertThat(ctas.column("b").origins()).containsExactly(direct("t", "b"));
        assertThat(ctas.warnings()).isEmpty();
    }

    @Test
    void viewsCreatedInTheScriptAreLookedThroughButTablesAreNot() {
        List<StatementLineage> script = analyzer.analyze("""
                create view paid as select id, amount * 100 as cents from orders where status = 'paid';
                create table paid_copy as select id, cents from paid;
                create view report as select p.id, c.cents from paid p join paid_copy c on c.id = p.id;
                """, schema(Map.of("orders", List.of("id", "amount", "status"))));

        StatementLineage report = script.get(2);
        // the view is inlined (no rows of its own); the CTAS table stores rows, so lineage stops at it
        assertThat(report.column("id").origins()).containsExactly(direct("orders", "id"));
        assertThat(report.column("cents").origins()).containsExactly(direct("paid_copy", "cents"));
        assertThat(report.sourceTables()).containsExactlyInAnyOrder(table("orders"), table("paid_copy"));
        assertThat(report.influencing()).containsExactlyInAnyOrder(
                ref("orders", "status"), ref("paid_copy", "id"), ref("orders", "id"));
    }

    @Test
    void insertSelectMapsToTheInsertColumnList() {
        StatementLineage insert = LineageAssertions.single("""
                insert into summary (total, who) select sum(amount), customer_id from orders group by customer_id""",
                schema(Map.of("orders", List.of("customer_id", "amount"))));

        assertThat(insert.kind()).isEqualTo(Kind.INSERT_SELECT);
        assertThat(insert.target()).isEqualTo(table("summary"));
        assertThat(insert.columns()).extracting(OutputColumn::name).containsExactly("total", "who");
        assertThat(insert.column("total").origins()).containsExactly(derived("orders", "amount"));
        assertThat(insert.column("who").origins()).containsExactly(direct("orders", "customer_id"));
        assertThat(insert.influencing()).containsExactly(ref("orders", "customer_id"));
    }

    @Test
    void insertSelectWithoutAListMapsToTheTargetsKnownColumns() {
        List<StatementLineage> script = analyzer.analyze("""
                create table target (x int, y int);
                insert into target select b, a from source;
                """, schema(Map.of("source", List.of("a", "b"))));

        StatementLineage insert = script.get(1);
        // expected: SQL:2016 14.11 <insert statement>, no column list means all columns in order (from memory)
        assertThat(insert.columns()).extracting(OutputColumn::name).containsExactly("x", "y");
        assertThat(insert.column("x").origins()).containsExactly(direct("source", "b"));
        assertThat(insert.column("y").origins()).containsExactly(direct("source", "a"));
    }

    @Test
    void insertIntoAnUnknownTableKeepsTheQueryNamesAndSaysSo() {
        StatementLineage insert = LineageAssertions.single(
                "insert into elsewhere select a from source", schema(Map.of("source", List.of("a"))));

        assertThat(insert.columns()).extracting(OutputColumn::name).containsExactly("a");
        assertThat(insert.warnings()).containsExactly("columns of elsewhere are not known; the query's column names are used");
    }

    @Test
    void insertWithCteAndInsertValues() {
        List<StatementLineage> script = analyzer.analyze("""
                insert into t (v) values (1), (2);
                with s as (select a from source) insert into t (v) select a from s;
                """, schema(Map.of("source", List.of("a"))));

        assertThat(script).hasSize(1);
        assertThat(script.get(0).column("v").origins()).containsExactly(direct("source", "a"));
        assertThat(script.get(0).line()).isEqualTo(2);
    }

    @Test
    void aStatementThatFailsToParseIsReportedAndTheScriptGoesOn() {
        List<StatementLineage> script = analyzer.analyze("""
                create table a (x int);
                create view broken as select from where;
                create view fine as select x from a;
                """, SchemaLookup.none());

        assertThat(script).extracting(StatementLineage::kind)
                .containsExactly(Kind.CREATE_TABLE, Kind.UNPARSED, Kind.CREATE_VIEW);
        StatementLineage broken = script.get(1);
        assertThat(broken.line()).isEqualTo(2);
        assertThat(broken.target()).isNull();
        assertThat(broken.warnings()).singleElement().asString().startsWith("could not parse statement: ");
        assertThat(script.get(2).column("x").origins()).containsExactly(direct("a", "x"));
    }

    @Test
    void functionBodiesAndCommentsAreSkippedAndLinesCounted() {
        List<StatementLineage> script = analyzer.analyze("""
                -- a comment; with a semicolon
                create function bump(i int) returns int as $$
                  begin
                    return i + 1; -- inside the body
                  end;
                $$ language plpgsql;
                /* block; comment */
                create view v as select ';' as sep, x from t;
                do $body$ begin perform 1; end $body$;
                select 'it''s; fine' as s;
                """, SchemaLookup.none());

        assertThat(script).extracting(StatementLineage::kind).containsExactly(Kind.CREATE_VIEW, Kind.SELECT);
        assertThat(script).extracting(StatementLineage::line).containsExactly(8, 10);
        assertThat(script.get(0).column("x").origins()).containsExactly(direct("t", "x"));
    }

    @Test
    void createViewColumnListRenamesTheQueryColumns() {
        StatementLineage view = LineageAssertions.single(
                "create or replace view v (first, second) as select a, b + 1 from t", schema(Map.of("t", List.of("a", "b"))));

        assertThat(view.columns()).extracting(OutputColumn::name).containsExactly("first", "second");
        assertThat(view.column("second").origins()).containsExactly(derived("t", "b"));
    }

    @Test
    void droppedTablesAreForgotten() {
        List<StatementLineage> script = analyzer.analyze("""
                create table t (a int);
                drop table t;
                select * from t;
                """, SchemaLookup.none());

        assertThat(script.get(1).columns()).isEmpty();
        assertThat(script.get(1).warnings()).contains("cannot expand * over t: its columns are not known");
    }

    @Test
    void materializedViewsStopLineageLikeTables() {
        List<StatementLineage> script = analyzer.analyze("""
                create materialized view mv as select a from t;
                select a from mv;
                """, schema(Map.of("t", List.of("a"))));

        assertThat(script.get(0).kind()).isEqualTo(Kind.CREATE_VIEW);
        assertThat(script.get(1).column("a").origins()).containsExactly(direct("mv", "a"));
    }

    @Test
    void selectIntoCreatesATable() {
        StatementLineage lineage = LineageAssertions.single(
                "select a, b * 2 as b2 into new_t from t", schema(Map.of("t", List.of("a", "b"))));

        assertThat(lineage.kind()).isEqualTo(Kind.CREATE_TABLE_AS);
        assertThat(lineage.target()).isEqualTo(table("new_t"));
        assertThat(lineage.column("b2").origins()).containsExactly(derived("t", "b"));
    }

    @Test
    void statementsWithoutLineageYieldNothing() {
        List<StatementLineage> script = analyzer.analyze("""
                set search_path = public;
                update t set a = 1;
                delete from t;
                """, SchemaLookup.none());

        assertThat(script).isEmpty();
    }
}
