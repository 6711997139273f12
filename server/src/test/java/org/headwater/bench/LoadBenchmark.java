package org.headwater.bench;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import org.headwater.Catalog;

/**
 * The team load as a benchmark: 50 readers and 10 run posters for 60 s (arguments: readers posters
 * seconds) while the demo workspace is harvested in full again and again, on an embedded H2 file
 * catalog; prints throughput, p50/p99 latencies, errors and whether every acknowledged run was stored.
 * The floor printed beside it is the same reads by 1 client with nothing else running.
 */
public final class LoadBenchmark {
    private LoadBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        int readers = args.length > 0 ? Integer.parseInt(args[0]) : 50;
        int posters = args.length > 1 ? Integer.parseInt(args[1]) : 10;
        int seconds = args.length > 2 ? Integer.parseInt(args[2]) : 60;
        Path dir = Files.createTempDirectory("headwater-load");
        try (Catalog floorCatalog = Catalog.open(dir.resolve("floor-catalog"))) {
            LoadRun.Result floor = LoadRun.run(dir.resolve("floor"), 1, 0, false, Duration.ofSeconds(10), floorCatalog);
            System.out.println("floor (1 reader, no posts, no harvest, 10 s): " + floor.report());
        }
        try (Catalog catalog = Catalog.open(dir.resolve("catalog"))) {
            LoadRun.Result result = LoadRun.run(dir.resolve("load"), readers, posters, Duration.ofSeconds(seconds), catalog);
            System.out.println("load: " + result.report());
            System.out.println(result.errors() == 0 && result.acknowledged() == result.storedRuns()
                    ? "zero errors, zero lost runs" : "ERRORS OR LOST RUNS");
        }
        try (var walk = Files.walk(dir)) {
            walk.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
        }
    }
}
