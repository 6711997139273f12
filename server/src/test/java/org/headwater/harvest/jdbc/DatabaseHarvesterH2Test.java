package org.headwater.harvest.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.UUID;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestPostgres;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Harvesting the seed-library fixture from an H2 database, checked against H2's INFORMATION_SCHEMA. */
class DatabaseHarvesterH2Test {
    private static final String FIXTURE = "/org/headwater/harvest/jdbc/seed-library.sql";

    @TempDir
    static Path dir;

    static String url;
    static Connection keepAlive;
    static Catalog catalog;
    static HarvestSummary first;

    @BeforeAll
    static void harvestFixture() throws Exception {
        url = "jdbc:h2:mem:seedlib_" + UUID.randomUUID().toString().replace("-", "");
        keepAlive = DriverManager.getConnection(url, "sa", "");
        SqlFixture.run(keepAlive, FIXTURE);
        catalog = TestCatalogs.fresh(dir.resolve("catalog"));
        first = catalog.harvestDatabase(DatabaseSource.of("seedlib", url, "sa", null), HarvestProgress.NONE);
    }

    @AfterAll
    static void close() throws SQLException {
        if (catalog != null) {
            catalog.close();
        }
        if (keepAlive != null) {
            keepAlive.close();
        }
    }

    @Test
    void tablesViewsAndColumnsMatchTheInformationSchema() throws SQLException {
        assertThat(first.status()).isEqualTo("ok");
        assertThat(first.firstErrors()).isEmpty();
        // expected: H2's INFORMATION_SCHEMA.TABLES and COLUMNS (the ISO/IEC 9075-11 views as H2 2.x provides them)
        List<String> relations = strings("select TABLE_NAME || ' ' || TABLE_TYPE from INFORMATION_SCHEMA.TABLES"
                + " where TABLE_SCHEMA = 'SEEDS' order by TABLE_NAME");
        assertThat(relations).hasSize(13);
        assertThat(first.datasets()).isEqualTo(13);
        for (String row : relations) {
            String table = row.substring(0, row.indexOf(' '));
            DatasetView d = dataset(table);
            assertThat(d.kind()).isEqualTo(row.endsWith("VIEW") ? "view" : "table");
            List<String> reference = strings("select COLUMN_NAME || ' ' || DATA_TYPE || ' ' || IS_NULLABLE"
                    + " from INFORMATION_SCHEMA.COLUMNS where TABLE_SCHEMA = 'SEEDS' and TABLE_NAME = '" + table
                    + "' order by ORDINAL_POSITION");
            assertThat(d.columns()).extracting(c -> c.name() + " " + c.type() + " " + (c.nullable() ? "YES" : "NO"))
                    .as(table).containsExactlyElementsOf(reference);
        }
    }

    @Test
    void keysCommentsAndRowEstimatesMatchTheInformationSchema() throws Exception {
        var json = new com.fasterxml.jackson.databind.ObjectMapper();
        // expected: INFORMATION_SCHEMA.KEY_COLUMN_USAGE of the primary key, in ORDINAL_POSITION order
        List<String> pk = strings("select k.COLUMN_NAME from INFORMATION_SCHEMA.KEY_COLUMN_USAGE k"
                + " join INFORMATION_SCHEMA.TABLE_CONSTRAINTS t on t.CONSTRAINT_NAME = k.CONSTRAINT_NAME"
                + " and t.CONSTRAINT_SCHEMA = k.CONSTRAINT_SCHEMA where t.CONSTRAINT_TYPE = 'PRIMARY KEY'"
                + " and k.TABLE_SCHEMA = 'SEEDS' and k.TABLE_NAME = 'GERMINATION_TEST' order by k.ORDINAL_POSITION");
        var details = json.readTree(dataset("GERMINATION_TEST").details());
        assertThat(pk).containsExactly("PACKET_ID", "TESTED_ON");
        assertThat(details.get("primary_key").toString()).isEqualTo(json.writeValueAsString(pk));
        // expected: the fixture names the constraint germination_of_packet (H2 folds it to upper case)
        assertThat(details.get("foreign_keys").get(0).get("name").asText()).isEqualTo("GERMINATION_OF_PACKET");
        assertThat(details.get("foreign_keys").get(0).get("references").asText()).isEqualTo("db:seedlib/SEEDS.PACKET");
        // expected: INFORMATION_SCHEMA.TABLES.REMARKS holds COMMENT ON TABLE
        assertThat(dataset("VARIETY").description()).isEqualTo(strings(
                "select REMARKS from INFORMATION_SCHEMA.TABLES where TABLE_SCHEMA = 'SEEDS' and TABLE_NAME = 'VARIETY'").get(0));
        // expected: count(*) of each table; the fixture's tables are small enough for H2's estimate to be exact
        // (ROW_COUNT_ESTIMATE is the stored row count for MVStore tables, H2 docs "INFORMATION_SCHEMA", from memory)
        for (String table : List.of("VARIETY", "MEMBER", "PACKET", "LOAN", "GERMINATION_TEST")) {
            assertThat(dataset(table).rowCount()).as(table)
                    .isEqualTo(Long.parseLong(strings("select count(*) from SEEDS." + table).get(0)));
        }
    }

    @Test
    void viewLineageFromH2DefinitionsEqualsPostgresViewColumnUsageOfTheSameViews() throws Exception {
        // H2 keeps no view dependency table, so the reference is PostgreSQL's information_schema.view_column_usage
        // for the same fixture (direct dependencies only, as in DatabaseHarvesterPostgresTest); H2 folds
        // unquoted names to upper case, PostgreSQL to lower case, so names are compared in lower case.
        TestPostgres.Database pg = TestPostgres.freshDatabase("jdbch2");
        Map<String, TreeSet<String>> reference = new TreeMap<>();
        try (Connection c = pg.connect(); Statement s = c.createStatement()) {
            SqlFixture.run(c, FIXTURE);
            try (ResultSet rs = s.executeQuery("select view_name, table_schema || '.' || table_name || '.' || column_name"
                    + " from information_schema.view_column_usage where view_schema = 'seeds'")) {
                while (rs.next()) {
                    reference.computeIfAbsent(rs.getString(1), k -> new TreeSet<>()).add(rs.getString(2));
                }
            }
        }
        assertThat(reference).hasSize(8);
        for (String view : reference.keySet()) {
            TreeSet<String> ours = new TreeSet<>();
            catalog.reader().columnFlowsInto(dataset(view.toUpperCase(Locale.ROOT)).id())
                    .forEach(f -> ours.add((f.sourceDataset() + "." + f.sourceColumn()).toLowerCase(Locale.ROOT)));
            assertThat(ours).as(view).isEqualTo(reference.get(view));
        }
    }

    @Test
    void includeAndExcludeGlobsChooseTablesAndViews() {
        try (Catalog other = TestCatalogs.fresh(dir.resolve("globs"))) {
            HarvestSummary s = other.harvestDatabase(new DatabaseSource("seedlib", url, "sa", null,
                    List.of("seeds.g*", "Seeds.Packet"), List.of("*_test"), false), HarvestProgress.NONE);
            // expected: the fixture's names: grams_by_genus, genus_summary, germination_rate, germination_test, packet
            assertThat(other.reader().datasets(null, 0, 100, null)).extracting(d -> d.name())
                    .containsExactlyInAnyOrder("SEEDS.GRAMS_BY_GENUS", "SEEDS.GENUS_SUMMARY", "SEEDS.GERMINATION_RATE",
                            "SEEDS.PACKET");
            assertThat(s.filesIgnored()).isEqualTo(9);
        }
    }

    // ---- helpers

    static DatasetView dataset(String table) {
        String uri = DatabaseHarvester.uri("seedlib", "SEEDS", table);
        var found = catalog.reader().findDatasets(uri).stream().filter(s -> s.uri().equals(uri)).findFirst()
                .orElseThrow(() -> new AssertionError("not harvested: " + uri));
        return catalog.reader().dataset(found.id(), null).orElseThrow();
    }

    static List<String> strings(String sql) throws SQLException {
        List<String> out = new ArrayList<>();
        try (Statement s = keepAlive.createStatement(); ResultSet rs = s.executeQuery(sql)) {
            while (rs.next()) {
                out.add(rs.getString(1));
            }
        }
        return out;
    }
}
