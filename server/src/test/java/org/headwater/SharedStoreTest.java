package org.headwater;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.store.schema.Tables.CHANGE_LOG;
import static org.headwater.store.schema.Tables.HARVEST;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import org.headwater.harvest.HarvestProgress;
import org.headwater.ingest.HarvestJournal;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Sources;
import org.headwater.lineage.Query;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.search.SearchHit;
import org.headwater.store.StoreConfig;
import org.headwater.testing.ChildServer;
import org.headwater.testing.TestPostgres;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;

/** Several catalogs, each with its own index and graph, on one PostgreSQL store. */
@Timeout(180)
class SharedStoreTest {
    @TempDir
    Path temp;

    StoreConfig store;

    @BeforeEach
    void freshStore() {
        TestPostgres.Database db = TestPostgres.freshDatabase("shared");
        store = new StoreConfig(db.url(), db.user(), "");
    }

    private Catalog open(String name, Duration followInterval) {
        return Catalog.open(temp.resolve(name), store, Clock.systemUTC(), followInterval);
    }

    @Test
    void aHarvestThroughOneCatalogReachesTheOthersSearchAndLineageAtItsNextPoll() throws Exception {
        try (Catalog writer = open("a", null); Catalog follower = open("b", null)) {
            writer.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            assertThat(follower.index().documentCount()).isZero();

            int delivered = follower.follower().poll();

            assertThat(delivered).isEqualTo(writer.reader().changeLogSize());
            assertThat(follower.follower().seen()).isEqualTo(writer.reader().lastChangeSeq());
            // The demo's counts as ApiServerTest states them: 21 datasets and 8 scripts; the index holds
            // the 16 file datasets, 5 SQL tables and views and 8 scripts (SearchIndexTest).
            assertThat(follower.index().documentCount()).isEqualTo(writer.index().documentCount()).isEqualTo(162); // 21 datasets, 8 scripts, 133 columns (IndexStoreAgreementTest)
            assertThat(names(follower.index().search("nitrate", null, 5)))
                    .isEqualTo(names(writer.index().search("nitrate", null, 5)));
            assertThat(follower.lineage().edgeCount()).isEqualTo(writer.lineage().edgeCount()).isPositive();
            assertThat(follower.lineage().columnEdgeCount()).isEqualTo(writer.lineage().columnEdgeCount());
            long merged = writer.reader().datasets("file", 0, 100, null).stream()
                    .filter(d -> d.name().equals("derived/lab_merged.csv")).findFirst().orElseThrow().id();
            assertThat(follower.lineage().upstream(merged, Query.everything()).reached())
                    .isEqualTo(writer.lineage().upstream(merged, Query.everything()).reached()).isNotEmpty();
        }
    }

    @Test
    void aCatalogFollowingOnATimerSeesAnotherCatalogsHarvestWithinSeconds() throws Exception {
        try (Catalog writer = open("a", null); Catalog follower = open("b", Duration.ofMillis(200))) {
            writer.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            long deadline = System.nanoTime() + Duration.ofSeconds(20).toNanos();
            while (follower.index().documentCount() < 162 && System.nanoTime() < deadline) {
                Thread.sleep(100);
            }
            assertThat(follower.index().documentCount()).isEqualTo(162); // 21 datasets, 8 scripts, 133 columns (IndexStoreAgreementTest)
            assertThat(follower.index().absorbedSeq()).isEqualTo(writer.reader().lastChangeSeq());
        }
    }

    @Test
    void writersInTwoCatalogsTakeTurnsSoTheChangeLogIsInTimeOrderWithEveryBatchWhole() throws Exception {
        try (Catalog a = open("a", null); Catalog b = open("b", null)) {
            ExecutorService pool = Executors.newFixedThreadPool(2);
            List<Future<?>> done = new ArrayList<>();
            for (Catalog c : List.of(a, b)) {
                String who = c == a ? "a" : "b";
                done.add(pool.submit(() -> {
                    for (int i = 0; i < 40; i++) {
                        List<Observation> batch = new ArrayList<>();
                        for (int j = 0; j < 5; j++) {
                            batch.add(dataset("file:///srv/tidepool/" + who + "/" + i + "_" + j + ".csv"));
                        }
                        c.ingestor().apply("test:" + who, batch);
                    }
                    return null;
                }));
            }
            for (Future<?> f : done) {
                f.get();
            }
            pool.shutdown();
            var log = a.store().dsl().select(CHANGE_LOG.SEQ, CHANGE_LOG.CHANGED_AT, CHANGE_LOG.ORIGIN)
                    .from(CHANGE_LOG).orderBy(CHANGE_LOG.SEQ).fetch();
            // 2 writers x 40 batches x 5 new datasets; every dataset logs "created" (IngestorTest).
            assertThat(log).hasSizeGreaterThanOrEqualTo(400);
            OffsetDateTime previous = OffsetDateTime.MIN;
            String previousOrigin = null;
            int runs = 0;
            for (var row : log) {
                // Serialised writers: a later sequence number never carries an earlier time.
                assertThat(row.value2()).isAfterOrEqualTo(previous);
                previous = row.value2();
                if (!row.value3().equals(previousOrigin)) {
                    runs++;
                    previousOrigin = row.value3();
                }
            }
            // Batches never interleave: each origin's rows come in whole batches (at most one run per batch).
            assertThat(runs).isLessThanOrEqualTo(80);
            a.follower().poll();
            b.follower().poll();
            assertThat(a.index().keys()).isEqualTo(b.index().keys()).isEqualTo(org.headwater.testing.IndexKeys.expected(a)).hasSizeGreaterThanOrEqualTo(400);
        }
    }

    @Test
    void aHarvestLeftRunningByADeadProcessIsMarkedInterruptedButALiveOneIsNot() throws Exception {
        try (Catalog a = open("a", null)) {
            long source = new Sources(a.store(), Clock.systemUTC()).ensure("tidepool", "folder", "file:///srv/tidepool/");
            long live = a.journal().start(source);
            // A row as a killed process leaves it: running, and no session holds its claim.
            long dead = a.store().dsl().insertInto(HARVEST).set(HARVEST.SOURCE_ID, source)
                    .set(HARVEST.STARTED_AT, OffsetDateTime.now()).set(HARVEST.STATUS, HarvestJournal.RUNNING)
                    .returningResult(HARVEST.ID).fetchOne(HARVEST.ID);
            try (Catalog b = open("b", null)) {
                assertThat(status(b, dead)).isEqualTo(HarvestJournal.INTERRUPTED);
                assertThat(status(b, live)).isEqualTo(HarvestJournal.RUNNING);
            }
            a.journal().finish(live, HarvestJournal.OK, new HarvestJournal.Counts(0, 0, 0, 0, 0, 0, 0, 0));
            assertThat(status(a, live)).isEqualTo(HarvestJournal.OK);
        }
    }

    @Test
    void aSecondServerProcessOnTheSameStoreAnswersSearchesForAHarvestMadeHere() throws Exception {
        Path out = temp.resolve("child.log");
        try (Catalog writer = open("a", null);
                ChildServer child = ChildServer.start(out, List.of("HW_TEST_PG_PASSWORD", ""), "serve", "--port", "0",
                        "--data-dir", temp.resolve("child").toString(), "--store-url", store.jdbcUrl(),
                        "--store-user", store.user(), "--store-password-env", "HW_TEST_PG_PASSWORD")) {
            String url = child.awaitUrl(Duration.ofSeconds(60));
            writer.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            String expected = writer.index().search("nitrate", null, 1).get(0).name();

            HttpClient http = HttpClient.newHttpClient();
            JsonNode hits = null;
            long deadline = System.nanoTime() + Duration.ofSeconds(30).toNanos();
            while (System.nanoTime() < deadline) {
                String body = http.send(HttpRequest.newBuilder(URI.create(url + "api/search?q="
                        + URLEncoder.encode("nitrate", StandardCharsets.UTF_8))).build(),
                        HttpResponse.BodyHandlers.ofString()).body();
                hits = new ObjectMapper().readTree(body).get("hits");
                if (hits.size() > 0) {
                    break;
                }
                Thread.sleep(200);
            }
            assertThat(hits).isNotEmpty();
            assertThat(hits.get(0).get("name").asText()).isEqualTo(expected).isEqualTo("lab/nitrate_results_2025.csv");
            assertThat(child.output()).doesNotContain("password");
        }
    }

    private static String status(Catalog c, long harvest) {
        return c.store().dsl().select(HARVEST.STATUS).from(HARVEST).where(HARVEST.ID.eq(harvest)).fetchOne(HARVEST.STATUS);
    }

    private static List<String> names(List<SearchHit> hits) {
        return hits.stream().map(SearchHit::name).toList();
    }

    private static Observation dataset(String uri) {
        return new Observation.DatasetSeen(uri, uri.substring("file:///srv/".length()), DatasetKind.FILE, null, "csv",
                3L, null, null, 1L, true, null, null, List.of(new ColumnDef("level_cm", "integer", true)));
    }
}
