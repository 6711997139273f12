package org.headwater.search;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.headwater.store.CatalogReader;
import org.headwater.store.Store;
import org.headwater.store.StoreConfig;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Searches whose words are in a large share of the catalog: the benchmark's synthetic catalog, small (3,000
 * datasets, 60,000 columns, invented names), with lineage edges so that use and centrality differ between
 * datasets. The top hits found while skipping blocks must be those of scoring every match, and counts beyond
 * the cap must be close estimates that say so.
 */
class BroadSearchTest {
    @TempDir
    static Path temp;

    static Store store;
    static SearchIndex index;

    @BeforeAll
    static void fillACatalogWithFewWordsUsedEverywhere() throws Exception {
        store = Store.open(StoreConfig.embedded(temp.resolve("catalog")));
        SearchBenchmark.fill(store, 3000, 20, new Random(5));
        Random random = new Random(6);
        try (Connection c = store.dsl().configuration().connectionProvider().acquire();
                PreparedStatement edge = c.prepareStatement("insert into lineage_edge (source_dataset_id, target_dataset_id,"
                        + " evidence, confidence, fingerprint, valid_from) values (?, ?, 'parsed', 1, 'f', now())")) {
            for (int i = 0; i < 4000; i++) {
                // Edges towards a few hundred sources, so that some datasets are much more central than others.
                edge.setLong(1, 1 + random.nextInt(300));
                edge.setLong(2, 301 + random.nextInt(2700));
                edge.addBatch();
            }
            edge.executeBatch();
        }
        index = SearchIndex.inMemory(new CatalogReader(store));
    }

    @AfterAll
    static void close() {
        if (index != null) {
            index.close();
        }
        if (store != null) {
            store.close();
        }
    }

    @Test
    void skippingFindsTheSameTopHitsAsScoringEveryMatch() {
        // Reference: Lucene's exhaustive top-hit collection (TopScoreDocCollectorManager without a hit threshold)
        // over the same ranked query.
        List<String> queries = SearchBenchmark.queries(new Random(12), 160);
        for (String q : queries) {
            for (int size : new int[] {1, 10, 50}) {
                SearchResult skipped = index.search(SearchRequest.of(q, null, size));
                SearchResult every = index.searchScoringEveryMatch(SearchRequest.of(q, null, size));
                assertThat(skipped.hits()).as(q + ", " + size + " hits").hasSameSizeAs(every.hits());
                for (int i = 0; i < skipped.hits().size(); i++) {
                    SearchHit a = skipped.hits().get(i);
                    SearchHit b = every.hits().get(i);
                    assertThat((double) a.score()).as(q + " hit " + i).isCloseTo(b.score(), within(1e-4 * Math.max(1, b.score())));
                    if (i + 1 < skipped.hits().size() && Math.abs(a.score() - skipped.hits().get(i + 1).score()) > 1e-3) {
                        // Where scores differ, the order is the reference's; among equal scores either tie-break will do.
                        assertThat(a.kind() + ":" + a.id() + ":" + a.name()).as(q + " hit " + i).isEqualTo(b.kind() + ":" + b.id() + ":" + b.name());
                    }
                }
            }
        }
    }

    @Test
    void countsBelowTheCapAreExactAndAboveItAreCloseEstimatesMarkedAsSuch() {
        index.countCap(Integer.MAX_VALUE);
        SearchResult exact = index.search(SearchRequest.of("nitrate", null, 10));
        SearchResult twoWords = index.search(SearchRequest.of("nitrate monthly", null, 10));
        index.countCap(500);
        try {
            SearchResult estimated = index.search(SearchRequest.of("nitrate", null, 10));
            assertThat(exact.exact()).isTrue();
            assertThat(exact.total()).isGreaterThan(2000);
            assertThat(estimated.exact()).isFalse();
            // Stratified sampling of 500 of about 4,000 matches: a few per cent off at most.
            assertThat((double) estimated.total()).isCloseTo(exact.total(), within(0.08 * exact.total()));
            Map<String, Integer> kinds = estimated.facets().get("kind");
            Map<String, Integer> exactKinds = exact.facets().get("kind");
            assertThat(kinds.keySet()).isEqualTo(exactKinds.keySet());
            exactKinds.forEach((kind, n) -> assertThat((double) kinds.get(kind)).as(kind).isCloseTo(n, within(0.12 * n)));
            assertThat(estimated.hits()).isEqualTo(exact.hits());
            // Fewer matches than the cap: counted one by one, even though they crowd into few windows.
            index.countCap(1000);
            SearchResult small = index.search(SearchRequest.of("nitrate monthly", null, 10));
            assertThat(twoWords.total()).isBetween(500L, 1000L);
            assertThat(small.exact()).isTrue();
            assertThat(small.total()).isEqualTo(twoWords.total());
            assertThat(small.facets()).isEqualTo(twoWords.facets());
        } finally {
            index.countCap(SearchIndex.COUNT_CAP);
        }
    }
}
