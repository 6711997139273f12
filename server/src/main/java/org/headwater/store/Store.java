package org.headwater.store;

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
    private final JdbcConnectionPool pool;
    private final DSLContext dsl;

    private Store(JdbcConnectionPool pool, SQLDialect dialect) {
        this.pool = pool;
        // Names are rendered unquoted so that each database applies its own case rule to the
        // migrations' unquoted identifiers (H2 upper-cases them, PostgreSQL lower-cases them).
        Settings settings = new Settings()
                .withRenderQuotedNames(RenderQuotedNames.NEVER)
                .withExecuteLogging(false)
                .withRenderSchema(false);
        this.dsl = DSL.using(pool, dialect, settings);
    }

    /** Opens the database and applies any migration it has not had yet. */
    public static Store open(StoreConfig config) {
        if (!config.jdbcUrl().startsWith("jdbc:h2:")) {
            throw new StoreException("Only the embedded H2 store is supported in this version: " + config.jdbcUrl());
        }
        JdbcConnectionPool pool = JdbcConnectionPool.create(config.jdbcUrl(), config.user(), config.password());
        pool.setMaxConnections(16);
        try {
            migrate(pool);
        } catch (RuntimeException e) {
            pool.dispose();
            throw StoreException.opening(config, e);
        }
        return new Store(pool, SQLDialect.H2);
    }

    /**
     * The newest migration this build carries; a test checks it against the files in db/migration.
     * When the database already reports it as applied, start-up skips Flyway entirely: loading Flyway and
     * scanning the jar for migrations was the largest part of a catalog's start time.
     */
    static final String LATEST_MIGRATION = "10";

    private static void migrate(DataSource dataSource) {
        if (upToDate(dataSource)) {
            return;
        }
        Flyway.configure()
                .dataSource(dataSource)
                .locations("classpath:db/migration")
                .loggers("slf4j")
                .load()
                .migrate();
    }

    private static boolean upToDate(DataSource dataSource) {
        try (Connection c = dataSource.getConnection()) {
            var history = DSL.using(c, SQLDialect.H2, new Settings().withRenderQuotedNames(RenderQuotedNames.ALWAYS));
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

    @Override
    public void close() {
        pool.dispose();
    }
}
