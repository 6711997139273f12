package org.headwater.bench;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Observation;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.store.StoreConfig;

/**
 * What durable commits cost: run records (one transaction each) and harvest-sized batches (250 datasets)
 * through the ingestor, on the production H2 file (WRITE_DELAY=0), on H2 with its default write delay
 * (the naive alternative, which loses acknowledged writes to a SIGKILL), and on PostgreSQL when
 * HEADWATER_TEST_PG_URL names a server (for example the one .ci/postgres.sh starts). On PostgreSQL it also
 * measures how long a second catalog takes to see a batch through its change-log follower.
 *
 * <pre>java -cp $CP org.headwater.bench.StoreWriteBenchmark [runs] [batches]</pre>
 */
public final class StoreWriteBenchmark {
    private StoreWriteBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        int runs = args.length > 0 ? Integer.parseInt(args[0]) : 500;
        int batches = args.length > 1 ? Integer.parseInt(args[1]) : 20;
        Path temp = Files.createTempDirectory("hw-write-bench");
        List<String[]> stores = new ArrayList<>();
        stores.add(new String[] {"H2 file, WRITE_DELAY=0 (production)", StoreConfig.embedded(temp.resolve("durable")).jdbcUrl()});
        stores.add(new String[] {"H2 file, default write delay (naive)", "jdbc:h2:file:" + temp.resolve("lazy/catalog")});
        String pg = System.getenv("HEADWATER_TEST_PG_URL");
        if (pg != null && !pg.isBlank()) {
            String name = "bench_" + ProcessHandle.current().pid();
            try (var c = java.sql.DriverManager.getConnection(pg, user(), ""); var s = c.createStatement()) {
                s.execute("create database " + name);
            }
            stores.add(new String[] {"PostgreSQL 15 (loopback, fsync off in the test cluster)",
                    pg.substring(0, pg.lastIndexOf('/') + 1) + name});
        }
        System.out.printf("%-55s %12s %12s %14s %14s%n", "store", "runs/s", "runs/s", "ms/250-batch", "ms/250-batch");
        System.out.printf("%-55s %12s %12s %14s %14s%n", "", "store only", "+index", "store only", "+index");
        for (String[] store : stores) {
            StoreConfig config = new StoreConfig(store[1], store[1].startsWith("jdbc:h2") ? "sa" : user(), "");
            Path dir = Files.createDirectories(temp.resolve("index-" + Math.abs(store[0].hashCode())));
            try (Catalog catalog = Catalog.open(dir, config, Clock.systemUTC(), null)) {
                warm(catalog);
                // The same batches through an ingestor with no listeners (the store's own cost), then through
                // the catalog's, which also updates the search index (a Lucene commit per batch) and the graph.
                Ingestor storeOnly = new Ingestor(catalog.store(), Clock.systemUTC());
                double[] bare = measure(storeOnly, runs, batches, "s");
                double[] full = measure(catalog.ingestor(), runs, batches, "c");
                System.out.printf("%-55s %12.0f %12.0f %14.1f %14.1f%n", store[0], bare[0], full[0], bare[1], full[1]);
                if (catalog.store().shared()) {
                    followLatency(catalog, config, dir.resolve("second"));
                }
            }
        }
    }

    private static double[] measure(Ingestor ingestor, int runs, int batches, String tag) {
        long t0 = System.nanoTime();
        for (int i = 0; i < runs; i++) {
            ingestor.apply("bench", List.of(run(tag + "-r-" + i)));
        }
        double perSecond = runs / ((System.nanoTime() - t0) / 1e9);
        long t1 = System.nanoTime();
        for (int b = 0; b < batches; b++) {
            ingestor.apply("bench", batch(tag + b));
        }
        return new double[] {perSecond, (System.nanoTime() - t1) / 1e6 / batches};
    }

    private static void followLatency(Catalog writer, StoreConfig config, Path dir) throws IOException {
        try (Catalog reader = Catalog.open(dir, config, Clock.systemUTC(), null)) {
            List<Double> millis = new ArrayList<>();
            for (int i = 0; i < 20; i++) {
                writer.ingestor().apply("bench", List.of(dataset("file:///srv/estuary/follow/" + i + "_x.csv")));
                long t = System.nanoTime();
                int seen = reader.follower().poll();
                millis.add((System.nanoTime() - t) / 1e6);
                if (seen == 0) {
                    throw new IllegalStateException("the follower saw nothing");
                }
            }
            millis.sort(null);
            System.out.printf("  second catalog: one poll that delivers one new dataset to its index and graph: median %.1f ms,"
                    + " max %.1f ms (plus the poll interval, %d ms)%n", millis.get(10), millis.get(19),
                    Catalog.FOLLOW_INTERVAL.toMillis());
        }
    }

    private static void warm(Catalog catalog) {
        for (int i = 0; i < 50; i++) {
            catalog.ingestor().apply("warm", List.of(run("warm-" + i)));
        }
    }

    private static String user() {
        return System.getenv().getOrDefault("HEADWATER_TEST_PG_USER", "headwater");
    }

    private static Observation run(String id) {
        Instant t = Instant.parse("2026-11-30T08:00:00Z");
        return new Observation.RunReported(id, "bench", "file:///srv/estuary/scripts/tally.py", null, null, t,
                t.plus(Duration.ofSeconds(3)), 0, null, null, null, "[]",
                List.of(new Observation.RunIo("file:///srv/estuary/in/gauges.csv", "read", 10L, null, null, null, null),
                        new Observation.RunIo("file:///srv/estuary/out/" + id + ".csv", "write", 10L, null, null, null, null)));
    }

    private static List<Observation> batch(String b) {
        List<Observation> batch = new ArrayList<>(250);
        for (int i = 0; i < 250; i++) {
            batch.add(dataset("file:///srv/estuary/lake/b" + b + "/f" + i + "_x.csv"));
        }
        return batch;
    }

    private static Observation dataset(String uri) {
        return new Observation.DatasetSeen(uri, uri.substring("file:///srv/".length()), DatasetKind.FILE, null, "csv",
                12L, null, null, 1L, true, null, null, List.of(new ColumnDef("level_cm", "integer", true)));
    }
}
