package org.headwater.analysis.sql;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import org.headwater.analysis.script.AnalysisContext;
import org.headwater.analysis.script.ScriptAnalysis;
import org.headwater.analysis.script.WorkspaceAnalysis;
import org.headwater.bench.LakeGenerator;

/**
 * The script-analysis benchmark of the scripts issue, in one run: the synthetic lake's 400 Python and R
 * scripts analysed as a workspace (wall time), and 100 SQL files (the 22 TPC-H queries as views, in turn)
 * with each file's lineage time next to Apache Calcite's parse, validate, convert and column-origins time
 * for the same query. Usage: {@code WorkspaceAnalysisBenchmark [folder]}.
 */
public final class WorkspaceAnalysisBenchmark {
    private WorkspaceAnalysisBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        Path root = args.length > 0 ? Path.of(args[0]) : Files.createTempDirectory("headwater-analysis-bench");
        new LakeGenerator(1, 0, 0, 400).write(root);
        List<TpchWorkload.Query> queries = TpchWorkload.queries();
        Path sql = Files.createDirectories(root.resolve("sql"));
        for (int i = 0; i < 100; i++) {
            Files.writeString(sql.resolve(String.format("view_%03d.sql", i)), queries.get(i % queries.size()).headwaterScript());
        }

        WorkspaceAnalysis workspace = new WorkspaceAnalysis();
        workspace.analyze(root, AnalysisContext.defaults()); // warm-up: native parsers, class loading
        long t = System.nanoTime();
        List<ScriptAnalysis> analyses = workspace.analyze(root, AnalysisContext.defaults());
        double scriptsSeconds = (System.nanoTime() - t) / 1e9;
        int references = analyses.stream().mapToInt(a -> a.references().size()).sum();

        SqlLineageAnalyzer analyzer = new SqlLineageAnalyzer();
        SchemaLookup tpch = SqlLineageBenchmark.schemaOf(analyzer, TpchWorkload.schemaDdl());
        CalciteOracle calcite = new CalciteOracle(TpchWorkload.schemaDdl());
        for (TpchWorkload.Query q : queries) { // warm-up of both, as a long-running server would be
            analyzer.analyze(q.headwaterScript(), tpch);
            calcite.answer(q.calciteSql());
        }
        double[] ours = new double[100];
        double[] theirs = new double[100];
        long sqlStart = System.nanoTime();
        for (int i = 0; i < 100; i++) {
            String text = Files.readString(sql.resolve(String.format("view_%03d.sql", i)));
            long a = System.nanoTime();
            analyzer.analyze(text, tpch);
            ours[i] = (System.nanoTime() - a) / 1e6;
            long b = System.nanoTime();
            calcite.answer(queries.get(i % queries.size()).calciteSql());
            theirs[i] = (System.nanoTime() - b) / 1e6;
        }
        double sqlSeconds = (System.nanoTime() - sqlStart) / 1e9;
        System.out.printf("400 scripts: %.2f s wall (%.1f ms a script), %d references%n", scriptsSeconds,
                scriptsSeconds * 1000 / analyses.size(), references);
        System.out.printf("100 SQL files: %.2f s wall for both analysers; per query median %.2f ms (p95 %.2f) vs Calcite %.2f ms (p95 %.2f)%n",
                sqlSeconds, percentile(ours, 50), percentile(ours, 95), percentile(theirs, 50), percentile(theirs, 95));
    }

    private static double percentile(double[] values, int p) {
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        return sorted[Math.min(sorted.length - 1, (int) Math.ceil(p / 100.0 * sorted.length) - 1)];
    }
}
