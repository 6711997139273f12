package org.headwater.harvest.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestPostgres;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Harvesting the seed-library fixture from a real PostgreSQL 15, checked against PostgreSQL's own catalogs. */
class DatabaseHarvesterPostgresTest {
    private static final String FIXTURE = "/org/headwater/harvest/jdbc/seed-library.sql";

    @TempDir
    static Path dir;

    static TestPostgres.Database db;
    static Catalog catalog;
    static HarvestSummary first;

    @BeforeAll
    static void harvestFixture() throws Exception {
        db = TestPostgres.freshDatabase("jdbc");
        try (Connection c = db.connect(); Statement s = c.createStatement()) {
            SqlFixture.run(c, FIXTURE);
            s.execute("analyze");
        }
        catalog = TestCatalogs.fresh(dir.resolve("catalog"));
        first = catalog.harvestDatabase(DatabaseSource.of("seedlib", db.url(), db.user(), null), HarvestProgress.NONE);
    }

    @AfterAll
    static void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    @Test
    void everyTableAndViewOfTheFixtureIsOneDataset() throws SQLException {
        assertThat(first.status()).isEqualTo("ok");
        assertThat(first.errors()).isZero();
        // expected: PostgreSQL's information_schema.tables (ISO/IEC 9075-11 TABLES view) for the schema
        List<String> expected = strings("select table_schema || '.' || table_name || ' ' || lower(table_type)"
                + " from information_schema.tables where table_schema = 'seeds' order by 1");
        List<String> harvested = new ArrayList<>();
        for (String name : expected) {
            String qualified = name.substring(0, name.indexOf(' '));
            DatasetView d = dataset(qualified);
            harvested.add(d.name() + " " + (d.kind().equals("view") ? "view" : "base table"));
        }
        assertThat(harvested).containsExactlyElementsOf(expected);
        assertThat(first.datasets()).isEqualTo(expected.size()); // 5 tables + 8 views in the fixture
        assertThat(expected).hasSize(13);
    }

    @Test
    void columnsCarryTheDatabaseTypesAndNullability() throws SQLException {
        // expected: the fixture's DDL; type words are PostgreSQL's own type names (pg_type.typname),
        // PostgreSQL 15 docs table 8.1 lists int4 as the alias of integer
        assertThat(dataset("seeds.packet").columns()).extracting(ColumnView::name, ColumnView::type, ColumnView::nullable)
                .containsExactly(
                        org.assertj.core.groups.Tuple.tuple("packet_id", "int4", false),
                        org.assertj.core.groups.Tuple.tuple("variety_id", "int4", false),
                        org.assertj.core.groups.Tuple.tuple("harvested_year", "int4", false),
                        org.assertj.core.groups.Tuple.tuple("grams", "numeric", false),
                        org.assertj.core.groups.Tuple.tuple("donated_by", "int4", true));
        // expected: information_schema.columns (udt_name, is_nullable, ordinal_position) for every relation
        for (String table : strings("select table_name from information_schema.tables where table_schema = 'seeds'")) {
            List<String> reference = strings("select column_name || ' ' || udt_name || ' ' || is_nullable"
                    + " from information_schema.columns where table_schema = 'seeds' and table_name = '" + table
                    + "' order by ordinal_position");
            assertThat(dataset("seeds." + table).columns())
                    .extracting(c -> c.name() + " " + c.type() + " " + (c.nullable() ? "YES" : "NO"))
                    .as(table).containsExactlyElementsOf(reference);
        }
    }

    @Test
    void keysCommentsAndRowEstimatesComeFromTheCatalog() throws Exception {
        DatasetView test = dataset("seeds.germination_test");
        var details = new com.fasterxml.jackson.databind.ObjectMapper().readTree(test.details());
        // expected: the fixture's DDL (primary key (packet_id, tested_on), constraint germination_of_packet)
        assertThat(details.get("primary_key").toString()).isEqualTo("[\"packet_id\",\"tested_on\"]");
        assertThat(details.get("foreign_keys").toString()).isEqualTo("[{\"columns\":[\"packet_id\"],"
                + "\"name\":\"germination_of_packet\",\"referenced_columns\":[\"packet_id\"],"
                + "\"references\":\"db:seedlib/seeds.packet\"}]");
        DatasetView variety = dataset("seeds.variety");
        // expected: the fixture's COMMENT ON statements, as obj_description/col_description return them
        assertThat(variety.description()).isEqualTo(string("select obj_description('seeds.variety'::regclass, 'pg_class')"));
        assertThat(variety.description()).isEqualTo("Seed varieties the library keeps");
        assertThat(new com.fasterxml.jackson.databind.ObjectMapper().readTree(variety.details()).get("column_comments")
                .get("days_to_harvest").asText()).isEqualTo("Typical days from sowing to first harvest");
        // expected: pg_class.reltuples after ANALYZE; for tables smaller than ANALYZE's sample (300 x
        // default_statistics_target rows) every row is read, so the estimate equals count(*) (PostgreSQL docs,
        // "ANALYZE", from memory)
        for (String table : List.of("variety", "member", "packet", "loan", "germination_test")) {
            DatasetView d = dataset("seeds." + table);
            assertThat(d.rowCount()).as(table).isEqualTo(Long.parseLong(string("select count(*) from seeds." + table)));
            assertThat(d.rowCountExact()).isFalse();
        }
        assertThat(dataset("seeds.packet").rowCount()).isEqualTo(5);
        assertThat(dataset("seeds.packet_catalog").rowCount()).isNull();
    }

    @Test
    void viewColumnLineageEqualsPostgresViewColumnUsage() throws SQLException {
        // expected: PostgreSQL 15 information_schema.view_column_usage (built on pg_depend entries of each
        // view's pg_rewrite rule). It lists the columns of the view's DIRECT dependencies only (a view over a
        // view names the inner view's columns, not the tables beneath), so it is compared with the column flows
        // of the edges into each view: Headwater also analyses each view on its own, ending at the relations
        // it names. Both count every column the query mentions: outputs, joins, filters, grouping.
        Map<String, TreeSet<String>> reference = new TreeMap<>();
        for (String row : strings("select view_name || ' ' || table_schema || '.' || table_name || '.' || column_name"
                + " from information_schema.view_column_usage where view_schema = 'seeds'")) {
            String[] parts = row.split(" ");
            reference.computeIfAbsent(parts[0], k -> new TreeSet<>()).add(parts[1]);
        }
        assertThat(reference).hasSize(8);
        // expected: view_column_usage of the view over two views, as PostgreSQL 15 reports it for the fixture
        assertThat(reference.get("genus_summary")).containsExactly("seeds.grams_by_genus.genus",
                "seeds.grams_by_genus.total_grams", "seeds.heirloom_stock.genus", "seeds.heirloom_stock.rate_pct");
        List<String> views = strings("select table_name from information_schema.views where table_schema = 'seeds' order by 1");
        assertThat(views).hasSize(8);
        for (String view : views) {
            DatasetView d = dataset("seeds." + view);
            TreeSet<String> ours = new TreeSet<>();
            catalog.reader().columnFlowsInto(d.id()).forEach(f -> ours.add(f.sourceDataset() + "." + f.sourceColumn()));
            assertThat(ours).as(view).isEqualTo(reference.getOrDefault(view, new TreeSet<>()));
        }
    }

    // ---- helpers

    static DatasetView dataset(String qualified) {
        String uri = DatabaseHarvester.uri("seedlib", "seeds", qualified.substring(qualified.indexOf('.') + 1));
        var found = catalog.reader().findDatasets(uri).stream().filter(s -> s.uri().equals(uri)).findFirst()
                .orElseThrow(() -> new AssertionError("not harvested: " + uri));
        return catalog.reader().dataset(found.id(), null).orElseThrow();
    }

    static List<String> strings(String sql) throws SQLException {
        List<String> out = new ArrayList<>();
        try (Connection c = db.connect(); Statement s = c.createStatement(); ResultSet rs = s.executeQuery(sql)) {
            while (rs.next()) {
                out.add(rs.getString(1));
            }
        }
        return out;
    }

    static String string(String sql) throws SQLException {
        return strings(sql).get(0);
    }
}
