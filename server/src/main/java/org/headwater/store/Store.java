package org.headwater.store;

import com.zaxxer.hikari.HikariConfig;
import com.zaxxer.hikari.HikariDataSource;
import java.sql.Connection;
import java.sql.SQLException;
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
        Settings settings = new Settings()
                .withRenderQuotedNames(RenderQuotedNames.NEVER)
                .withExecuteLogging(false)
                .withRenderSchema(false);
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
     * The newest migration this build carries; a test checks it against the files in db/migration.
     * When the database already reports it as applied, start-up skips Flyway entirely: loading Flyway and
     * scanning the jar for migrations was the largest part of a catalog's start time.
     */
    static final String LATEST_MIGRATION = "5";

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

    /** A connection outside the pool's transactions, for locks held as long as a harvest lasts. */
    Connection dedicatedConnection() throws SQLException {
        return dataSource.getConnection();
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
