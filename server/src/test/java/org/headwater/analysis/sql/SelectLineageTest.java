package org.headwater.analysis.sql;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.analysis.sql.LineageAssertions.derived;
import static org.headwater.analysis.sql.LineageAssertions.direct;
import static org.headwater.analysis.sql.LineageAssertions.ref;
import static org.headwater.analysis.sql.LineageAssertions.schema;
import static org.headwater.analysis.sql.LineageAssertions.single;
import static org.headwater.analysis.sql.LineageAssertions.table;

import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.Test;

/**
 * Query constructs, one per test. Direct versus derived follows the rule Calcite's
 * RelMdColumnOrigins applies (a bare input reference keeps its flag, any other expression
 * derives); influencing columns follow this package's definition in {@link StatementLineage}.
 */
class SelectLineageTest {

    private static final SchemaLookup SHOP = schema(Map.of(
            "orders", List.of("id", "customer_id", "amount", "status", "placed_at"),
            "customers", List.of("id", "name", "region"),
            "emp", List.of("id", "manager_id", "name", "salary", "dept")));

    @Test
    void bareColumnsThroughAJoinAreDirectAndJoinKeysInfluence() {
        StatementLineage lineage = single("""
                select c.name, o.amount
                from orders o join customers c on o.customer_id = c.id
                where o.status = 'paid'""", SHOP);

        // expected: Calcite RelMdColumnOrigins, Join and Project rules (bare reference = not derived)
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("name", "amount");
        assertThat(lineage.column("name").origins()).containsExactly(direct("customers", "name"));
        assertThat(lineage.column("amount").origins()).containsExactly(direct("orders", "amount"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(
                ref("orders", "customer_id"), ref("customers", "id"), ref("orders", "status"));
        assertThat(lineage.sourceTables()).containsExactlyInAnyOrder(table("orders"), table("customers"));
        assertThat(lineage.kind()).isEqualTo(StatementLineage.Kind.SELECT);
        assertThat(lineage.target()).isNull();
        assertThat(lineage.warnings()).isEmpty();
    }

    @Test
    void aggregatesAndArithmeticAreDerivedAndGroupKeysStayDirect() {
        StatementLineage lineage = single("""
                select region, sum(amount * 2) as total, count(*) as n
                from orders join customers on customer_id = customers.id
                group by region having count(*) > 1""", SHOP);

        // expected: Calcite RelMdColumnOrigins, Aggregate rule (group key passes through, call args derive,
        // COUNT(*) has no argument and so no origin)
        assertThat(lineage.column("region").origins()).containsExactly(direct("customers", "region"));
        assertThat(lineage.column("total").origins()).containsExactly(derived("orders", "amount"));
        assertThat(lineage.column("n").origins()).isEmpty();
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(
                ref("orders", "customer_id"), ref("customers", "id"), ref("customers", "region"));
    }

    @Test
    void caseTakesItsConditionColumnsAsDerivedOrigins() {
        StatementLineage lineage = single("""
                select case when status = 'paid' then amount else 0 end as paid_amount from orders""", SHOP);

        // expected: Calcite RelMdColumnOrigins, Project rule (every input ref of a non-trivial expression)
        assertThat(lineage.column("paid_amount").origins())
                .containsExactlyInAnyOrder(derived("orders", "status"), derived("orders", "amount"));
    }

    @Test
    void castsInBothSpellingsDeriveAndKeepTheColumnName() {
        StatementLineage lineage = single("select cast(amount as int), placed_at::date from orders", SHOP);

        // expected names: PostgreSQL's choice for an unaliased cast is its operand's name (from memory)
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("amount", "placed_at");
        assertThat(lineage.columns().get(0).origins()).containsExactly(derived("orders", "amount"));
        assertThat(lineage.columns().get(1).origins()).containsExactly(derived("orders", "placed_at"));
    }

    @Test
    void parenthesesAloneDoNotDerive() {
        StatementLineage lineage = single("select (amount) from orders", SHOP);

        // common practice, no source: parentheses compute nothing
        assertThat(lineage.columns().get(0).origins()).containsExactly(direct("orders", "amount"));
    }

    @Test
    void windowFunctionArgumentsAreOriginsAndPartitionAndOrderInfluence() {
        StatementLineage lineage = single("""
                select name,
                       sum(salary) over (partition by dept order by id) as running,
                       row_number() over (order by salary desc) as rank_in_company
                from emp""", SHOP);

        // expected: window partition/order choose the rows (StatementLineage.influencing definition)
        assertThat(lineage.column("name").origins()).containsExactly(direct("emp", "name"));
        assertThat(lineage.column("running").origins()).containsExactly(derived("emp", "salary"));
        assertThat(lineage.column("rank_in_company").origins()).isEmpty();
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(
                ref("emp", "dept"), ref("emp", "id"), ref("emp", "salary"));
    }

    @Test
    void namedWindowsInfluenceToo() {
        StatementLineage lineage = single(
                "select avg(salary) over w as avg_salary from emp window w as (partition by dept)", SHOP);

        assertThat(lineage.column("avg_salary").origins()).containsExactly(derived("emp", "salary"));
        assertThat(lineage.influencing()).containsExactly(ref("emp", "dept"));
    }

    @Test
    void aggregateFilterInfluencesButIsNoOrigin() {
        StatementLineage lineage = single(
                "select count(*) filter (where status = 'paid') as paid, sum(amount) from orders", SHOP);

        // expected: Calcite RelMdColumnOrigins reads AggregateCall.getArgList only, not its filter
        assertThat(lineage.column("paid").origins()).isEmpty();
        assertThat(lineage.column("sum").origins()).containsExactly(derived("orders", "amount"));
        assertThat(lineage.influencing()).containsExactly(ref("orders", "status"));
    }

    @Test
    void unionMergesOriginsPerPositionAndTakesNamesFromTheFirstBranch() {
        StatementLineage lineage = single("""
                select id, name from customers
                union
                select id, upper(name) from emp where dept = 'sales'
                except
                select id, name from customers where region = 'north'""", SHOP);

        // expected: Calcite RelMdColumnOrigins, SetOp rule (union of each input's origins per position);
        // names of a set operation: SQL:2016 7.17 <query expression>, from memory
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("id", "name");
        assertThat(lineage.column("id").origins())
                .containsExactlyInAnyOrder(direct("customers", "id"), direct("emp", "id"));
        assertThat(lineage.column("name").origins())
                .containsExactlyInAnyOrder(direct("customers", "name"), derived("emp", "name"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(ref("emp", "dept"), ref("customers", "region"));
    }

    @Test
    void intersectMergesLikeUnion() {
        StatementLineage lineage = single("select id from customers intersect select customer_id from orders", SHOP);

        assertThat(lineage.columns().get(0).origins())
                .containsExactlyInAnyOrder(direct("customers", "id"), direct("orders", "customer_id"));
    }

    @Test
    void aColumnCopiedOnOneBranchAndComputedOnAnotherIsDerived() {
        StatementLineage lineage = single("select amount from orders union all select amount + 1 from orders", SHOP);

        // common practice, no source: one origin per source column, derived if any path computes it
        assertThat(lineage.columns().get(0).origins()).containsExactly(derived("orders", "amount"));
    }

    @Test
    void subqueryInFromKeepsDirectColumnsDirectAndItsFiltersInfluence() {
        StatementLineage lineage = single("""
                select big.customer_id, big.total
                from (select customer_id, sum(amount) as total from orders where status = 'paid' group by customer_id) big
                where big.total > 100""", SHOP);

        assertThat(lineage.column("customer_id").origins()).containsExactly(direct("orders", "customer_id"));
        assertThat(lineage.column("total").origins()).containsExactly(derived("orders", "amount"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(
                ref("orders", "status"), ref("orders", "customer_id"), ref("orders", "amount"));
    }

    @Test
    void subqueriesInWhereInfluenceWithTheirOwnFiltersAndCorrelation() {
        StatementLineage lineage = single("""
                select name from customers c
                where exists (select * from orders o where o.customer_id = c.id and o.status = 'open')
                  and c.region in (select dept from emp where salary > 10)""", SHOP);

        assertThat(lineage.column("name").origins()).containsExactly(direct("customers", "name"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(
                ref("orders", "customer_id"), ref("customers", "id"), ref("orders", "status"),
                ref("customers", "region"), ref("emp", "dept"), ref("emp", "salary"));
        assertThat(lineage.sourceTables()).containsExactlyInAnyOrder(table("customers"), table("orders"), table("emp"));
        assertThat(lineage.warnings()).isEmpty();
    }

    @Test
    void scalarSubqueryInSelectDerivesFromItsOutputAndItsWhereInfluences() {
        StatementLineage lineage = single("""
                select c.name, (select max(o.amount) from orders o where o.customer_id = c.id) as biggest
                from customers c""", SHOP);

        assertThat(lineage.column("biggest").origins()).containsExactly(derived("orders", "amount"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(ref("orders", "customer_id"), ref("customers", "id"));
    }

    @Test
    void cteIsLookedThroughToItsBaseColumns() {
        StatementLineage lineage = single("""
                with paid as (select customer_id, amount from orders where status = 'paid'),
                     totals as (select customer_id as who, sum(amount) as total from paid group by customer_id)
                select who, total from totals""", SHOP);

        assertThat(lineage.column("who").origins()).containsExactly(direct("orders", "customer_id"));
        assertThat(lineage.column("total").origins()).containsExactly(derived("orders", "amount"));
        assertThat(lineage.sourceTables()).containsExactly(table("orders"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(ref("orders", "status"), ref("orders", "customer_id"));
    }

    @Test
    void recursiveCteReachesAFixpointOverAnchorAndRecursiveTerm() {
        StatementLineage lineage = single("""
                with recursive chain (id, boss, depth) as (
                    select id, id, 0 from emp where manager_id is null
                    union all
                    select e.id, chain.boss, chain.depth + 1
                    from emp e join chain on e.manager_id = chain.id
                )
                select id, boss, depth from chain""", SHOP);

        // expected: the recursive query's result is the fixpoint of anchor UNION ALL recursive term
        // (PostgreSQL manual 7.8.2 "Recursive Queries"); origins follow the same iteration.
        assertThat(lineage.column("id").origins()).containsExactly(direct("emp", "id"));
        assertThat(lineage.column("boss").origins()).containsExactly(direct("emp", "id"));
        assertThat(lineage.column("depth").origins()).isEmpty();
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(ref("emp", "manager_id"), ref("emp", "id"));
        assertThat(lineage.warnings()).isEmpty();
    }

    @Test
    void recursiveCteCounterDerivesFromNothingButItsSeed() {
        StatementLineage lineage = single("""
                with recursive n (k, total) as (
                    select 1, salary from emp
                    union all
                    select k + 1, total * 2 from n where k < 5
                )
                select k, total from n""", SHOP);

        assertThat(lineage.column("k").origins()).isEmpty();
        // direct on the anchor, computed on the recursive term: derived (one origin per source)
        assertThat(lineage.column("total").origins()).containsExactly(derived("emp", "salary"));
    }

    @Test
    void starExpandsFromKnownSchemasInFromOrder() {
        StatementLineage lineage = single("select * from customers c join orders o on o.customer_id = c.id", SHOP);

        // expected: * lists the FROM items' columns left to right (SQL:2016 7.16 <query specification>, from memory)
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly(
                "id", "name", "region", "id", "customer_id", "amount", "status", "placed_at");
        assertThat(lineage.columns().get(3).origins()).containsExactly(direct("orders", "id"));
        assertThat(lineage.columns()).extracting(OutputColumn::ordinal).containsExactly(1, 2, 3, 4, 5, 6, 7, 8);
    }

    @Test
    void qualifiedStarExpandsOneRelation() {
        StatementLineage lineage = single("select c.*, o.amount from customers c join orders o on o.customer_id = c.id", SHOP);

        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("id", "name", "region", "amount");
    }

    @Test
    void usingJoinMergesItsColumnOnceAtTheFrontOfStar() {
        SchemaLookup known = schema(Map.of("a", List.of("k", "x"), "b", List.of("k", "y")));
        StatementLineage lineage = single("select * from a join b using (k)", known);

        // expected: USING columns come first, once (SQL:2016 7.7 <joined table>, from memory; PostgreSQL does the same)
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("k", "x", "y");
        assertThat(lineage.column("k").origins()).containsExactly(direct("a", "k"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(ref("a", "k"), ref("b", "k"));
    }

    @Test
    void fullJoinUsingCoalescesBothSides() {
        SchemaLookup known = schema(Map.of("a", List.of("k", "x"), "b", List.of("k", "y")));
        StatementLineage lineage = single("select k from a full join b using (k)", known);

        // expected: FULL JOIN USING yields COALESCE(a.k, b.k) (SQL:2016 7.7 syntax rules, from memory)
        assertThat(lineage.column("k").origins()).containsExactlyInAnyOrder(derived("a", "k"), derived("b", "k"));
    }

    @Test
    void unknownStarWarnsInsteadOfGuessing() {
        StatementLineage lineage = single("select * from mystery", SchemaLookup.none());

        assertThat(lineage.columns()).isEmpty();
        assertThat(lineage.sourceTables()).containsExactly(table("mystery"));
        assertThat(lineage.warnings()).containsExactly(
                "columns of mystery are not known",
                "cannot expand * over mystery: its columns are not known",
                "the output columns are incomplete: * over mystery could not be expanded");
    }

    @Test
    void aNamePickedFromAnUnexpandedStarStillReachesItsTable() {
        StatementLineage lineage = single("select s.a from (select * from mystery) s", SchemaLookup.none());

        assertThat(lineage.column("a").origins()).containsExactly(direct("mystery", "a"));
    }

    @Test
    void orderByInfluencesOnlyWhenLimitCutsTheRows() {
        StatementLineage ordered = single("select name from emp order by salary", SHOP);
        StatementLineage top = single("select name from emp order by salary desc limit 3", SHOP);
        StatementLineage fetched = single("select name from emp order by id fetch first 3 rows only", SHOP);

        // common practice, no source: ordering alone changes no value; with a cut it picks the rows
        assertThat(ordered.influencing()).isEmpty();
        assertThat(top.influencing()).containsExactly(ref("emp", "salary"));
        assertThat(fetched.influencing()).containsExactly(ref("emp", "id"));
    }

    @Test
    void groupByOrdinalAndOutputAliasResolveToTheSelectList() {
        StatementLineage lineage = single(
                "select upper(region) as r, count(*) from customers group by 1 order by r limit 1", SHOP);

        assertThat(lineage.influencing()).containsExactly(ref("customers", "region"));
        assertThat(lineage.column("r").origins()).containsExactly(derived("customers", "region"));
    }

    @Test
    void distinctOnInfluences() {
        StatementLineage lineage = single(
                "select distinct on (customer_id) customer_id, amount from orders order by customer_id, placed_at desc", SHOP);

        assertThat(lineage.influencing()).containsExactly(ref("orders", "customer_id"));
    }

    @Test
    void valuesColumnsHaveNoOrigins() {
        StatementLineage lineage = single("select v.a from (values (1, 'x'), (2, 'y')) as v(a, b)", SHOP);

        // expected: Calcite's catch-all rule gives VALUES an empty origin set
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("a");
        assertThat(lineage.column("a").origins()).isEmpty();
        assertThat(lineage.warnings()).isEmpty();
    }

    @Test
    void lateralSubqueryCanReadTheItemsToItsLeft() {
        StatementLineage lineage = single("""
                select c.name, last.amount
                from customers c,
                     lateral (select o.amount from orders o where o.customer_id = c.id order by o.placed_at desc limit 1) last""",
                SHOP);

        assertThat(lineage.column("amount").origins()).containsExactly(direct("orders", "amount"));
        assertThat(lineage.influencing()).containsExactlyInAnyOrder(
                ref("orders", "customer_id"), ref("customers", "id"), ref("orders", "placed_at"));
        assertThat(lineage.warnings()).isEmpty();
    }

    @Test
    void literalOnlyColumnsHaveNoOriginsAndDefaultNames() {
        StatementLineage lineage = single("select 1, 'x' as label, now() from emp", SHOP);

        // expected names: PostgreSQL SELECT manual, "Omitting the AS Key Word" / output column names
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("?column?", "label", "now");
        assertThat(lineage.columns()).allSatisfy(c -> assertThat(c.origins()).isEmpty());
        assertThat(lineage.sourceTables()).containsExactly(table("emp"));
    }

    @Test
    void schemaQualifiedNamesKeepTheirParts() {
        SchemaLookup known = schema(Map.of("sales.orders", List.of("id", "amount")));
        StatementLineage lineage = single("select sales.orders.amount, o2.id from sales.orders, sales.orders o2", known);

        assertThat(lineage.columns().get(0).origins()).containsExactly(direct("sales.orders", "amount"));
        assertThat(lineage.columns().get(1).origins()).containsExactly(direct("sales.orders", "id"));
        assertThat(lineage.sourceTables()).isEqualTo(Set.of(table("sales.orders")));
    }

    @Test
    void aSingleValuesRowHasOneColumnPerValue() {
        StatementLineage lineage = single("values (1, 'x')", SHOP);

        // expected names: PostgreSQL manual 7.7 "VALUES Lists" (column1, column2, ...)
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("column1", "column2");
    }

    @Test
    void anOrderedSetAggregateReadsItsWithinGroupColumn() {
        StatementLineage lineage = single(
                "select percentile_cont(0.5) within group (order by salary) as median_salary from emp", SHOP);

        // expected: the WITHIN GROUP sort key is the aggregated value (SQL:2016 10.9 <ordered set function>, from memory)
        assertThat(lineage.column("median_salary").origins()).containsExactly(derived("emp", "salary"));
        assertThat(lineage.influencing()).isEmpty();
    }

    @Test
    void extractIsNamedLikeAFunction() {
        StatementLineage lineage = single("select extract(year from placed_at) from orders", SHOP);

        // expected name: PostgreSQL 14+ output column name "extract" (from memory)
        assertThat(lineage.columns()).extracting(OutputColumn::name).containsExactly("extract");
        assertThat(lineage.columns().get(0).origins()).containsExactly(derived("orders", "placed_at"));
    }
}
