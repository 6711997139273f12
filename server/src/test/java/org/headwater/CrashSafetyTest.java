package org.headwater;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.HARVEST;
import static org.headwater.store.schema.Tables.RUN;
import static org.headwater.store.schema.Tables.RUN_IO;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.stream.Stream;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.ingest.HarvestJournal;
import org.headwater.store.StoreConfig;
import org.headwater.testing.ChildServer;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;
import org.jooq.impl.DSL;

/**
 * A real Headwater process killed with SIGKILL mid-work, then the catalog opened again: nothing half
 * applied, nothing acknowledged lost, the index agreeing with the store. Runs on H2 and (in the
 * postgresql-store execution) on PostgreSQL.
 */
@Timeout(value = 600, unit = TimeUnit.SECONDS)
class CrashSafetyTest {
    private static final int FILES = 5000;

    @TempDir
    Path temp;

    @Test
    void aHarvestKilledMidwayIsMarkedInterruptedAndTheNextHarvestCompletesItExactlyOnce() throws Exception {
        Path lake = writeLake(temp.resolve("lake"));
        Path dataDir = temp.resolve("catalog");
        StoreConfig store = TestCatalogs.persistentStore(dataDir);
        try (ChildServer child = ChildServer.start(temp.resolve("harvest.log"), List.of(),
                withStore(store, dataDir, "harvest", lake.toString()))) {
            // The index commits after each batch the store committed: its first commit file means the
            // harvest is under way with more than 4,000 files still to go.
            long deadline = System.nanoTime() + Duration.ofSeconds(240).toNanos();
            while (!committedOnce(dataDir.resolve("index")) && child.alive() && System.nanoTime() < deadline) {
                Thread.sleep(20);
            }
            assertThat(child.alive()).as("the harvest was still running when killed: %s", child.output()).isTrue();
            child.kill();
        }

        try (Catalog catalog = Catalog.open(dataDir, store, java.time.Clock.systemUTC())) {
            var db = catalog.store().dsl();
            assertThat(db.select(HARVEST.STATUS).from(HARVEST).fetch(HARVEST.STATUS))
                    .containsExactly(HarvestJournal.INTERRUPTED);
            int partial = db.fetchCount(DATASET);
            assertThat(partial).isBetween(1, FILES - 1);
            assertConsistent(catalog);

            HarvestSummary again = catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            assertThat(again.status()).isEqualTo(HarvestJournal.OK);
            assertThat(db.fetchCount(DATASET)).isEqualTo(FILES);
            assertConsistent(catalog);
            // expected: SHA-256 (FIPS 180-4) computed by the JDK's MessageDigest, and the line count of each
            // file read with java.nio minus its header line: every file present once with its true content.
            Map<String, String> stored = new TreeMap<>();
            for (var r : db.select(DATASET.URI, DATASET_STATE.CONTENT_HASH, DATASET_STATE.ROW_COUNT).from(DATASET)
                    .join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID)).where(DATASET_STATE.VALID_TO.isNull())
                    .fetch()) {
                stored.put(r.value1(), r.value2() + " " + r.value3());
            }
            Map<String, String> expected = new TreeMap<>();
            MessageDigest sha = MessageDigest.getInstance("SHA-256");
            try (Stream<Path> files = Files.walk(lake)) {
                for (Path f : (Iterable<Path>) files.filter(Files::isRegularFile)::iterator) {
                    byte[] bytes = Files.readAllBytes(f);
                    expected.put(f.toRealPath().toUri().toString(), HexFormat.of().formatHex(sha.digest(bytes)) + " "
                            + (Files.readAllLines(f).size() - 1));
                }
            }
            assertThat(stored).isEqualTo(expected);
        }
    }

    @Test
    void aServerKilledDuringABurstOfRunRecordsKeepsEveryAcknowledgedRunExactlyOnce() throws Exception {
        Path dataDir = temp.resolve("catalog");
        StoreConfig store = TestCatalogs.persistentStore(dataDir);
        Set<String> acknowledged = ConcurrentHashMap.newKeySet();
        AtomicInteger attempted = new AtomicInteger();
        // Run records need a harvester token (README, "Security model"); the burst must not meet the rate limit.
        try (Catalog catalog = Catalog.open(dataDir, store, java.time.Clock.systemUTC())) {
            token = org.headwater.testing.TestTokens.create(catalog, org.headwater.access.Role.HARVESTER);
        }
        try (ChildServer child = ChildServer.start(temp.resolve("serve.log"), List.of(),
                withStore(store, dataDir, "serve", "--port", "0", "--rate-limit", "100000"))) {
            String url = child.awaitUrl(Duration.ofSeconds(120));
            ExecutorService senders = Executors.newFixedThreadPool(4);
            for (int t = 0; t < 4; t++) {
                int thread = t;
                senders.submit(() -> send(url, thread, attempted, acknowledged));
            }
            long deadline = System.nanoTime() + Duration.ofSeconds(120).toNanos();
            while (acknowledged.size() < 200 && System.nanoTime() < deadline) {
                Thread.sleep(5);
            }
            child.kill();
            senders.shutdown();
            assertThat(senders.awaitTermination(60, TimeUnit.SECONDS)).isTrue();
        }
        assertThat(acknowledged).hasSizeGreaterThanOrEqualTo(200);

        // Restart the server and send every record again, as a connector's spool does after a failure.
        try (ChildServer child = ChildServer.start(temp.resolve("serve-again.log"), List.of(),
                withStore(store, dataDir, "serve", "--port", "0", "--rate-limit", "100000"))) {
            String url = child.awaitUrl(Duration.ofSeconds(120));
            HttpClient http = HttpClient.newHttpClient();
            int resentNew = 0;
            for (int i = 0; i < attempted.get(); i++) {
                HttpResponse<String> r = post(http, url, runId(i));
                assertThat(r.statusCode()).isIn(200, 201);
                if (r.statusCode() == 201) {
                    assertThat(acknowledged).doesNotContain(runId(i));
                    resentNew++;
                }
            }
            // expected: RFC 9110 section 15.3.2: 201 Created only for a record the store did not hold yet.
            assertThat(resentNew).isLessThanOrEqualTo(attempted.get() - acknowledged.size());
            child.kill();
        }

        try (Catalog catalog = Catalog.open(dataDir, store, java.time.Clock.systemUTC())) {
            var db = catalog.store().dsl();
            for (String id : acknowledged) {
                assertThat(db.fetchCount(RUN, RUN.ID.eq(id))).as(id).isEqualTo(1);
            }
            assertThat(db.fetchCount(RUN)).isEqualTo(attempted.get());
            // Each record names one input and one output: never a run with half its rows.
            assertThat(db.select(RUN_IO.RUN_ID, DSL.count()).from(RUN_IO).groupBy(RUN_IO.RUN_ID)
                    .having(DSL.count().ne(2)).fetch()).isEmpty();
            assertThat(db.fetchCount(RUN_IO)).isEqualTo(2 * attempted.get());
            assertConsistent(catalog);
        }
    }

    private static void send(String url, int thread, AtomicInteger attempted, Set<String> acknowledged) {
        HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
        while (true) {
            int i = attempted.getAndIncrement();
            try {
                HttpResponse<String> r = post(http, url, runId(i));
                if (r.statusCode() / 100 == 2) {
                    acknowledged.add(runId(i));
                }
            } catch (IOException e) {
                return; // the server is gone
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            }
        }
    }

    /** The harvester token the burst posts with, created in the catalog before the server starts. */
    private static volatile String token;

    private static String runId(int i) {
        return "burst-" + i;
    }

    private static HttpResponse<String> post(HttpClient http, String url, String runId)
            throws IOException, InterruptedException {
        int n = Integer.parseInt(runId.substring(runId.indexOf('-') + 1));
        String body = "{\"run_id\":\"" + runId + "\",\"client\":\"crash-test\",\"script\":{\"path\":\"/srv/tidepool/scripts/"
                + "tally.py\"},\"started_at\":\"2026-11-30T08:00:00Z\",\"io\":["
                + "{\"path\":\"/srv/tidepool/in/gauge_" + (n % 7) + ".csv\",\"direction\":\"read\"},"
                + "{\"path\":\"/srv/tidepool/out/tally_" + n + ".csv\",\"direction\":\"write\"}]}";
        return http.send(HttpRequest.newBuilder(URI.create(url + "api/runs")).timeout(Duration.ofSeconds(30))
                .header("content-type", "application/json").header("Authorization", "Bearer " + token)
                .POST(HttpRequest.BodyPublishers.ofString(body, StandardCharsets.UTF_8)).build(),
                HttpResponse.BodyHandlers.ofString());
    }

    /** Every dataset has at most one current state, and the index holds exactly what the store holds. */
    private static void assertConsistent(Catalog catalog) {
        var db = catalog.store().dsl();
        assertThat(db.select(DATASET_STATE.DATASET_ID).from(DATASET_STATE).where(DATASET_STATE.VALID_TO.isNull())
                .groupBy(DATASET_STATE.DATASET_ID).having(DSL.count().gt(1)).fetch()).isEmpty();
        assertThat(catalog.index().absorbedSeq()).isEqualTo(catalog.reader().lastChangeSeq());
        assertThat(catalog.index().keys()).isEqualTo(org.headwater.testing.IndexKeys.expected(catalog));
    }

    private static boolean committedOnce(Path index) throws IOException {
        if (!Files.isDirectory(index)) {
            return false;
        }
        try (Stream<Path> files = Files.list(index)) {
            return files.anyMatch(f -> f.getFileName().toString().startsWith("segments_"));
        }
    }

    private static String[] withStore(StoreConfig store, Path dataDir, String... command) {
        List<String> args = new ArrayList<>(List.of(command));
        args.addAll(List.of("--data-dir", dataDir.toString()));
        if (TestCatalogs.onPostgres()) {
            args.addAll(List.of("--store-url", store.jdbcUrl(), "--store-user", store.user()));
        }
        return args.toArray(String[]::new);
    }

    /**
     * An invented lake of small CSV files whose names share no partition pattern (letters only), so each
     * file is a dataset of its own.
     */
    private static Path writeLake(Path lake) throws IOException {
        for (int i = 0; i < FILES; i++) {
            Path dir = Files.createDirectories(lake.resolve("zone_" + letters(i / 100)));
            StringBuilder csv = new StringBuilder("gauge,level_cm\n");
            for (int row = 0; row < 1 + i % 5; row++) {
                csv.append("g").append(letters(i)).append(',').append(i + row).append('\n');
            }
            Files.writeString(dir.resolve("reach_" + letters(i) + ".csv"), csv);
        }
        return lake.toRealPath();
    }

    private static String letters(int n) {
        StringBuilder s = new StringBuilder();
        do {
            s.insert(0, (char) ('a' + n % 26));
            n /= 26;
        } while (n > 0);
        return s.toString();
    }
}
