package org.headwater.analysis.sql;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.analysis.sql.LineageAssertions.derived;
import static org.headwater.analysis.sql.LineageAssertions.direct;
import static org.headwater.analysis.sql.LineageAssertions.ref;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * Where Headwater departs from Calcite's column origins on purpose, pinned on both sides so a
 * change in either shows. TPC-H exercises neither construct.
 */
class DeliberateDifferencesFromCalciteTest {

    private static CalciteOracle calcite;
    private static SchemaLookup tpch;

    @BeforeAll
    static void schemas() {
        calcite = new CalciteOracle(TpchWorkload.schemaDdl());
        Map<QualifiedName, List<String>> tables = new HashMap<>();
        for (StatementLineage table : new SqlLineageAnalyzer().analyze(TpchWorkload.schemaDdl(), SchemaLookup.none())) {
            tables.put(table.target(), table.columns().stream().map(OutputColumn::name).toList());
        }
        tpch = name -> Optional.ofNullable(tables.get(name));
    }

    @Test
    void theNullableSideOfAnOuterJoinStaysDirect() {
        String sql = "select c_name, o_orderkey from customer left join orders on c_custkey = o_custkey";

        // expected origins: Apache Calcite RelMdColumnOrigins marks the side an outer join pads with nulls as derived
        assertThat(calcite.answer(sql).columns().get(1)).containsExactly(derived("orders", "o_orderkey"));
        // Headwater: the values that are there are copied as is; the padding nulls come from no column
        assertThat(LineageAssertions.single(sql, tpch).columns().get(1).origins())
                .containsExactly(direct("orders", "o_orderkey"));
    }

    @Test
    void windowPartitionAndOrderKeysInfluenceRatherThanOriginate() {
        String sql = "select rank() over (partition by n_regionkey order by n_name) from nation";

        // expected origins: Apache Calcite visits every input ref of the RexOver, window keys included
        assertThat(calcite.answer(sql).columns().get(0))
                .containsExactlyInAnyOrder(derived("nation", "n_regionkey"), derived("nation", "n_name"));
        StatementLineage ours = LineageAssertions.single(sql, tpch);
        assertThat(ours.columns().get(0).origins()).isEmpty();
        assertThat(ours.influencing()).containsExactlyInAnyOrder(ref("nation", "n_regionkey"), ref("nation", "n_name"));
    }
}
