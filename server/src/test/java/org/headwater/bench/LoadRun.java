package org.headwater.bench;

import static org.headwater.store.schema.Tables.RUN;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.harvest.HarvestProgress;
import org.headwater.http.ApiServer;
import org.headwater.http.ServerSettings;
import org.headwater.testing.TestTokens;
import org.headwater.testing.Workspaces;

/**
 * A bounded loopback load: readers search and browse while posters send run records and a harvest runs
 * again and again, for a fixed time, all in one JVM through {@link HttpClient}. Counts every non-2xx
 * answer and failed call as an error and checks at the end that every acknowledged run is in the store.
 */
public final class LoadRun {
    /** What a run measured. */
    public record Result(int readers, int posters, long seconds, long reads, long posts, long acknowledged,
            long storedRuns, long errors, int harvests, double[] readMillis, double[] postMillis, List<String> firstErrors) {

        public double percentile(double[] sorted, double p) {
            return sorted.length == 0 ? Double.NaN : sorted[Math.min(sorted.length - 1, (int) Math.ceil(p * sorted.length) - 1)];
        }

        public String report() {
            return String.format("%d readers, %d posters, %d s: %d reads (p50 %.1f ms, p99 %.1f ms), %d runs posted "
                            + "(p50 %.1f ms, p99 %.1f ms), %d acknowledged, %d in the store, %d harvests, %d errors%s",
                    readers, posters, seconds, reads, percentile(readMillis, 0.5), percentile(readMillis, 0.99), posts,
                    percentile(postMillis, 0.5), percentile(postMillis, 0.99), acknowledged, storedRuns, harvests, errors,
                    firstErrors.isEmpty() ? "" : " " + firstErrors);
        }
    }

    private LoadRun() {
    }

    /** Runs the load against a fresh catalog in {@code dir} on a copy of the demo workspace. */
    public static Result run(Path dir, int readers, int posters, Duration length, Catalog catalog) throws Exception {
        return run(dir, readers, posters, true, length, catalog);
    }

    /** As above; {@code harvesting} false leaves out the repeating harvest (for a floor). */
    public static Result run(Path dir, int readers, int posters, boolean harvesting, Duration length, Catalog catalog)
            throws Exception {
        Path workspace = Workspaces.demoCopy(dir.resolve("workspace"));
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        // Rate limits are raised: this measures the server, not the limiter (LimitsTest covers that).
        ServerSettings settings = ServerSettings.defaults().withRate(1_000_000, 1_000_000).withRoots(List.of(workspace));
        try (ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0, settings)) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            List<Long> ids = catalog.reader().datasets(null, 0, 100, null).stream().map(d -> d.id()).toList();
            HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
            long deadline = System.nanoTime() + length.toNanos();
            AtomicLong errors = new AtomicLong();
            AtomicLong acknowledged = new AtomicLong();
            AtomicInteger harvests = new AtomicInteger();
            ConcurrentLinkedQueue<String> firstErrors = new ConcurrentLinkedQueue<>();
            List<double[]> readLatencies = new ArrayList<>();
            List<double[]> postLatencies = new ArrayList<>();
            List<Thread> threads = new ArrayList<>();
            String[] words = {"nitrate", "station", "flow", "reading", "temperature", "sample", "river", "lab"};
            for (int t = 0; t < readers; t++) {
                int seed = t;
                Latencies lat = new Latencies();
                threads.add(new Thread(() -> {
                    Random r = new Random(seed);
                    while (System.nanoTime() < deadline) {
                        long id = ids.get(r.nextInt(ids.size()));
                        String path = switch (r.nextInt(4)) {
                            case 0 -> "api/search?q=" + words[r.nextInt(words.length)];
                            case 1 -> "api/datasets?limit=20&offset=" + r.nextInt(10);
                            case 2 -> "api/datasets/" + id;
                            default -> "api/datasets/" + id + "/lineage";
                        };
                        call(http, HttpRequest.newBuilder(URI.create(server.url() + path)).GET(), lat, errors, firstErrors, null);
                    }
                    synchronized (readLatencies) {
                        readLatencies.add(lat.values());
                    }
                }, "load-reader-" + t));
            }
            for (int t = 0; t < posters; t++) {
                int poster = t;
                Latencies lat = new Latencies();
                threads.add(new Thread(() -> {
                    for (int i = 0; System.nanoTime() < deadline; i++) {
                        String body = "{\"run_id\": \"load-" + poster + "-" + i + "\", \"client\": \"load\", \"script\": {\"path\": \""
                                + workspace.resolve("scripts/clean_readings.py") + "\"}, \"started_at\": \"2026-06-01T08:00:00Z\","
                                + " \"io\": [{\"path\": \"" + workspace.resolve("lab/nitrate_results_2025.csv")
                                + "\", \"direction\": \"read\", \"bytes\": 100}]}";
                        call(http, HttpRequest.newBuilder(URI.create(server.url() + "api/runs"))
                                .header("Authorization", TestTokens.bearer(token)).header("Content-Type", "application/json")
                                .POST(HttpRequest.BodyPublishers.ofString(body)), lat, errors, firstErrors, acknowledged);
                    }
                    synchronized (postLatencies) {
                        postLatencies.add(lat.values());
                    }
                }, "load-poster-" + t));
            }
            threads.add(new Thread(() -> {
                while (harvesting && System.nanoTime() < deadline) {
                    try {
                        catalog.harvestFolder(workspace, true, HarvestProgress.NONE);
                        harvests.incrementAndGet();
                    } catch (Exception e) {
                        errors.incrementAndGet();
                        firstErrors.add("harvest: " + e);
                    }
                }
            }, "load-harvest"));
            threads.forEach(Thread::start);
            for (Thread t : threads) {
                t.join();
            }
            long stored = catalog.store().dsl().fetchCount(RUN, RUN.ID.like("load-%"));
            double[] reads = merge(readLatencies);
            double[] posts = merge(postLatencies);
            return new Result(readers, posters, length.toSeconds(), reads.length, posts.length, acknowledged.get(), stored,
                    errors.get(), harvests.get(), reads, posts, firstErrors.stream().limit(5).toList());
        }
    }

    private static void call(HttpClient http, HttpRequest.Builder request, Latencies lat, AtomicLong errors,
            ConcurrentLinkedQueue<String> firstErrors, AtomicLong acknowledged) {
        long start = System.nanoTime();
        try {
            HttpResponse<String> answer = http.send(request.timeout(Duration.ofSeconds(30)).build(),
                    HttpResponse.BodyHandlers.ofString());
            lat.add((System.nanoTime() - start) / 1e6);
            if (answer.statusCode() / 100 != 2) {
                errors.incrementAndGet();
                if (firstErrors.size() < 5) {
                    firstErrors.add(answer.statusCode() + " " + answer.body());
                }
            } else if (acknowledged != null && answer.statusCode() == 201) {
                acknowledged.incrementAndGet();
            }
        } catch (Exception e) {
            errors.incrementAndGet();
            if (firstErrors.size() < 5) {
                firstErrors.add(e.toString());
            }
        }
    }

    private static double[] merge(List<double[]> parts) {
        double[] all = parts.stream().flatMapToDouble(Arrays::stream).toArray();
        Arrays.sort(all);
        return all;
    }

    /** One thread's latencies, unsynchronised. */
    private static final class Latencies {
        private double[] values = new double[1024];
        private int n;

        void add(double v) {
            if (n == values.length) {
                values = Arrays.copyOf(values, n * 2);
            }
            values[n++] = v;
        }

        double[] values() {
            return Arrays.copyOf(values, n);
        }
    }
}
