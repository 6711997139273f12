package org.headwater.bench;

import java.lang.management.ManagementFactory;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicLong;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.config.DatabaseHarvests;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourcesConfig;
import org.headwater.testing.S3TestServer;
import org.headwater.testing.TestCatalogs;
import software.amazon.awssdk.services.s3.S3Client;
import software.amazon.awssdk.services.s3.model.GetObjectRequest;
import software.amazon.awssdk.services.s3.model.ListObjectsV2Request;
import software.amazon.awssdk.services.s3.model.S3Object;

/**
 * Lists and samples N objects (default 10,000 small CSV files of an invented tide-gauge network) on the
 * in-process S3 server: Headwater's harvest of the bucket (first harvest, then an unchanged re-harvest)
 * next to, in the same run, a plain SDK loop that lists the bucket and issues one ranged GET of the first
 * 64 KiB per object, once one after another and once on as many threads as the harvest uses.
 * Usage: {@code ObjectStoreBenchmark [objects] [flat]}.
 */
public final class ObjectStoreBenchmark {
    private static final int SAMPLE = 64 * 1024;
    private static final int THREADS = 8;

    private ObjectStoreBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        int n = args.length > 0 ? Integer.parseInt(args[0]) : 10_000;
        // "flat" names objects with letters only, so no two share a partition pattern: every object is its own
        // dataset and the partition-set assembly is left out of the comparison.
        boolean flat = args.length > 1 && args[1].equals("flat");
        try (S3TestServer server = S3TestServer.start()) {
            server.createBucket("tide-network");
            long fill = System.nanoTime();
            fill(server, n, flat);
            System.out.printf("filled %,d objects in %.1f s%n", n, (System.nanoTime() - fill) / 1e9);

            // Warm both paths once on a small prefix so neither pays the JIT alone.
            plainLoop(server.client(), flat ? "gauge-a/" : "gauge-000/", 1);
            double sequential = seconds(() -> plainLoop(server.client(), "", 1));
            double parallel = seconds(() -> plainLoop(server.client(), "", THREADS));

            Path dir = Files.createTempDirectory("objstore-bench");
            try (Catalog catalog = TestCatalogs.fresh(dir)) {
                SourcesConfig config = SourcesConfig.parse("""
                        sources:
                          - name: tides
                            kind: s3
                            url: s3://tide-network/
                            endpoint: %s
                            path-style: true
                            access-key-env: K
                            secret-key-env: S
                        """.formatted(server.endpoint()), null, "benchmark");
                SourceRunner runner = new SourceRunner(catalog, DatabaseHarvests.NONE,
                        Map.of("K", S3TestServer.ACCESS_KEY, "S", S3TestServer.SECRET_KEY)::get);
                long t = System.nanoTime();
                var first = runner.run(config, null, false, s -> HarvestProgress.NONE).get(0);
                // Until the search index holds it too: the index is written on its own thread.
                long indexed = catalog.index().absorbedSeq();
                double harvest = (System.nanoTime() - t) / 1e9;
                t = System.nanoTime();
                var again = runner.run(config, null, false, s -> HarvestProgress.NONE).get(0);
                catalog.index().absorbedSeq();
                double reharvest = (System.nanoTime() - t) / 1e9;
                if (indexed == 0) {
                    throw new IllegalStateException("the search index absorbed nothing");
                }
                if (first.failed() || first.summary().filesSeen() != n) {
                    throw new IllegalStateException("the harvest did not see every object: " + first);
                }
                System.out.printf("plain SDK loop, sequential (list + 1 ranged GET each): %.2f s%n", sequential);
                System.out.printf("plain SDK loop, %d threads:                            %.2f s%n", THREADS, parallel);
                System.out.printf("Headwater harvest (first, %d datasets):               %.2f s  = %.2fx sequential, %.2fx threaded%n",
                        first.summary().datasets(), harvest, harvest / sequential, harvest / parallel);
                System.out.printf("Headwater re-harvest (%d unchanged, list only):       %.2f s%n",
                        again.summary().filesUnchanged(), reharvest);
                System.out.printf("peak heap: %d MiB%n", peakHeapMiB());
            }
        }
    }

    private static void fill(S3TestServer server, int n, boolean flat) throws Exception {
        ExecutorService pool = Executors.newFixedThreadPool(THREADS);
        List<Future<?>> puts = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            int id = i;
            puts.add(pool.submit(() -> {
                StringBuilder csv = new StringBuilder("taken_at,level_m,gauge\n");
                for (int r = 0; r < 20; r++) {
                    csv.append("2026-01-").append(10 + r % 18).append("T0").append(r % 10).append(":00:00Z,")
                            .append(1 + (id * 7 + r) % 300 / 100.0).append(",G").append(id).append('\n');
                }
                String key = flat ? "gauge-" + letters(id % 100) + "/log-" + letters(id) + ".csv"
                        : "gauge-%03d/day-%05d.csv".formatted(id % 100, id);
                server.put("tide-network", key,
                        csv.toString().getBytes(StandardCharsets.UTF_8));
            }));
        }
        for (Future<?> f : puts) {
            f.get();
        }
        pool.shutdown();
    }

    private static String letters(int id) {
        StringBuilder b = new StringBuilder();
        int v = id;
        do {
            b.append((char) ('a' + v % 26));
            v /= 26;
        } while (v > 0);
        return b.toString();
    }

    /** Lists the bucket and fetches the first 64 KiB of every object; returns the bytes read. */
    private static long plainLoop(S3Client client, String prefix, int threads) throws Exception {
        List<S3Object> objects = new ArrayList<>();
        client.listObjectsV2Paginator(ListObjectsV2Request.builder().bucket("tide-network").prefix(prefix).build())
                .contents().forEach(objects::add);
        AtomicLong bytes = new AtomicLong();
        ExecutorService pool = Executors.newFixedThreadPool(threads);
        List<Future<?>> gets = new ArrayList<>();
        for (S3Object o : objects) {
            gets.add(pool.submit(() -> bytes.addAndGet(client.getObjectAsBytes(GetObjectRequest.builder()
                    .bucket("tide-network").key(o.key()).range("bytes=0-" + (SAMPLE - 1)).build()).asByteArray().length)));
        }
        for (Future<?> f : gets) {
            f.get();
        }
        pool.shutdown();
        return bytes.get();
    }

    private interface Work {
        Object run() throws Exception;
    }

    private static double seconds(Work work) throws Exception {
        long t = System.nanoTime();
        work.run();
        return (System.nanoTime() - t) / 1e9;
    }

    private static long peakHeapMiB() {
        long peak = 0;
        for (var pool : ManagementFactory.getMemoryPoolMXBeans()) {
            if (pool.getType() == java.lang.management.MemoryType.HEAP && pool.getPeakUsage() != null) {
                peak += pool.getPeakUsage().getUsed();
            }
        }
        return peak / (1024 * 1024);
    }
}
