package org.headwater.harvest.jdbc;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.StringWriter;
import java.io.PrintWriter;
import java.net.ServerSocket;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.SQLException;
import java.sql.Statement;
import java.time.Clock;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.TreeSet;
import org.headwater.Catalog;
import org.headwater.cli.Main;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.ingest.HarvestJournal;
import org.headwater.ingest.Sources;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.StoreCounts;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestPostgres;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Re-harvests of a changing PostgreSQL database, and the ways a database harvest fails. */
class DatabaseHarvestChangesTest {
    private static final String FIXTURE = "/org/headwater/harvest/jdbc/seed-library.sql";

    @TempDir
    Path dir;

    TestPostgres.Database db;
    Catalog catalog;

    @BeforeEach
    void freshDatabaseAndCatalog() throws Exception {
        db = TestPostgres.freshDatabase("jdbcchg");
        try (Connection c = db.connect(); Statement s = c.createStatement()) {
            SqlFixture.run(c, FIXTURE);
            s.execute("analyze");
        }
        catalog = TestCatalogs.fresh(dir.resolve("catalog"));
    }

    @AfterEach
    void close() {
        // Null when PostgreSQL is absent and the test was skipped before opening it (a laptop).
        if (catalog != null) {
            catalog.close();
        }
    }

    @Test
    void harvestingAnUnchangedDatabaseAgainChangesNothing() {
        HarvestSummary first = harvest(db.user(), null, Map.of());
        var before = StoreCounts.of(catalog);
        HarvestSummary second = harvest(db.user(), null, Map.of());
        assertThat(first.changes()).isPositive();
        assertThat(second.status()).isEqualTo("ok");
        assertThat(second.changes()).isZero();
        assertThat(second.removed()).isZero();
        assertThat(StoreCounts.of(catalog)).isEqualTo(before);
    }

    @Test
    void aDroppedViewEndsItsValidityAndAnAddedColumnStartsASchemaVersion() throws Exception {
        harvest(db.user(), null, Map.of());
        Instant between = Instant.now();
        sql("drop view seeds.member_dates", "alter table seeds.member add column newsletter boolean");
        HarvestSummary second = harvest(db.user(), null, Map.of());

        assertThat(second.removed()).isEqualTo(1);
        DatasetView gone = dataset("member_dates");
        assertThat(gone.present()).isFalse();
        assertThat(catalog.reader().columnFlowsInto(gone.id())).isEmpty();
        // History keeps what it was: as of before the drop it was present, with its lineage.
        DatasetView then = catalog.reader().dataset(gone.id(), between).orElseThrow();
        assertThat(then.present()).isTrue();
        assertThat(then.columns()).extracting(ColumnView::name).containsExactly("id", "on_date");

        DatasetView member = dataset("member");
        assertThat(member.columns()).extracting(ColumnView::name)
                .containsExactly("member_id", "joined_on", "plot_zone", "newsletter");
        assertThat(catalog.reader().schemaHistory(member.id())).hasSize(2);
    }

    @Test
    void aRedefinedViewReplacesItsColumnLineage() throws Exception {
        harvest(db.user(), null, Map.of());
        sql("create or replace view seeds.yearly_stock as select y.harvested_year, y.grams from (select harvested_year,"
                + " sum(grams) as grams from seeds.packet where donated_by is not null group by harvested_year) y");
        HarvestSummary second = harvest(db.user(), null, Map.of());
        assertThat(second.errors()).isZero();
        TreeSet<String> flows = new TreeSet<>();
        catalog.reader().columnFlowsInto(dataset("yearly_stock").id()).forEach(f -> flows.add(f.sourceColumn()));
        // expected: the new view text reads harvested_year, grams and (in WHERE) donated_by of seeds.packet
        assertThat(flows).containsExactly("donated_by", "grams", "harvested_year");
    }

    @Test
    void anUnreachableServerFailsThatHarvestWithAClearErrorAndChangesNothing() throws Exception {
        harvest(db.user(), null, Map.of());
        var before = StoreCounts.of(catalog);
        int closedPort;
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            closedPort = s.getLocalPort();
        }
        String url = "jdbc:postgresql://127.0.0.1:" + closedPort + "/seedlib";
        HarvestSummary failed = harvester(Map.of()).harvest(DatabaseSource.of("elsewhere", url, "nobody", null),
                HarvestProgress.NONE);
        assertThat(failed.status()).isEqualTo(HarvestJournal.FAILED);
        assertThat(failed.firstErrors()).hasSize(1);
        // expected: SQLSTATE class 08 is "connection exception" (ISO/IEC 9075-2, table of SQLSTATE codes);
        // pgjdbc reports a refused TCP connection as 08001
        assertThat(failed.firstErrors().get(0).kind()).isEqualTo("unreachable");
        assertThat(failed.firstErrors().get(0).message()).contains("127.0.0.1:" + closedPort).contains("refused");
        assertThat(catalog.reader().harvest(failed.harvestId()).orElseThrow().errorList()).hasSize(1);
        assertThat(StoreCounts.of(catalog)).isEqualTo(before);
    }

    @Test
    void aWrongPasswordIsReportedWithoutThePasswordAndLeavesThePreviousStateIntact() throws Exception {
        String role = createPasswordRole("seedlib_ro_" + db.name().replaceAll("[^a-z0-9]", "").substring(7), "fennel-4417");
        sql("grant usage on schema seeds to " + role);
        HarvestSummary good = harvest(role, "SEEDLIB_PW", Map.of("SEEDLIB_PW", "fennel-4417"));
        assertThat(good.status()).isEqualTo("ok");
        var before = StoreCounts.of(catalog);

        HarvestSummary refused = harvest(role, "SEEDLIB_PW", Map.of("SEEDLIB_PW", "tulip-7781"));
        assertThat(refused.status()).isEqualTo(HarvestJournal.FAILED);
        // expected: SQLSTATE 28P01 invalid_password (PostgreSQL 15 docs, appendix A, class 28 "Invalid
        // Authorization Specification")
        assertThat(refused.firstErrors().get(0).kind()).isEqualTo("login_refused");
        assertThat(refused.firstErrors().get(0).message()).contains("password authentication failed").doesNotContain("tulip");
        assertThat(StoreCounts.of(catalog)).isEqualTo(before);
        assertThat(dataset("packet").present()).isTrue();

        HarvestSummary unset = harvest(role, "SEEDLIB_PW_MISSING", Map.of());
        assertThat(unset.status()).isEqualTo(HarvestJournal.FAILED);
        assertThat(unset.firstErrors().get(0).message()).contains("SEEDLIB_PW_MISSING").contains("not set");
    }

    @Test
    void aSchemaTheUserMayNotUseIsReportedAndTheRestIsHarvested() throws Exception {
        sql("create schema vault", "create table vault.donor_contact (donor_id integer primary key, phone varchar(20))");
        harvest(db.user(), null, Map.of());
        assertThat(dataset("vault", "donor_contact").present()).isTrue();

        String role = createPasswordRole("seedlib_lim_" + db.name().replaceAll("[^a-z0-9]", "").substring(7), "chard-9023");
        sql("grant usage on schema seeds to " + role, "grant select on all tables in schema seeds to " + role);
        HarvestSummary limited = harvest(role, "PW", Map.of("PW", "chard-9023"));
        assertThat(limited.status()).isEqualTo(HarvestJournal.WITH_ERRORS);
        assertThat(limited.errorsByKind()).isEqualTo(Map.of("schema_unreadable", 1));
        assertThat(limited.firstErrors().get(0).message()).startsWith("permission denied for schema vault");
        assertThat(limited.datasets()).isEqualTo(13);
        assertThat(limited.removed()).isZero();
        // Out of sight is not gone: the vault table keeps its previous state.
        assertThat(dataset("vault", "donor_contact").present()).isTrue();
    }

    @Test
    void theCommandLineHarvestsADatabaseAndPrintsAFailureWithExitCodeOne() throws Exception {
        String dataDir = dir.resolve("cli-catalog").toString();
        StringWriter out = new StringWriter();
        int ok = Main.run(new PrintWriter(out, true), new PrintWriter(new StringWriter(), true),
                "harvest", "--jdbc", db.url(), "--user", db.user(), "--name", "seedlib", "--data-dir", dataDir);
        assertThat(ok).isZero();
        assertThat(out.toString()).contains("ok, 13 tables and views");

        int closedPort;
        try (ServerSocket s = new ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            closedPort = s.getLocalPort();
        }
        StringWriter failedOut = new StringWriter();
        int failed = Main.run(new PrintWriter(failedOut, true), new PrintWriter(new StringWriter(), true),
                "harvest", "--jdbc", "jdbc:postgresql://127.0.0.1:" + closedPort + "/none", "--data-dir", dataDir);
        assertThat(failed).isEqualTo(Main.PROBLEMS);
        assertThat(failedOut.toString()).contains("failed").contains("unreachable");
    }

    // ---- helpers

    private HarvestSummary harvest(String user, String passwordEnv, Map<String, String> env) {
        return harvester(env).harvest(DatabaseSource.of("seedlib", db.url(), user, passwordEnv), HarvestProgress.NONE);
    }

    private DatabaseHarvester harvester(Map<String, String> env) {
        Clock clock = Clock.systemUTC();
        return new DatabaseHarvester(catalog.ingestor(), new Sources(catalog.store(), clock),
                new HarvestJournal(catalog.store(), clock), catalog.reader(), env::get);
    }

    private DatasetView dataset(String table) {
        return dataset("seeds", table);
    }

    private DatasetView dataset(String schema, String table) {
        String uri = DatabaseHarvester.uri("seedlib", schema, table);
        var found = catalog.reader().findDatasets(uri).stream().filter(s -> s.uri().equals(uri)).findFirst().orElseThrow();
        return catalog.reader().dataset(found.id(), null).orElseThrow();
    }

    /** A login role that must give its password: .ci/postgres.sh asks members of this group for it. */
    private String createPasswordRole(String role, String password) throws SQLException {
        sql("do $$ begin create role headwater_password_login nologin; exception when duplicate_object then null; end $$",
                "create role " + role + " login password '" + password + "' in role headwater_password_login");
        return role;
    }

    private void sql(String... statements) throws SQLException {
        try (Connection c = db.connect(); Statement s = c.createStatement()) {
            for (String sql : statements) {
                s.execute(sql);
            }
        }
    }
}
