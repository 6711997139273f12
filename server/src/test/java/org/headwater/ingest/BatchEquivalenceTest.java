package org.headwater.ingest;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.ingest.Observation.DatasetGone;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.ingest.Observation.PartitionGone;
import org.headwater.ingest.Observation.PartitionSeen;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.testing.Fuzz;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestFactory;
import org.junit.jupiter.api.io.TempDir;

/**
 * Applying observations as one batch leaves exactly the rows, ids and change log that applying the same
 * observations one per transaction leaves, at the same clock time. The one-by-one application is the
 * reference: it is the meaning of a batch ("all of it, in order, or none of it").
 */
class BatchEquivalenceTest {
    private static final String[] TABLES = {
        "select id, uri, name, kind, source_id, first_seen from dataset order by id",
        "select id, dataset_id, valid_from, valid_to, format, size_bytes, modified_at, content_hash, row_count,"
                + " row_count_exact, details, error from dataset_state order by id",
        "select id, dataset_id, version, fingerprint, valid_from, valid_to from schema_version order by id",
        "select id, schema_version_id, ordinal, name, data_type, nullable from schema_column order by id",
        "select id, dataset_id, uri, name, partition_keys, valid_from, valid_to, size_bytes, modified_at,"
                + " content_hash, row_count, row_count_exact, columns_json, error from dataset_partition order by id",
        "select id, source_dataset_id, target_dataset_id, evidence, valid_from, valid_to from lineage_edge order by id",
        "select seq, changed_at, entity, entity_id, operation, origin, summary from change_log order by seq",
    };

    private static final List<List<ColumnDef>> SCHEMAS = List.of(
            List.of(new ColumnDef("station", "text", false), new ColumnDef("depth_m", "decimal", true)),
            List.of(new ColumnDef("station", "text", false), new ColumnDef("depth_m", "integer", true)),
            List.of(new ColumnDef("station", "text", false)));

    @TempDir
    Path temp;

    @Test
    void mixedBatchOfNewChangedAndRemovedPartitionsEqualsOneByOne() {
        String set = "file:///reef/soundings/";
        List<Observation> first = List.of(
                partition(set, "a", 10L, SCHEMAS.get(0)),
                partition(set, "b", 10L, SCHEMAS.get(0)),
                partition(set, "c", 10L, SCHEMAS.get(0)));
        List<Observation> second = List.of(
                partition(set, "a", 10L, SCHEMAS.get(0)),         // unchanged
                partition(set, "b", 11L, SCHEMAS.get(1)),         // changed size and drifted type
                new PartitionGone(set, set + "c.csv"),             // removed
                partition(set, "d", 12L, SCHEMAS.get(2)),         // new
                partition(set, "d", 13L, SCHEMAS.get(2)),         // changed again in the same batch
                new PartitionGone(set, set + "zz.csv"),            // never existed: no change
                dataset(set, "soundings", 35L, SCHEMAS.get(0)));  // the set's own facts
        List<String> differences = compare(List.of(first, second));
        assertThat(differences).isEmpty();
    }

    @Test
    void mixedBatchLogsOneChangePerRealChangeInOrder() {
        String set = "file:///reef/soundings/";
        SettableClock clock = new SettableClock(Instant.parse("2026-06-01T00:00:00Z"));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("log"), clock)) {
            catalog.ingestor().apply("t", List.of(partition(set, "a", 10L, SCHEMAS.get(0)),
                    partition(set, "b", 10L, SCHEMAS.get(0))));
            clock.advance();
            catalog.ingestor().apply("t", List.of(
                    partition(set, "a", 10L, SCHEMAS.get(0)),
                    partition(set, "b", 11L, SCHEMAS.get(1)),
                    new PartitionGone(set, set + "a.csv"),
                    partition(set, "d", 12L, SCHEMAS.get(2)),
                    new PartitionGone(set, set + "zz.csv")));
            // expected: one change-log row per real change, in the order of the observations; an unchanged
            // sighting and the removal of an unknown member log nothing (common practice, no source)
            var log = catalog.store().dsl().fetch("select operation, summary from change_log order by seq").intoArrays();
            assertThat(java.util.Arrays.deepToString(log)).isEqualTo("[[created, soundings/], [partition, a.csv],"
                    + " [partition, b.csv], [partition, b.csv], [partition, removed a.csv], [partition, d.csv]]");
            var open = catalog.store().dsl().fetch("select name, size_bytes from dataset_partition"
                    + " where valid_to is null order by name").intoArrays();
            assertThat(java.util.Arrays.deepToString(open)).isEqualTo("[[b.csv, 11], [d.csv, 12]]");
            var closed = catalog.store().dsl().fetchValue("select count(*) from dataset_partition where valid_to is not null");
            assertThat(((Number) closed).intValue()).isEqualTo(2);
        }
    }

    @Test
    void identityFirstNamedByARemovalKeepsTheOrderOfCreation() {
        // "gone" for an unknown URI creates nothing; the later sighting creates it, after the one before it.
        List<Observation> batch = List.of(
                new DatasetGone("file:///reef/late.csv"),
                dataset("file:///reef/late.csv", "late.csv", 1L, SCHEMAS.get(0)),
                dataset("file:///reef/early.csv", "early.csv", 1L, SCHEMAS.get(2)));
        assertThat(compare(List.of(batch))).isEmpty();
    }

    @TestFactory
    Stream<DynamicTest> randomBatchesEqualOneByOne() {
        return Fuzz.cases("random batch", 5, 4_100, random -> {
            List<List<Observation>> rounds = new ArrayList<>();
            for (int r = 0; r < 4; r++) {
                rounds.add(randomBatch(random, 5 + random.nextInt(40)));
            }
            assertThat(compare(rounds)).isEmpty();
        });
    }

    /** Applies each round as one batch to one catalog and one observation at a time to another; lists what differs. */
    private List<String> compare(List<List<Observation>> rounds) {
        SettableClock clock = new SettableClock(Instant.parse("2026-06-01T00:00:00Z"));
        List<String> differences = new ArrayList<>();
        try (Catalog batched = TestCatalogs.fresh(temp.resolve("batched-" + System.nanoTime()), clock);
                Catalog single = TestCatalogs.fresh(temp.resolve("single-" + System.nanoTime()), clock)) {
            for (List<Observation> round : rounds) {
                clock.advance();
                List<Change> fromBatch = batched.ingestor().apply("harvest:1", round);
                List<Change> fromSingles = new ArrayList<>();
                for (Observation o : round) {
                    fromSingles.addAll(single.ingestor().apply("harvest:1", List.of(o)));
                }
                if (!fromBatch.equals(fromSingles)) {
                    differences.add("changes returned: " + fromBatch + " vs " + fromSingles);
                }
                for (String query : TABLES) {
                    var a = batched.store().dsl().fetch(query).intoArrays();
                    var b = single.store().dsl().fetch(query).intoArrays();
                    if (!java.util.Arrays.deepEquals(a, b)) {
                        differences.add(query + ":\n  batch  " + java.util.Arrays.deepToString(a)
                                + "\n  single " + java.util.Arrays.deepToString(b));
                    }
                }
            }
        }
        return differences;
    }

    private static List<Observation> randomBatch(SplittableRandom random, int size) {
        String[] sets = {"file:///reef/tides/", "file:///reef/buoys/"};
        List<Observation> batch = new ArrayList<>();
        for (int i = 0; i < size; i++) {
            String set = Fuzz.pick(random, List.of(sets));
            String member = "p" + random.nextInt(6);
            String file = "file:///reef/loose/f" + random.nextInt(6) + ".csv";
            long size2 = 10L + random.nextInt(3);
            List<ColumnDef> schema = random.nextInt(5) == 0 ? null : Fuzz.pick(random, SCHEMAS);
            switch (random.nextInt(7)) {
                case 0, 1 -> batch.add(partition(set, member, size2, schema));
                case 2 -> batch.add(new PartitionGone(set, set + member + ".csv"));
                case 3 -> batch.add(dataset(file, "loose " + random.nextInt(2), size2, schema));
                case 4 -> batch.add(new DatasetGone(file));
                case 5 -> batch.add(dataset(set, "set " + set.length(), size2, schema));
                default -> batch.add(new EdgeSeen(file, "file:///reef/derived/out" + random.nextInt(3) + ".csv",
                        null, null, null, Evidence.DECLARED, 1.0, List.of()));
            }
        }
        return batch;
    }

    private static PartitionSeen partition(String set, String member, Long size, List<ColumnDef> columns) {
        return new PartitionSeen(set, set.substring(set.lastIndexOf('/', set.length() - 2) + 1), null,
                set + member + ".csv", member + ".csv", "{\"part\":\"" + member + "\"}", size,
                Instant.parse("2026-05-01T10:00:00Z"), null, 4L, true, columns, columns == null ? "unreadable" : null);
    }

    private static DatasetSeen dataset(String uri, String name, long size, List<ColumnDef> columns) {
        return new DatasetSeen(uri, name, DatasetKind.FILE, null, "csv", size, Instant.parse("2026-05-01T10:00:00Z"),
                null, 4L, true, null, columns == null ? "unreadable" : null, columns);
    }

    /** A clock that stands still until told to move, so both catalogs apply a round at the same time. */
    private static final class SettableClock extends Clock {
        private Instant now;

        SettableClock(Instant start) {
            this.now = start;
        }

        synchronized void advance() {
            now = now.plus(Duration.ofMinutes(1));
        }

        @Override
        public synchronized Instant instant() {
            return now;
        }

        @Override
        public ZoneId getZone() {
            return ZoneOffset.UTC;
        }

        @Override
        public Clock withZone(ZoneId zone) {
            return this;
        }
    }
}
