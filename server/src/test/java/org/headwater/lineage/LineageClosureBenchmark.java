package org.headwater.lineage;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.lang.management.ManagementFactory;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import java.util.concurrent.TimeUnit;
import java.util.function.LongSupplier;
import java.util.stream.Stream;
import org.headwater.store.Store;
import org.headwater.store.StoreConfig;

/**
 * Not a test: downstream closure on a synthetic catalog of 100,000 datasets and 1,000,000 lineage edges,
 * each edge carrying one column flow (so 1,000,000 column-level edges over 10 columns per dataset). Prints
 * p50/p95 of {@link LineageGraph#downstream} for starts with about 10, 1,000 and 10,000 descendants, the
 * heap the graph retains, and, measured in the same run, the same closures from a naive boxed-map walk
 * and from a recursive SQL query on the embedded H2 store holding the same edges. Column closures are
 * timed too (in memory only).
 *
 * <p>The SQL runs in a child JVM with a small heap ({@code sqlHeap}, default 1g), a per-query timeout
 * ({@code sqlTimeout} seconds, default 30) and a time budget per start ({@code sqlBudget} seconds, default
 * 60), so a query that runs out of memory or time is reported as such and the benchmark ends by itself.
 *
 * <p>The filled H2 store is kept in {@code dir} (default {@code $TMPDIR/headwater-closure-bench-…}) and
 * reused by the next run; {@code fresh=true} fills it again.
 *
 * <p>Run from the repository root (a few minutes; the parent needs about 2 GiB of heap):
 * <pre>
 * mvn -B -q -pl server -am test-compile dependency:build-classpath \
 *     -Dmdep.includeScope=test -Dmdep.outputFile=/tmp/headwater-test.classpath
 * java -Xmx3g -cp server/target/test-classes:server/target/classes:$(cat /tmp/headwater-test.classpath) \
 *     org.headwater.lineage.LineageClosureBenchmark [reps=200] [sqlReps=20] [sqlTimeout=30] [sqlBudget=60] [sqlHeap=1g] \
 *     [dir=PATH] [fresh=true]
 * </pre>
 * {@code datasets=10000 edges=100000} gives a quick smaller trial (datasets a multiple of 100).
 */
public final class LineageClosureBenchmark {
    // Settable (datasets=, edges=) only for a quick smaller trial; the figures reported are for the defaults.
    private static int DATASETS = 100_000;
    private static int EDGES = 1_000_000;
    private static final int LAYERS = 100;
    private static final int WINDOW = 8;
    private static final int COLUMNS = 10;
    private static final int SCRIPTS = 1_000;
    private static final long SEED = 20260301L;
    private static final int[] TARGETS = {10, 1_000, 10_000};
    private static final int PATH_REPS = 50;

    private LineageClosureBenchmark() {
    }

    private static final java.lang.management.ThreadMXBean THREADS = ManagementFactory.getThreadMXBean();

    /** Wall-clock and thread-CPU milliseconds of repeated calls. The machine may be shared: CPU time leaves
     * out the time the thread waited for a core. */
    private record Timing(double[] wall, double[] cpu) {
        static final Timing NONE = new Timing(new double[0], new double[0]);

        boolean isEmpty() {
            return wall.length == 0;
        }
    }

    /** One start of the dataset table, with what each contender measured. */
    private static final class Row {
        long start;
        int descendants;
        Timing graph;
        Timing graphWithPaths;
        Timing naive;
        String sql = "not run";
        Timing sqlTimes = Timing.NONE;
        boolean sqlAgrees = true;
    }

    public static void main(String[] args) throws Exception {
        System.setProperty("org.slf4j.simpleLogger.defaultLogLevel", "warn");
        Map<String, String> options = options(args);
        int reps = Integer.parseInt(options.getOrDefault("reps", "200"));
        int sqlReps = Integer.parseInt(options.getOrDefault("sqlReps", "20"));
        int sqlTimeout = Integer.parseInt(options.getOrDefault("sqlTimeout", "30"));
        int sqlBudget = Integer.parseInt(options.getOrDefault("sqlBudget", "60"));
        String sqlHeap = options.getOrDefault("sqlHeap", "1g");
        DATASETS = Integer.parseInt(options.getOrDefault("datasets", Integer.toString(DATASETS)));
        EDGES = Integer.parseInt(options.getOrDefault("edges", Integer.toString(EDGES)));

        long t = System.nanoTime();
        SyntheticLineage g = SyntheticLineage.generate(SEED, DATASETS, EDGES, LAYERS, WINDOW, COLUMNS, SCRIPTS);
        double generateSeconds = seconds(t);
        Path dir = Path.of(options.getOrDefault("dir", Path.of(System.getProperty("java.io.tmpdir"),
                "headwater-closure-bench-" + SEED + "-" + DATASETS + "-" + EDGES).toString()));
        run(g, dir, Boolean.parseBoolean(options.getOrDefault("fresh", "false")), reps, sqlReps, sqlTimeout, sqlBudget,
                sqlHeap, generateSeconds);
    }

    /** What the in-memory graph phase measured; the graph itself is gone once this is returned. */
    private record GraphPhase(List<Row> rows, List<ColumnRow> columnRows, double loadSeconds, double loadCpuSeconds,
            long heapWithGraph,
            int datasets, int edges, int columns, int columnEdges) {
    }

    private static void run(SyntheticLineage g, Path dir, boolean fresh, int reps, int sqlReps, int sqlTimeout,
            int sqlBudget, String sqlHeap, double generateSeconds) throws Exception {
        // Inserting two million rows takes minutes on a busy machine, so a filled store is kept for the next
        // run; the marker is written only after the last batch committed.
        Path complete = dir.resolve("complete");
        double insertSeconds = -1;
        if (fresh || !Files.exists(complete)) {
            if (Files.exists(dir)) {
                deleteTree(dir);
            }
            Files.createDirectories(dir);
            long t = System.nanoTime();
            try (Store store = Store.open(StoreConfig.embedded(dir))) {
                BenchmarkStore.fill(store, g);
            }
            insertSeconds = seconds(t);
            Files.writeString(complete, "seed " + SEED + "\n");
        }
        Store store = Store.open(StoreConfig.embedded(dir));

        GraphPhase phase = graphPhase(store, reps);
        long graphBytes = phase.heapWithGraph() - usedHeapAfterGc();
        long naiveBytes = naivePhase(g, phase.rows(), reps);
        for (Row row : phase.rows()) {
            sql(row, dir, sqlReps, sqlTimeout, sqlBudget, sqlHeap);
        }
        print(g, dir, phase, reps, generateSeconds, insertSeconds, graphBytes, naiveBytes, sqlReps, sqlTimeout, sqlBudget,
                sqlHeap);
    }

    /** Loads the graph from the store (then closes the store), weighs it and times its walks. */
    private static GraphPhase graphPhase(Store store, int reps) throws InterruptedException {
        long t = System.nanoTime();
        long cpu = THREADS.getCurrentThreadCpuTime();
        LineageGraph graph = LineageGraph.load(store);
        double loadSeconds = seconds(t);
        double loadCpuSeconds = (THREADS.getCurrentThreadCpuTime() - cpu) / 1e9;
        store.close();
        long withGraph = usedHeapAfterGc();
        List<Row> rows = pickStarts(graph);
        List<ColumnRow> columnRows = pickColumns(graph);
        for (Row row : rows) {
            for (int i = 0; i < reps; i++) {
                graph.downstream(row.start, Query.everything());
            }
            row.graph = time(reps, () -> graph.downstream(row.start, Query.everything()).size());
        }
        // Building every path allocates a list per reached dataset; timed apart, after the plain walks.
        for (Row row : rows) {
            for (int i = 0; i < PATH_REPS / 5; i++) {
                graph.downstream(row.start, Query.everything()).reached();
            }
            row.graphWithPaths = time(PATH_REPS, () -> graph.downstream(row.start, Query.everything()).reached().size());
        }
        for (ColumnRow row : columnRows) {
            for (int i = 0; i < reps; i++) {
                graph.downstreamColumns(row.dataset, row.column, Query.everything());
            }
            row.times = time(reps, () -> graph.downstreamColumns(row.dataset, row.column, Query.everything()).flows().size());
        }
        return new GraphPhase(rows, columnRows, loadSeconds, loadCpuSeconds, withGraph, graph.datasetCount(), graph.edgeCount(),
                graph.columnCount(), graph.columnEdgeCount());
    }

    /** Builds the naive graph, weighs it, checks it finds the same closures and times its walks. */
    private static long naivePhase(SyntheticLineage g, List<Row> rows, int reps) throws InterruptedException {
        long before = usedHeapAfterGc();
        NaiveGraph naive = new NaiveGraph(g);
        long bytes = usedHeapAfterGc() - before;
        for (Row row : rows) {
            int size = naive.downstream(row.start).size();
            if (size != row.descendants) {
                throw new AssertionError("naive walk found " + size + " descendants of " + row.start + ", graph " + row.descendants);
            }
            for (int i = 0; i < reps; i++) {
                naive.downstream(row.start);
            }
            row.naive = time(reps, () -> naive.downstream(row.start).size());
        }
        return bytes;
    }

    /** Starts whose descendant counts come closest to the targets, from a sample of every layer. */
    private static List<Row> pickStarts(LineageGraph graph) {
        Random random = new Random(SEED + 1);
        int width = DATASETS / LAYERS;
        List<long[]> sample = new ArrayList<>();
        for (int layer = 0; layer < LAYERS; layer++) {
            for (int k = 0; k < 20; k++) {
                long id = (long) layer * width + random.nextInt(width) + 1;
                sample.add(new long[] {id, graph.downstream(id, Query.everything()).size()});
            }
        }
        List<Row> rows = new ArrayList<>();
        for (int target : TARGETS) {
            long[] best = sample.stream().min(Comparator.comparingDouble(s -> Math.abs(Math.log((s[1] + 0.5) / target))))
                    .orElseThrow();
            Row row = new Row();
            row.start = best[0];
            row.descendants = (int) best[1];
            rows.add(row);
        }
        return rows;
    }

    /** One start of the column table. */
    private static final class ColumnRow {
        long dataset;
        String column;
        int flows;
        int indirect;
        Timing times;
    }

    private static List<ColumnRow> pickColumns(LineageGraph graph) {
        Random random = new Random(SEED + 2);
        List<ColumnRow> sample = new ArrayList<>();
        for (int i = 0; i < 3_000; i++) {
            ColumnRow row = new ColumnRow();
            row.dataset = random.nextInt(DATASETS - DATASETS / LAYERS) + 1L;
            row.column = SyntheticLineage.column(random.nextInt(COLUMNS));
            ColumnClosure c = graph.downstreamColumns(row.dataset, row.column, Query.everything());
            row.flows = c.flows().size();
            row.indirect = c.indirect().size();
            sample.add(row);
        }
        List<ColumnRow> rows = new ArrayList<>();
        for (int target : TARGETS) {
            rows.add(sample.stream()
                    .min(Comparator.comparingDouble(r -> Math.abs(Math.log((r.flows + r.indirect + 0.5) / target))))
                    .orElseThrow());
        }
        return rows;
    }

    /** Times {@code reps} calls; the sum of the answers keeps the work from being optimised away. */
    private static Timing time(int reps, LongSupplier call) {
        double[] wall = new double[reps];
        double[] cpu = new double[reps];
        long sink = 0;
        for (int i = 0; i < reps; i++) {
            long c0 = THREADS.getCurrentThreadCpuTime();
            long t0 = System.nanoTime();
            sink += call.getAsLong();
            wall[i] = (System.nanoTime() - t0) / 1e6;
            cpu[i] = (THREADS.getCurrentThreadCpuTime() - c0) / 1e6;
        }
        if (sink == Long.MIN_VALUE) {
            System.out.println(sink);
        }
        return new Timing(wall, cpu);
    }

    /** Runs the recursive query for one start in a child JVM and reads its verdicts. */
    private static void sql(Row row, Path dir, int reps, int timeout, int budget, String heap)
            throws IOException, InterruptedException {
        Path java = Path.of(System.getProperty("java.home"), "bin", "java");
        Path log = Files.createTempFile("headwater-sql-worker", ".log");
        Process p = new ProcessBuilder(java.toString(), "-Xmx" + heap, "-Dorg.slf4j.simpleLogger.defaultLogLevel=warn",
                "-cp", System.getProperty("java.class.path"), SqlClosureWorker.class.getName(),
                dir.toString(), Long.toString(row.start), Integer.toString(reps), Integer.toString(timeout),
                Integer.toString(budget))
                .redirectError(log.toFile()).start();
        List<double[]> ok = new ArrayList<>();
        String verdict = null;
        try (BufferedReader out = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8))) {
            for (String line; (line = out.readLine()) != null; ) {
                String[] parts = line.trim().split(" ");
                double ms = Double.parseDouble(parts[1]);
                switch (parts[0]) {
                    case "ok" -> {
                        ok.add(new double[] {ms, Double.parseDouble(parts[2])});
                        row.sqlAgrees &= Integer.parseInt(parts[3]) == row.descendants;
                    }
                    case "timeout" -> verdict = String.format(Locale.ROOT, "timeout (%d s)", timeout);
                    case "oom" -> verdict = String.format(Locale.ROOT, "out of memory (-Xmx%s) after %.0f s", heap, ms / 1000);
                    default -> throw new IllegalStateException("unexpected worker line: " + line);
                }
            }
        }
        // The worker's own limits end it; this bound only guards against a worker that hangs outright.
        if (!p.waitFor((long) budget + timeout + 120, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            verdict = "worker hung";
        } else if (p.exitValue() != 0 && verdict == null) {
            List<String> lines = Files.readAllLines(log);
            verdict = "worker failed: " + (lines.isEmpty() ? "exit " + p.exitValue() : lines.get(0));
        }
        Files.deleteIfExists(log);
        // The first attempt also pays for parsing and a cold page cache; drop it when there are enough others.
        List<double[]> measured = ok.size() >= 3 ? ok.subList(1, ok.size()) : ok;
        row.sqlTimes = new Timing(measured.stream().mapToDouble(m -> m[0]).toArray(),
                measured.stream().mapToDouble(m -> m[1]).toArray());
        String runs = ok.isEmpty() ? "" : ok.size() + " ok" + (measured.size() < ok.size() ? " (first dropped)" : "");
        row.sql = verdict == null ? runs : ok.isEmpty() ? verdict : runs + ", then " + verdict;
    }

    private static void print(SyntheticLineage g, Path dir, GraphPhase phase, int reps, double generateSeconds,
            double insertSeconds, long graphBytes, long naiveBytes, int sqlReps, int sqlTimeout, int sqlBudget,
            String sqlHeap) {
        List<Row> rows = phase.rows();
        System.out.printf(Locale.ROOT, "Headwater lineage closure benchmark (seed %d)%n", SEED);
        System.out.printf(Locale.ROOT, "synthetic DAG: %,d datasets in %d layers, %,d dataset edges, each with one column flow "
                + "(%,d column edges over %d columns per dataset)%n", g.datasets(), g.layers(), g.edges(), g.edges(), COLUMNS);
        System.out.printf(Locale.ROOT, "graph holds: %,d datasets, %,d edges, %,d column nodes, %,d column edges%n",
                phase.datasets(), phase.edges(), phase.columns(), phase.columnEdges());
        String inserted = insertSeconds < 0 ? "reused from an earlier run"
                : String.format(Locale.ROOT, "inserted with jOOQ batches in %.1f s", insertSeconds);
        System.out.printf(Locale.ROOT, "generated in %.1f s; H2 %s file store at %s %s; LineageGraph.load in %.1f s "
                + "(%.1f s CPU on the loading thread)%n", generateSeconds, org.h2.engine.Constants.VERSION, dir, inserted,
                phase.loadSeconds(), phase.loadCpuSeconds());
        System.out.printf(Locale.ROOT, "heap retained after GC: LineageGraph %.1f MiB (datasets + columns); "
                + "naive boxed maps %.1f MiB (dataset level only)%n", graphBytes / 1048576.0, naiveBytes / 1048576.0);
        System.out.printf(Locale.ROOT, "%s, %d processors, max heap %d MiB%n%n", System.getProperty("java.vm.name") + " "
                + System.getProperty("java.version"), Runtime.getRuntime().availableProcessors(),
                Runtime.getRuntime().maxMemory() / 1048576);

        System.out.printf(Locale.ROOT, "Dataset-level downstream closure, milliseconds as p50 / p95 (%d timed calls each after "
                + "%d warm-up)%n", reps, reps);
        System.out.printf(Locale.ROOT, "%-7s %7s %17s %17s %9s %17s %17s %17s %7s %7s  %s%n", "start", "desc.",
                "graph wall", "graph cpu", "+paths", "naive cpu", "SQL wall", "SQL cpu", "x wall", "x cpu", "SQL runs");
        for (Row r : rows) {
            System.out.printf(Locale.ROOT, "%-7d %,7d %17s %17s %9s %17s %17s %17s %7s %7s  %s%s%n", r.start, r.descendants,
                    both(r.graph.wall()), both(r.graph.cpu()), fmt(pct(r.graphWithPaths.wall(), 95)),
                    both(r.naive.cpu()), both(r.sqlTimes.wall()), both(r.sqlTimes.cpu()),
                    ratio(r, r.sqlTimes.wall(), r.graph.wall(), sqlTimeout), ratio(r, r.sqlTimes.cpu(), r.graph.cpu(), sqlTimeout),
                    r.sql, r.sqlAgrees ? "" : " (ROW COUNT DISAGREES)");
        }
        System.out.printf(Locale.ROOT, "graph: LineageGraph.downstream (ids, distances, one path each kept, paths not built); "
                + "+paths: wall p95 when also building every path with reached() (%d timed calls)%n", PATH_REPS);
        System.out.printf(Locale.ROOT, "x wall, x cpu: SQL p50 / graph p95 (a timeout counts as the timeout)%n");
        System.out.printf(Locale.ROOT, "naive: HashMap<Long, List<edge>> adjacency, ArrayDeque + HashMap per walk%n");
        System.out.printf(Locale.ROOT, "SQL: recursive CTE with UNION (below), count(*) of its rows, child JVM -Xmx%s, "
                + "query timeout %d s, at most %d attempts or %d s per start%n",
                sqlHeap, sqlTimeout, sqlReps, sqlBudget);
        System.out.println(SqlClosureWorker.CLOSURE.indent(4));

        System.out.printf(Locale.ROOT, "Column-level downstream closure (downstreamColumns: a direct/derived walk and an "
                + "any-role walk), milliseconds, %d timed calls each after %d warm-up;%nstarts: the columns whose reach "
                + "(flows + indirect) came closest to 10, 1,000 and 10,000 in a sample of 3,000%n", reps, reps);
        System.out.printf(Locale.ROOT, "%-12s %9s %9s %17s %17s%n", "start", "flows", "indirect", "wall p50 / p95",
                "cpu p50 / p95");
        for (ColumnRow r : phase.columnRows()) {
            System.out.printf(Locale.ROOT, "%-12s %,9d %,9d %17s %17s%n", r.dataset + "." + r.column, r.flows, r.indirect,
                    both(r.times.wall()), both(r.times.cpu()));
        }
    }

    private static String both(double[] ms) {
        return ms.length == 0 ? "-" : fmt(pct(ms, 50)) + " / " + fmt(pct(ms, 95));
    }

    private static String ratio(Row r, double[] sql, double[] graph, int timeoutSeconds) {
        double graphP95 = pct(graph, 95);
        if (sql.length > 0) {
            return String.format(Locale.ROOT, "%.0f", pct(sql, 50) / graphP95);
        }
        return r.sql.startsWith("timeout") ? String.format(Locale.ROOT, ">%.0f", timeoutSeconds * 1000.0 / graphP95) : "-";
    }

    /** Nearest-rank percentile. */
    private static double pct(double[] values, int percent) {
        double[] sorted = values.clone();
        Arrays.sort(sorted);
        int rank = (int) Math.ceil(percent / 100.0 * sorted.length);
        return sorted[Math.max(0, rank - 1)];
    }

    private static String fmt(double ms) {
        return ms < 1 ? String.format(Locale.ROOT, "%.3f", ms) : ms < 100 ? String.format(Locale.ROOT, "%.2f", ms)
                : String.format(Locale.ROOT, "%.0f", ms);
    }

    private static long usedHeapAfterGc() throws InterruptedException {
        var memory = ManagementFactory.getMemoryMXBean();
        long used = Long.MAX_VALUE;
        for (int i = 0; i < 4; i++) {
            System.gc();
            Thread.sleep(100);
            used = Math.min(used, memory.getHeapMemoryUsage().getUsed());
        }
        return used;
    }

    private static double seconds(long t0) {
        return (System.nanoTime() - t0) / 1e9;
    }

    private static Map<String, String> options(String[] args) {
        Map<String, String> options = new HashMap<>();
        for (String arg : args) {
            int eq = arg.indexOf('=');
            if (eq < 0) {
                throw new IllegalArgumentException("arguments are key=value: " + arg);
            }
            options.put(arg.substring(0, eq), arg.substring(eq + 1));
        }
        return options;
    }

    private static void deleteTree(Path dir) throws IOException {
        try (Stream<Path> paths = Files.walk(dir)) {
            for (Path p : (Iterable<Path>) paths.sorted(Comparator.reverseOrder())::iterator) {
                Files.deleteIfExists(p);
            }
        }
    }
}
