package org.headwater.store;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class StoreTest {

    @TempDir
    Path temp;

    private static final Path MIGRATIONS = Workspaces.repoRoot().resolve("server/src/main/resources/db");

    @Test
    void theLatestMigrationConstantNamesTheNewestMigrationFile() throws IOException {
        int newest = 0;
        for (String folder : List.of("migration", "h2", "postgresql")) {
            newest = Math.max(newest, versions(folder).stream().mapToInt(Integer::intValue).max().orElse(0));
        }
        assertThat(Store.LATEST_MIGRATION).isEqualTo(Integer.toString(newest));
    }

    @Test
    void everyDatabaseFolderCarriesTheSameMigrationVersions() throws IOException {
        // Otherwise the newest version would be applied on one database and never reported by the other.
        for (StoreDialect d : StoreDialect.values()) {
            assertThat(versions(d.migrationFolder())).as(d.name()).isEqualTo(versions(StoreDialect.H2.migrationFolder()));
        }
    }

    @Test
    void everyIdentityColumnDrawsItsValuesAsThisDatabaseNeeds() {
        try (Store store = Store.open(TestCatalogs.freshStore("blocks"))) {
            java.util.Map<String, Long> caches = new java.util.TreeMap<>();
            java.util.Map<String, Long> expected = new java.util.TreeMap<>();
            for (org.jooq.Table<?> t : org.headwater.store.schema.DefaultSchema.DEFAULT_SCHEMA.getTables()) {
                if (t.getIdentity() == null) {
                    continue;
                }
                String table = t.getName().toLowerCase(java.util.Locale.ROOT);
                String column = t.getIdentity().getField().getName().toLowerCase(java.util.Locale.ROOT);
                // H2: blocks of 10,000 (V15); PostgreSQL: one value per draw, its default (PostgreSQL docs,
                // CREATE SEQUENCE, CACHE: the minimum is 1, no cache, "and this is also the default"; from memory).
                expected.put(table + "." + column, TestCatalogs.onPostgres() ? 1L : 10_000L);
                caches.put(table + "." + column, TestCatalogs.onPostgres()
                        ? store.dsl().resultQuery("select seqcache from pg_sequence where seqrelid ="
                                + " pg_get_serial_sequence(?, ?)::regclass", table, column).fetchOne(0, Long.class)
                        : store.dsl().resultQuery("select identity_cache from information_schema.columns"
                                + " where lower(table_name) = ? and lower(column_name) = ?", table, column)
                                .fetchOne(0, Long.class));
            }
            assertThat(caches).hasSize(23).isEqualTo(expected);
        }
    }

    private static List<Integer> versions(String folder) throws IOException {
        Pattern version = Pattern.compile("V(\\d+)__.*\\.sql");
        Path dir = MIGRATIONS.resolve(folder);
        if (!Files.isDirectory(dir)) {
            return List.of();
        }
        try (Stream<Path> files = Files.list(dir)) {
            return files.map(f -> version.matcher(f.getFileName().toString())).filter(Matcher::matches)
                    .map(m -> Integer.parseInt(m.group(1))).sorted().toList();
        }
    }

    @Test
    void reopeningAMigratedCatalogKeepsItsContentAndSchemaHistory() {
        StoreConfig config = TestCatalogs.persistentStore(temp);
        try (Store store = Store.open(config)) {
            store.dsl().insertInto(org.headwater.store.schema.Tables.OWNER)
                    .set(org.headwater.store.schema.Tables.OWNER.NAME, "hydro-team")
                    .set(org.headwater.store.schema.Tables.OWNER.KIND, "team").execute();
        }
        try (Store store = Store.open(config)) {
            List<String> names = store.dsl().select(org.headwater.store.schema.Tables.OWNER.NAME)
                    .from(org.headwater.store.schema.Tables.OWNER).fetch(0, String.class);
            assertThat(names).containsExactly("hydro-team");
            // Reopening must not apply migration 1 a second time.
            int applied = store.dsl().fetchCount(org.jooq.impl.DSL.table("\"flyway_schema_history\""),
                    org.jooq.impl.DSL.condition("\"version\" = '1'"));
            assertThat(applied).isEqualTo(1);
        }
    }

    @Test
    void everyMigratedColumnHasTheStandardTypeItsMigrationNames() throws Exception {
        try (Store store = Store.open(TestCatalogs.freshStore("types"))) {
            // expected: ISO/IEC 9075-11 (information_schema.columns.data_type), which H2 and PostgreSQL both
            // implement; V1 declares change_log.changed_at "timestamp with time zone", seq "bigint",
            // dataset_state.row_count_exact "boolean" and lineage_edge.confidence "double precision".
            // Plain SQL: the store renders no schema names, and information_schema is one.
            java.util.Map<String, String> types = new java.util.TreeMap<>();
            for (var r : store.dsl().resultQuery("select table_name, column_name, data_type from information_schema.columns"
                    + " where lower(table_name) in ('change_log', 'dataset_state', 'lineage_edge')").fetch()) {
                types.put((r.get(0, String.class) + "." + r.get(1, String.class)).toLowerCase(java.util.Locale.ROOT),
                        r.get(2, String.class).toLowerCase(java.util.Locale.ROOT));
            }
            assertThat(types).containsEntry("change_log.changed_at", "timestamp with time zone")
                    .containsEntry("change_log.seq", "bigint")
                    .containsEntry("dataset_state.row_count_exact", "boolean")
                    .containsEntry("lineage_edge.confidence", "double precision");
        }
    }

    @Test
    void aTimestampComesBackWithTheMicrosecondsItWasWrittenWith() {
        try (Store store = Store.open(TestCatalogs.freshStore("micros"))) {
            // expected: PostgreSQL docs, "Date/Time Types": timestamps have a resolution of 1 microsecond;
            // the ingestion path truncates to microseconds so that H2 (nanoseconds) keeps the same value.
            var t = java.time.OffsetDateTime.parse("2026-03-04T05:06:07.123456Z");
            long id = store.dsl().insertInto(org.headwater.store.schema.Tables.SOURCE)
                    .set(org.headwater.store.schema.Tables.SOURCE.NAME, "tidepool")
                    .set(org.headwater.store.schema.Tables.SOURCE.KIND, "folder")
                    .set(org.headwater.store.schema.Tables.SOURCE.ROOT_URI, "file:///srv/tidepool/")
                    .set(org.headwater.store.schema.Tables.SOURCE.CREATED_AT, t)
                    .returningResult(org.headwater.store.schema.Tables.SOURCE.ID).fetchOne().value1();
            var back = store.dsl().select(org.headwater.store.schema.Tables.SOURCE.CREATED_AT)
                    .from(org.headwater.store.schema.Tables.SOURCE)
                    .where(org.headwater.store.schema.Tables.SOURCE.ID.eq(id)).fetchOne().value1();
            assertThat(back.toInstant()).isEqualTo(t.toInstant());
        }
    }

    @Test
    void anUnsupportedStoreUrlIsRefusedWithTheUrlsThatWork() {
        assertThat(org.junit.jupiter.api.Assertions.assertThrows(StoreException.class,
                () -> Store.open(new StoreConfig("jdbc:sqlite:/tmp/x.db?password=hunter2", "u", "p"))))
                .hasMessageContaining("jdbc:postgresql://HOST:PORT/DATABASE")
                .hasMessageNotContaining("hunter2");
    }
}
