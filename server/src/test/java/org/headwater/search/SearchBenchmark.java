package org.headwater.search;

import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.Timestamp;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Random;
import org.headwater.store.CatalogReader;
import org.headwater.store.Store;
import org.headwater.store.StoreConfig;

/**
 * Search over a synthetic catalog of 100,000 datasets and 2,000,000 columns (invented names): index build time
 * from the store, p50/p95/p99 latency of a mixed query set, heap; and, in the same run, the naive alternative,
 * SQL {@code LIKE '%word%'} over dataset and column names in the same H2 store.
 *
 * <pre>java -Xmx3g -cp … org.headwater.search.SearchBenchmark [datasets] [columnsPerDataset]</pre>
 */
public final class SearchBenchmark {
    private static final String[] PLACES = {"upper", "lower", "north", "south", "east", "west", "delta", "ridge", "basin",
        "marsh", "brook", "fen", "moor", "glen", "weir", "ford"};
    private static final String[] TOPICS = {"station", "gauge", "sensor", "lab", "field", "survey", "plot", "core",
        "trap", "transect", "buoy", "well", "intake", "outfall", "reach", "pond"};
    private static final String[] MEASURES = {"nitrate", "phosphate", "sulfate", "chloride", "oxygen", "turbidity",
        "conductivity", "temperature", "rainfall", "flow", "depth", "salinity", "alkalinity", "ammonium", "silica",
        "chlorophyll", "biomass", "sediment", "humidity", "pressure", "velocity", "discharge", "iron", "zinc"};
    private static final String[] STAGES = {"raw", "clean", "merged", "monthly", "daily", "summary", "trend", "qc",
        "export", "legacy", "calibrated", "gridded"};
    private static final String[] UNITS = {"mg_l", "ug_l", "c", "ntu", "us_cm", "m3_s", "mm", "m", "pct", "hpa"};
    private static final String[] FORMATS = {"csv", "parquet", "json", "tsv"};

    private SearchBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        int datasets = args.length > 0 ? Integer.parseInt(args[0]) : 100_000;
        int perDataset = args.length > 1 ? Integer.parseInt(args[1]) : 20;
        Path dir = Files.createTempDirectory("headwater-search-bench");
        Random random = new Random(7);
        try (Store store = Store.open(StoreConfig.embedded(dir))) {
            long t0 = System.nanoTime();
            fill(store, datasets, perDataset, random);
            System.out.printf(Locale.ROOT, "store filled: %,d datasets, %,d columns in %.1f s (plain JDBC, not the ingestion path)%n",
                    datasets, (long) datasets * perDataset, seconds(t0));

            System.gc();
            long heapBefore = usedHeap();
            long t1 = System.nanoTime();
            SearchIndex index = SearchIndex.open(dir.resolve("index"), new CatalogReader(store));
            double build = seconds(t1);
            System.out.printf(Locale.ROOT, "index build from the store: %.1f s for %,d documents (target < 60 s)%n", build,
                    index.documentCount());

            List<String> queries = queries(new Random(11), 400);
            for (String q : queries.subList(0, 200)) {
                index.search(SearchRequest.of(q, null, 10));
            }
            // The first 1,000 queries after a short warm-up still run while the JIT compiles the search; a
            // server answers for hours, so the target is read off the steady state, after 20 s of the same mix,
            // as a latency benchmark's warm-up does (JMH warms up for 5 × 10 s by default). Both are printed.
            Latencies early = measure(index, queries);
            early.print("first 1,000 queries after 200 of warm-up");
            long warmUntil = System.nanoTime() + 20_000_000_000L;
            int warmed = 0;
            while (System.nanoTime() < warmUntil) {
                index.search(SearchRequest.of(queries.get(warmed++ % queries.size()), null, 10));
            }
            Latencies settled = measure(index, queries);
            settled.print(String.format(Locale.ROOT, "steady state, 1,000 queries after %,d more in 20 s (target p95 < 10 ms)", warmed));
            // Against LIKE, which is timed without a warm-up, the first pass's median: the smaller ratio.
            double p50 = early.p50;
            System.gc();
            long heapAfter = usedHeap();
            System.out.printf(Locale.ROOT, "heap used after build and queries: %.0f MiB (%.0f MiB before the index opened)%n",
                    heapAfter / 1048576.0, heapBefore / 1048576.0);

            // The naive alternative: LIKE over names, each word anywhere in a dataset or column name.
            long[] like = new long[20];
            try (Connection c = store.dsl().configuration().connectionProvider().acquire()) {
                for (int i = 0; i < like.length; i++) {
                    String word = queries.get(i).split(" ")[0].replace("\"", "").toLowerCase(Locale.ROOT);
                    long s = System.nanoTime();
                    likeSearch(c, word);
                    like[i] = System.nanoTime() - s;
                }
            }
            Arrays.sort(like);
            double likeP50 = ms(like[like.length / 2]);
            System.out.printf(Locale.ROOT, "SQL LIKE '%%word%%' over dataset and column names in H2, %d one-word queries: p50 %.1f ms, p95 %.1f ms%n",
                    like.length, likeP50, ms(like[(int) (like.length * 0.95)]));
            System.out.printf(Locale.ROOT, "search is %.0f× faster than LIKE at the median (target ≥ 50×)%n", likeP50 / p50);
            index.close();
        } finally {
            // About 2 GiB of store and index per run: not left behind in the temporary folder.
            try (java.util.stream.Stream<Path> paths = Files.walk(dir)) {
                paths.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }

    /** Latency figures of one pass over the measured queries, overall and by kind of query. */
    private record Latencies(double p50, double p95, double p99, double[][] byKind) {
        void print(String what) {
            System.out.printf(Locale.ROOT, "search, %s (words, two words, prefixes, typos, phrases, filters; top 10 with facets and snippets):%n"
                    + "  p50 %.2f ms, p95 %.2f ms, p99 %.2f ms%n", what, p50, p95, p99);
            for (int k = 0; k < KINDS.length; k++) {
                System.out.printf(Locale.ROOT, "  %-14s p50 %6.2f ms, p95 %6.2f ms%n", KINDS[k], byKind[k][0], byKind[k][1]);
            }
        }
    }

    private static Latencies measure(SearchIndex index, List<String> queries) {
        long[] nanos = new long[1000];
        long[][] byKind = new long[KINDS.length][nanos.length / KINDS.length];
        for (int i = 0; i < nanos.length; i++) {
            String q = queries.get(i % queries.size());
            long s = System.nanoTime();
            index.search(SearchRequest.of(q, null, 10));
            nanos[i] = System.nanoTime() - s;
            byKind[i % KINDS.length][i / KINDS.length] = nanos[i];
        }
        Arrays.sort(nanos);
        double[][] kindFigures = new double[KINDS.length][];
        for (int k = 0; k < KINDS.length; k++) {
            Arrays.sort(byKind[k]);
            kindFigures[k] = new double[] {ms(byKind[k][byKind[k].length / 2]), ms(byKind[k][(int) (byKind[k].length * 0.95)])};
        }
        return new Latencies(ms(nanos[nanos.length / 2]), ms(nanos[(int) (nanos.length * 0.95)]),
                ms(nanos[(int) (nanos.length * 0.99)]), kindFigures);
    }

    private static void likeSearch(Connection c, String word) throws Exception {
        String pattern = "%" + word + "%";
        try (PreparedStatement ps = c.prepareStatement("select id, name from dataset where lower(name) like ? limit 10")) {
            ps.setString(1, pattern);
            drain(ps.executeQuery());
        }
        try (PreparedStatement ps = c.prepareStatement("select c.name, d.name from schema_column c join schema_version v"
                + " on v.id = c.schema_version_id join dataset d on d.id = v.dataset_id where lower(c.name) like ? limit 10")) {
            ps.setString(1, pattern);
            drain(ps.executeQuery());
        }
        // A small tool also counts the matches to show "n results".
        try (PreparedStatement ps = c.prepareStatement("select count(*) from schema_column where lower(name) like ?")) {
            ps.setString(1, pattern);
            drain(ps.executeQuery());
        }
    }

    private static void drain(ResultSet rs) throws Exception {
        try (rs) {
            while (rs.next()) {
                rs.getString(1);
            }
        }
    }

    /** The kinds of query in {@link #queries}, in the order they repeat. */
    private static final String[] KINDS = {"one word", "word + stage", "three words", "prefix", "typo", "phrase",
        "word + format", "measure_unit"};

    static List<String> queries(Random random, int n) {
        List<String> out = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            String measure = pick(random, MEASURES);
            out.add(switch (i % 8) {
                case 0 -> measure;
                case 1 -> measure + " " + pick(random, STAGES);
                case 2 -> pick(random, TOPICS) + " " + measure + " " + pick(random, PLACES);
                case 3 -> measure.substring(0, Math.min(measure.length(), 4));
                case 4 -> typo(random, measure);
                case 5 -> "\"" + measure + " " + pick(random, STAGES) + "\"";
                case 6 -> measure + " format=" + pick(random, FORMATS);
                default -> measure + "_" + pick(random, UNITS);
            });
        }
        return out;
    }

    private static String typo(Random random, String word) {
        int at = 1 + random.nextInt(word.length() - 2);
        char[] c = word.toCharArray();
        char t = c[at];
        c[at] = c[at + 1];
        c[at + 1] = t;
        return new String(c);
    }

    private static String pick(Random random, String[] words) {
        return words[random.nextInt(words.length)];
    }

    static void fill(Store store, int datasets, int perDataset, Random random) throws Exception {
        Timestamp now = Timestamp.from(Instant.parse("2026-01-01T00:00:00Z"));
        try (Connection c = store.dsl().configuration().connectionProvider().acquire()) {
            c.setAutoCommit(false);
            try (var s = c.createStatement()) {
                s.execute("insert into source (id, name, kind, root_uri, created_at) values (1, 'synthetic', 'folder', 'file:///synthetic/', now())");
                s.execute("insert into change_log (changed_at, entity, entity_id, operation, origin) values (now(), 'dataset', 1, 'created', 'bench')");
            }
            try (PreparedStatement d = c.prepareStatement("insert into dataset (id, uri, name, kind, source_id, first_seen) values (?, ?, ?, 'file', 1, ?)");
                    PreparedStatement st = c.prepareStatement("insert into dataset_state (dataset_id, valid_from, format, size_bytes) values (?, ?, ?, ?)");
                    PreparedStatement v = c.prepareStatement("insert into schema_version (id, dataset_id, version, fingerprint, valid_from) values (?, ?, 1, 'f', ?)");
                    PreparedStatement col = c.prepareStatement("insert into schema_column (schema_version_id, ordinal, name, data_type, nullable) values (?, ?, ?, ?, true)")) {
                for (int id = 1; id <= datasets; id++) {
                    String format = pick(random, FORMATS);
                    String name = pick(random, PLACES) + "_" + pick(random, TOPICS) + "/" + pick(random, MEASURES) + "_"
                            + pick(random, STAGES) + "_" + id + "." + format;
                    d.setLong(1, id);
                    d.setString(2, "file:///synthetic/" + name);
                    d.setString(3, name);
                    d.setTimestamp(4, now);
                    d.addBatch();
                    st.setLong(1, id);
                    st.setTimestamp(2, now);
                    st.setString(3, format);
                    st.setLong(4, 1000L + id);
                    st.addBatch();
                    v.setLong(1, id);
                    v.setLong(2, id);
                    v.setTimestamp(3, now);
                    v.addBatch();
                    for (int o = 0; o < perDataset; o++) {
                        col.setLong(1, id);
                        col.setInt(2, o);
                        col.setString(3, o == 0 ? "site_id" : pick(random, MEASURES) + "_" + pick(random, UNITS));
                        col.setString(4, o == 0 ? "string" : "double");
                        col.addBatch();
                    }
                    if (id % 2000 == 0) {
                        d.executeBatch();
                        st.executeBatch();
                        v.executeBatch();
                        col.executeBatch();
                        c.commit();
                    }
                }
                d.executeBatch();
                st.executeBatch();
                v.executeBatch();
                col.executeBatch();
                c.commit();
            }
        }
    }

    private static long usedHeap() {
        Runtime r = Runtime.getRuntime();
        return r.totalMemory() - r.freeMemory();
    }

    private static double seconds(long start) {
        return (System.nanoTime() - start) / 1e9;
    }

    private static double ms(long nanos) {
        return nanos / 1e6;
    }
}
