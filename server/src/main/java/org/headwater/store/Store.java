package org.headwater.store;

import com.zaxxer.hikari.HikariConfig;
import com.zaxxer.hikari.HikariDataSource;
import java.sql.Connection;
import java.sql.SQLException;
import java.util.function.ToLongFunction;
import javax.sql.DataSource;
import org.flywaydb.core.Flyway;
import org.h2.jdbcx.JdbcConnectionPool;
import org.jooq.DSLContext;
import org.jooq.SQLDialect;
import org.jooq.conf.RenderQuotedNames;
import org.jooq.conf.Settings;
import org.jooq.impl.DSL;

/** An open catalog database: migrated to the latest schema and ready for jOOQ. */
public final class Store implements AutoCloseable {
    /** The advisory lock every ingestion transaction takes on a shared store (an arbitrary constant of ours). */
    static final long WRITER_LOCK = 0x4857_0001L;

    private final StoreDialect dialect;
    private final DataSource dataSource;
    private final AutoCloseable pool;
    private final DSLContext dsl;

    private Store(StoreDialect dialect, DataSource dataSource, AutoCloseable pool) {
        this.dialect = dialect;
        this.dataSource = dataSource;
        this.pool = pool;
        // Names are rendered unquoted so that each database applies its own case rule to the
        // migrations' unquoted identifiers (H2 upper-cases them, PostgreSQL lower-cases them).
        // Timestamps are bound as java.time values (JDBC 4.2 setObject), which H2 2 and PostgreSQL's driver both
        // take: jOOQ's default binds them as formatted text, which the database then parses again, twice per
        // partition row of a harvest.
        Settings settings = new Settings()
                .withRenderQuotedNames(RenderQuotedNames.NEVER)
                .withExecuteLogging(false)
                .withRenderSchema(false)
                .withBindOffsetDateTimeType(true);
        this.dsl = DSL.using(dataSource, dialect.jooq(), settings);
    }

    /** Opens the database and applies any migration it has not had yet. */
    public static Store open(StoreConfig config) {
        StoreDialect dialect = StoreDialect.of(config.jdbcUrl());
        Store store = switch (dialect) {
            case H2 -> {
                JdbcConnectionPool pool = JdbcConnectionPool.create(config.jdbcUrl(), config.user(), config.password());
                pool.setMaxConnections(16);
                yield new Store(dialect, pool, pool::dispose);
            }
            case POSTGRESQL -> postgres(config);
        };
        try {
            migrate(store.dataSource, dialect);
        } catch (RuntimeException e) {
            store.close();
            throw StoreException.opening(config, e);
        }
        return store;
    }

    // A pool because PostgreSQL connections are expensive to open (a server process each, a few ms) and a
    // harvest runs thousands of short queries; H2's own pool only serves H2.
    private static Store postgres(StoreConfig config) {
        HikariConfig hikari = new HikariConfig();
        hikari.setJdbcUrl(config.jdbcUrl());
        hikari.setUsername(config.user());
        hikari.setPassword(config.password());
        hikari.setMaximumPoolSize(10);
        hikari.setPoolName("headwater-store");
        // Fail at open with the server's own message rather than after a long wait.
        hikari.setInitializationFailTimeout(1);
        hikari.setConnectionTimeout(10_000);
        try {
            HikariDataSource pool = new HikariDataSource(hikari);
            return new Store(StoreDialect.POSTGRESQL, pool, pool::close);
        } catch (RuntimeException e) {
            throw StoreException.opening(config, e);
        }
    }

    /**
     * The newest migration this build carries; a test checks it against the files in db/migration and the
     * dialect folders.
     * When the database already reports it as applied, start-up skips Flyway entirely: loading Flyway and
     * scanning the jar for migrations was the largest part of a catalog's start time.
     */
    static final String LATEST_MIGRATION = "15";

    private static void migrate(DataSource dataSource, StoreDialect dialect) {
        if (upToDate(dataSource, dialect)) {
            return;
        }
        Flyway.configure()
                .dataSource(dataSource)
                .locations(dialect.migrationLocations())
                .loggers("slf4j")
                .load()
                .migrate();
    }

    private static boolean upToDate(DataSource dataSource, StoreDialect dialect) {
        try (Connection c = dataSource.getConnection()) {
            var history = DSL.using(c, dialect.jooq(), new Settings().withRenderQuotedNames(RenderQuotedNames.ALWAYS));
            // Flyway's own table keeps its quoted lower-case name on every database; on a new database it
            // does not exist yet and the query fails, which also means "not up to date".
            return history.fetchExists(DSL.selectOne().from(DSL.table(DSL.name("flyway_schema_history")))
                    .where(DSL.field(DSL.name("version"), String.class).eq(LATEST_MIGRATION))
                    .and(DSL.field(DSL.name("success"), Boolean.class).isTrue()));
        } catch (SQLException | RuntimeException e) {
            // Anything unexpected: let Flyway look, it knows best.
            return false;
        }
    }

    /** The jOOQ entry point; each call to {@code transaction} runs on its own pooled connection. */
    public DSLContext dsl() {
        return dsl;
    }

    /** Which database this is. */
    public StoreDialect dialect() {
        return dialect;
    }

    /** Whether other processes may write to this store at the same time (a database server, not a file). */
    public boolean shared() {
        return dialect == StoreDialect.POSTGRESQL;
    }

    /**
     * Makes the calling transaction the only catalog writer until it ends. On PostgreSQL this is a
     * transaction-scoped advisory lock, so writers in different processes take turns, and since every
     * change-log sequence number is drawn while the lock is held, change-log rows become visible in
     * sequence order. An embedded H2 file has one process, whose ingestor already serialises batches.
     */
    public void lockForWriting(DSLContext transaction) {
        if (dialect == StoreDialect.POSTGRESQL) {
            transaction.fetch("select pg_advisory_xact_lock(?)", WRITER_LOCK);
        }
    }

    /** The first key of the session advisory locks that mark work in progress (two-int key space). */
    static final int CLAIM_SPACE = 0x4857;

    /**
     * Inserts the row of a piece of work (a harvest) and marks it as being done by this process until the
     * returned claim is closed or the process dies. On PostgreSQL the mark is a session advisory lock on a
     * connection of its own, taken before the row commits (so no other process ever sees the row
     * unclaimed) and dropped by the server with the connection when the process is killed. On H2 the
     * process owns the file anyway.
     *
     * @param insert inserts the row and returns its id
     */
    public Claim claimNew(ToLongFunction<DSLContext> insert) {
        if (dialect != StoreDialect.POSTGRESQL) {
            return new Claim(insert.applyAsLong(dsl), () -> { });
        }
        try {
            Connection c = dataSource.getConnection();
            try {
                c.setAutoCommit(false);
                long id = insert.applyAsLong(DSL.using(c, dialect.jooq(), dsl.settings()));
                advisory(c, "pg_advisory_lock", id);
                c.commit();
                c.setAutoCommit(true);
                return new Claim(id, () -> {
                    try (c) {
                        advisory(c, "pg_advisory_unlock", id);
                    } catch (SQLException e) {
                        // Closing the connection drops the lock anyway.
                    }
                });
            } catch (SQLException | RuntimeException e) {
                c.rollback();
                c.close();
                throw e;
            }
        } catch (SQLException e) {
            throw new StoreException("Cannot record new work in the store", e);
        }
    }

    private static boolean advisory(Connection c, String function, long workId) throws SQLException {
        try (var s = c.prepareStatement("select " + function + "(?, ?)")) {
            s.setInt(1, CLAIM_SPACE);
            s.setInt(2, Math.toIntExact(workId));
            try (var r = s.executeQuery()) {
                // pg_advisory_lock returns void (no Boolean), the try and unlock functions true or false.
                return r.next() && r.getObject(1) instanceof Boolean b && b;
            }
        }
    }

    /** Whether no live process holds a {@link #claimNew claim} on this work. */
    public boolean unclaimed(long workId) {
        if (dialect != StoreDialect.POSTGRESQL) {
            return true;
        }
        try (Connection c = dataSource.getConnection()) {
            boolean free = advisory(c, "pg_try_advisory_lock", workId);
            if (free) {
                advisory(c, "pg_advisory_unlock", workId);
            }
            return free;
        } catch (SQLException e) {
            throw new StoreException("Cannot look at work " + workId + " in the store", e);
        }
    }

    /** Work this process is doing: its row id, and closing it says the work is over. */
    public record Claim(long id, Runnable release) implements AutoCloseable {
        @Override
        public void close() {
            release.run();
        }
    }

    @Override
    public void close() {
        try {
            pool.close();
        } catch (Exception e) {
            throw new StoreException("Closing the store failed", e);
        }
    }
}
