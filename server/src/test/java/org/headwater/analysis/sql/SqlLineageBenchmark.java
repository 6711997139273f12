package org.headwater.analysis.sql;

import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.function.Supplier;

/**
 * Not a test: prints, for each TPC-H view, Headwater's analysis time next to Calcite's
 * parse + validate + convert + column-origins time for the same query, medians of warm runs
 * in the same JVM. Headwater is timed on the one query's script with the schema known through
 * a {@link SchemaLookup}; Calcite on a fresh planner over the same schema.
 *
 * <p>Run from the repository root:
 * <pre>
 * mvn -B -q -pl server -am test-compile dependency:build-classpath \
 *     -Dmdep.includeScope=test -Dmdep.outputFile=/tmp/headwater-test.classpath
 * java -cp server/target/test-classes:server/target/classes:$(cat /tmp/headwater-test.classpath) \
 *     org.headwater.analysis.sql.SqlLineageBenchmark [repetitions] [warm-up rounds]
 * </pre>
 */
public final class SqlLineageBenchmark {

    private SqlLineageBenchmark() {}

    public static void main(String[] args) {
        int repetitions = args.length > 0 ? Integer.parseInt(args[0]) : 20;
        int warmUp = args.length > 1 ? Integer.parseInt(args[1]) : 30;
        SqlLineageAnalyzer analyzer = new SqlLineageAnalyzer();
        SchemaLookup tpch = schemaOf(analyzer, TpchWorkload.schemaDdl());
        CalciteOracle calcite = new CalciteOracle(TpchWorkload.schemaDdl());
        List<TpchWorkload.Query> queries = TpchWorkload.queries();

        for (int round = 0; round < warmUp; round++) {
            for (TpchWorkload.Query query : queries) {
                analyzer.analyze(query.headwaterScript(), tpch);
                calcite.answer(query.calciteSql());
            }
        }
        System.out.printf("%-6s %14s %14s %8s%n", "query", "headwater ms", "calcite ms", "ratio");
        double[] ours = new double[queries.size()];
        double[] theirs = new double[queries.size()];
        for (int i = 0; i < queries.size(); i++) {
            TpchWorkload.Query query = queries.get(i);
            ours[i] = medianMillis(repetitions, () -> analyzer.analyze(query.headwaterScript(), tpch));
            theirs[i] = medianMillis(repetitions, () -> calcite.answer(query.calciteSql()));
            System.out.printf("%-6s %14.3f %14.3f %8.2f%n", query.viewName(), ours[i], theirs[i], ours[i] / theirs[i]);
        }
        System.out.printf("%-6s %14.3f %14.3f %8.2f%n", "median", median(ours), median(theirs), median(ours) / median(theirs));
        System.out.printf("%-6s %14.3f %14.3f%n", "sum", Arrays.stream(ours).sum(), Arrays.stream(theirs).sum());
        System.out.printf("(%d repetitions per query after %d warm-up rounds; %s, %d processors)%n",
                repetitions, warmUp, System.getProperty("java.vm.version"), Runtime.getRuntime().availableProcessors());
    }

    /** The TPC-H tables as a catalog would know them, from Headwater's own reading of the DDL. */
    static SchemaLookup schemaOf(SqlLineageAnalyzer analyzer, String ddl) {
        Map<QualifiedName, List<String>> tables = new HashMap<>();
        for (StatementLineage table : analyzer.analyze(ddl, SchemaLookup.none())) {
            tables.put(table.target(), table.columns().stream().map(OutputColumn::name).toList());
        }
        return name -> Optional.ofNullable(tables.get(name));
    }

    private static double medianMillis(int repetitions, Supplier<?> work) {
        double[] times = new double[repetitions];
        for (int i = 0; i < repetitions; i++) {
            long start = System.nanoTime();
            Object result = work.get();
            times[i] = (System.nanoTime() - start) / 1e6;
            if (result == null) {
                throw new IllegalStateException("no result");
            }
        }
        return median(times);
    }

    private static double median(double[] values) {
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        int mid = sorted.length / 2;
        return sorted.length % 2 == 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
    }
}
