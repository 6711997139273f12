package org.headwater.analysis.sql;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The 22 TPC-H queries, analysed by Headwater as one script (the schema DDL, then the views),
 * compared edge by edge with the column origins Apache Calcite computes for the same queries.
 * An edge is (query, output ordinal, source table, source column), with or without the
 * derived flag.
 */
class TpchLineageAgainstCalciteTest {

    /** One lineage edge. */
    record Edge(int query, int ordinal, ColumnRef source) {}

    private static final Map<Integer, StatementLineage> HEADWATER = new HashMap<>();
    private static final Map<Integer, CalciteOracle.Answer> CALCITE = new HashMap<>();

    @BeforeAll
    static void analyseBoth() {
        StringBuilder script = new StringBuilder(TpchWorkload.schemaDdl());
        for (TpchWorkload.Query query : TpchWorkload.queries()) {
            script.append('\n').append(query.headwaterScript());
        }
        for (StatementLineage lineage : new SqlLineageAnalyzer().analyze(script.toString(), SchemaLookup.none())) {
            if (lineage.target() != null && lineage.target().name().matches("q\\d+")) {
                HEADWATER.put(Integer.parseInt(lineage.target().name().substring(1)), lineage);
            }
        }
        CalciteOracle calcite = new CalciteOracle(TpchWorkload.schemaDdl());
        for (TpchWorkload.Query query : TpchWorkload.queries()) {
            CALCITE.put(query.number(), calcite.answer(query.calciteSql()));
        }
    }

    @Test
    void everyQueryIsAnalysedAsAViewWithoutWarnings() {
        assertThat(HEADWATER).hasSize(22);
        for (StatementLineage lineage : HEADWATER.values()) {
            assertThat(lineage.kind()).isEqualTo(StatementLineage.Kind.CREATE_VIEW);
            assertThat(lineage.warnings()).as(lineage.target().toString()).isEmpty();
        }
    }

    @Test
    void everyQueryHasAsManyColumnsAsCalciteFinds() {
        for (int q = 1; q <= 22; q++) {
            // expected column count: Apache Calcite RelRoot.project() row type
            assertThat(HEADWATER.get(q).columns()).as("q" + q).hasSize(CALCITE.get(q).columns().size());
        }
    }

    @Test
    void originEdgesAgreeWithCalcite() {
        Set<Edge> ours = new LinkedHashSet<>();
        Set<Edge> theirs = new LinkedHashSet<>();
        int flagAgree = 0;
        int common = 0;
        List<String> differences = new ArrayList<>();
        for (int q = 1; q <= 22; q++) {
            List<OutputColumn> headwater = HEADWATER.get(q).columns();
            List<Set<ColumnOrigin>> calcite = CALCITE.get(q).columns();
            for (int i = 0; i < headwater.size(); i++) {
                Set<ColumnOrigin> expected = calcite.get(i);
                Set<ColumnOrigin> actual = headwater.get(i).origins();
                if (expected == null) {
                    differences.add("q" + q + " column " + (i + 1) + ": Calcite returns null origins");
                    continue;
                }
                Map<ColumnRef, Boolean> expectedFlags = flags(expected);
                Map<ColumnRef, Boolean> actualFlags = flags(actual);
                for (ColumnRef source : actualFlags.keySet()) {
                    ours.add(new Edge(q, i + 1, source));
                }
                for (ColumnRef source : expectedFlags.keySet()) {
                    theirs.add(new Edge(q, i + 1, source));
                    if (actualFlags.containsKey(source)) {
                        common++;
                        if (Objects.equals(actualFlags.get(source), expectedFlags.get(source))) {
                            flagAgree++;
                        } else {
                            differences.add("q" + q + " column " + (i + 1) + " " + source + ": derived="
                                    + actualFlags.get(source) + ", Calcite derived=" + expectedFlags.get(source));
                        }
                    }
                }
                if (!expectedFlags.keySet().equals(actualFlags.keySet())) {
                    differences.add("q" + q + " column " + (i + 1) + ": Headwater " + actualFlags.keySet()
                            + ", Calcite " + expectedFlags.keySet());
                }
            }
        }
        Set<Edge> both = new LinkedHashSet<>(ours);
        both.retainAll(theirs);
        double precision = (double) both.size() / ours.size();
        double recall = (double) both.size() / theirs.size();
        double flagAgreement = common == 0 ? 1.0 : (double) flagAgree / common;
        System.out.printf("TPC-H origin edges: Headwater %d, Calcite %d, common %d; precision %.4f recall %.4f;"
                + " derived flag agrees on %d of %d common edges (%.4f)%n",
                ours.size(), theirs.size(), both.size(), precision, recall, flagAgree, common, flagAgreement);
        differences.forEach(d -> System.out.println("  difference: " + d));

        // expected origins: Apache Calcite RelMetadataQuery.getColumnOrigins
        assertThat(precision).isGreaterThanOrEqualTo(0.97);
        assertThat(recall).isGreaterThanOrEqualTo(0.97);
        assertThat(flagAgreement).isGreaterThanOrEqualTo(0.97);
    }

    @Test
    void sourceTablesAreTheTablesCalciteScans() {
        for (int q = 1; q <= 22; q++) {
            // expected tables: Apache Calcite TableScans of the converted plan, subqueries included
            assertThat(HEADWATER.get(q).sourceTables()).as("q" + q).isEqualTo(CALCITE.get(q).tables());
        }
    }

    private static Map<ColumnRef, Boolean> flags(Set<ColumnOrigin> origins) {
        Map<ColumnRef, Boolean> flags = new HashMap<>();
        for (ColumnOrigin origin : origins) {
            flags.merge(origin.source(), origin.derived(), Boolean::logicalOr);
        }
        return flags;
    }
}
