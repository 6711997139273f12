package org.headwater.harvest.jdbc;

import java.lang.management.ManagementFactory;
import java.lang.management.MemoryPoolMXBean;
import java.lang.management.MemoryType;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DatabaseMetaData;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.time.Clock;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.store.StoreConfig;

/**
 * Harvest of a PostgreSQL database with 2,000 tables and 500 views (an invented allotment-network warehouse),
 * next to the floor measured in the same run: a plain {@link DatabaseMetaData} loop that lists the tables and
 * reads every column row. Prints times, the heap peak of the harvest, and the no-change re-harvest.
 *
 * <p>Usage: {@code JdbcHarvestBenchmark ADMIN_JDBC_URL USER [catalog-dir]} (the URL of an existing database on a
 * loopback server, for example {@code $HEADWATER_TEST_PG_URL}); it creates the database {@code hw_bench_jdbc}
 * once and reuses it on later runs.
 */
public final class JdbcHarvestBenchmark {
    private static final int SCHEMAS = 10;
    private static final int TABLES = 2_000;
    private static final int VIEWS = 500;
    private static final int ROUNDS = 3;
    private static final int HARVEST_ROUNDS = 2;

    private JdbcHarvestBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        String admin = args.length > 0 ? args[0] : System.getenv("HEADWATER_TEST_PG_URL");
        String user = args.length > 1 ? args[1] : System.getenv().getOrDefault("HEADWATER_TEST_PG_USER", "headwater");
        if (admin == null || !admin.startsWith("jdbc:postgresql://127.0.0.1")) {
            throw new IllegalArgumentException("give the JDBC URL of a PostgreSQL server on 127.0.0.1");
        }
        String url = admin.substring(0, admin.lastIndexOf('/') + 1) + "hw_bench_jdbc";
        ensureDatabase(admin, url, user);

        long floorBest = Long.MAX_VALUE;
        int floorColumns = 0;
        for (int i = 0; i < ROUNDS; i++) {
            long t = System.nanoTime();
            floorColumns = metadataLoop(url, user);
            floorBest = Math.min(floorBest, System.nanoTime() - t);
        }

        // The harvest's own phases, measured apart: reading the structure, and analysing the view definitions.
        long readBest = Long.MAX_VALUE;
        long viewsBest = Long.MAX_VALUE;
        for (int i = 0; i < ROUNDS; i++) {
            long t = System.nanoTime();
            MetadataReader.Snapshot snapshot;
            try (Connection c = DriverManager.getConnection(url, user, ""); Statement s = c.createStatement()) {
                c.setReadOnly(true);
                s.execute("set search_path = ''");
                snapshot = new MetadataReader(Dialect.POSTGRESQL, new TableGlobs(java.util.List.of(), java.util.List.of()))
                        .read(c);
            }
            readBest = Math.min(readBest, System.nanoTime() - t);
            t = System.nanoTime();
            ViewLineage views = new ViewLineage(snapshot.relations(), r -> "db:x/" + r.qualified());
            int edges = 0;
            for (Relation r : snapshot.relations()) {
                if (r.viewDefinition() != null) {
                    edges += views.of(r).edges().size();
                }
            }
            viewsBest = Math.min(viewsBest, System.nanoTime() - t);
            if (edges == 0) {
                throw new IllegalStateException("no view edges");
            }
        }

        Path dir = args.length > 2 ? Path.of(args[2]) : Files.createTempDirectory("hw-jdbc-bench");
        long harvestBest = Long.MAX_VALUE;
        long peak = 0;
        HarvestSummary last = null;
        long again = 0;
        for (int i = 0; i < HARVEST_ROUNDS; i++) {
            Path catalogDir = dir.resolve("catalog-" + i);
            try (Catalog catalog = Catalog.open(catalogDir, StoreConfig.embedded(catalogDir), Clock.systemUTC())) {
                System.gc();
                ManagementFactory.getMemoryPoolMXBeans().forEach(MemoryPoolMXBean::resetPeakUsage);
                long t = System.nanoTime();
                last = catalog.harvestDatabase(DatabaseSource.of("allotments", url, user, null), HarvestProgress.NONE);
                harvestBest = Math.min(harvestBest, System.nanoTime() - t);
                peak = Math.max(peak, peakHeap());
                long r = System.nanoTime();
                HarvestSummary second = catalog.harvestDatabase(DatabaseSource.of("allotments", url, user, null),
                        HarvestProgress.NONE);
                again = System.nanoTime() - r;
                if (second.changes() != 0) {
                    throw new IllegalStateException("a no-change re-harvest made " + second.changes() + " changes");
                }
            }
        }
        System.out.printf("database: %d tables, %d views in %d schemas; %d column rows%n", TABLES, VIEWS, SCHEMAS,
                floorColumns);
        System.out.printf("harvest status %s, %d datasets, %d changes, %d errors%n", last.status(), last.datasets(),
                last.changes(), last.errors());
        System.out.printf("floor: DatabaseMetaData getTables + getColumns loop  %8.0f ms (best of %d)%n",
                floorBest / 1e6, ROUNDS);
        System.out.printf("Headwater harvest into a fresh H2 file catalog       %8.0f ms (best of %d), %.1f x floor%n",
                harvestBest / 1e6, HARVEST_ROUNDS, (double) harvestBest / floorBest);
        System.out.printf("  of which: reading the structure (MetadataReader)    %8.0f ms (best of %d)%n", readBest / 1e6, ROUNDS);
        System.out.printf("  of which: analysing 500 view definitions           %8.0f ms (best of %d)%n", viewsBest / 1e6, ROUNDS);
        System.out.printf("no-change re-harvest                                  %8.0f ms%n", again / 1e6);
        System.out.printf("peak heap during a harvest                            %8.0f MiB%n", peak / 1048576.0);
    }

    /** The floor: what any tool must do at least to learn the columns of every table and view. */
    private static int metadataLoop(String url, String user) throws Exception {
        int columns = 0;
        try (Connection c = DriverManager.getConnection(url, user, "")) {
            DatabaseMetaData meta = c.getMetaData();
            for (int s = 0; s < SCHEMAS; s++) {
                try (ResultSet rs = meta.getTables(null, "plot" + s, "%", new String[] {"TABLE", "VIEW"})) {
                    while (rs.next()) {
                        rs.getString("TABLE_NAME");
                    }
                }
                try (ResultSet rs = meta.getColumns(null, "plot" + s, "%", "%")) {
                    while (rs.next()) {
                        rs.getString("COLUMN_NAME");
                        rs.getString("TYPE_NAME");
                        columns++;
                    }
                }
            }
        }
        return columns;
    }

    private static void ensureDatabase(String admin, String url, String user) throws Exception {
        try (Connection c = DriverManager.getConnection(admin, user, ""); Statement s = c.createStatement();
                ResultSet rs = s.executeQuery("select 1 from pg_database where datname = 'hw_bench_jdbc'")) {
            if (rs.next()) {
                return;
            }
            s.execute("create database hw_bench_jdbc");
        }
        long t = System.nanoTime();
        try (Connection c = DriverManager.getConnection(url, user, ""); Statement s = c.createStatement()) {
            c.setAutoCommit(false);
            int perSchema = TABLES / SCHEMAS;
            for (int sc = 0; sc < SCHEMAS; sc++) {
                s.execute("create schema plot" + sc);
                for (int i = 0; i < perSchema; i++) {
                    String parent = i > 0 ? ", bed_id integer references plot" + sc + ".harvest_" + (i - 1) + " (id)" : "";
                    s.execute("create table plot" + sc + ".harvest_" + i + " (id integer primary key, crop varchar(40) not null,"
                            + " sown_on date, picked_on date, kilos numeric(8, 2), gardener_code varchar(12), row_no integer,"
                            + " note text" + parent + ")");
                    s.execute("comment on table plot" + sc + ".harvest_" + i + " is 'Harvest log of bed " + i + "'");
                }
            }
            for (int v = 0; v < VIEWS; v++) {
                int sc = v % SCHEMAS;
                int a = (v / SCHEMAS) * 2 % perSchema;
                String view = "plot" + sc + ".yield_" + v;
                if (v >= SCHEMAS * 5 && v % 5 == 0) {
                    // a view over an earlier view
                    s.execute("create view " + view + " as select y.crop, sum(y.kilos) as kilos from plot" + sc + ".yield_"
                            + (v - SCHEMAS) + " y group by y.crop");
                } else {
                    s.execute("create view " + view + " as with picked as (select crop, kilos, picked_on from plot" + sc
                            + ".harvest_" + a + " where picked_on is not null) select p.crop, sum(p.kilos + coalesce(h.kilos, 0))"
                            + " as kilos from picked p left join plot" + sc + ".harvest_" + (a + 1) + " h on h.crop = p.crop"
                            + " group by p.crop");
                }
            }
            c.commit();
            c.setAutoCommit(true);
            s.execute("analyze");
        }
        System.out.printf("built hw_bench_jdbc in %.1f s%n", (System.nanoTime() - t) / 1e9);
    }

    private static long peakHeap() {
        return ManagementFactory.getMemoryPoolMXBeans().stream().filter(p -> p.getType() == MemoryType.HEAP)
                .mapToLong(p -> p.getPeakUsage().getUsed()).sum();
    }
}
