package org.headwater.testing;

import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.concurrent.atomic.AtomicInteger;

/**
 * The throwaway PostgreSQL server that {@code .ci/postgres.sh} starts (its URL in {@code HEADWATER_TEST_PG_URL}).
 * Each call to {@link #freshDatabase} creates an empty database of its own, so test classes never see each
 * other's rows. Without the variable, tests skip (or fail under {@code HEADWATER_REQUIRE_EXTERNAL=true}).
 */
public final class TestPostgres {
    private static final AtomicInteger COUNTER = new AtomicInteger();

    private TestPostgres() {
    }

    /** A database on the test server: its JDBC URL and the user to connect as (no password: trust auth). */
    public record Database(String url, String user, String name) {
        public Connection connect() throws SQLException {
            return DriverManager.getConnection(url, user, "");
        }
    }

    public static boolean available() {
        String url = System.getenv("HEADWATER_TEST_PG_URL");
        return url != null && !url.isBlank();
    }

    /** Skips the calling test (or fails it under CI) when no test server was started. */
    public static void need() {
        External.need(available(), "A PostgreSQL test server (start one with: eval \"$(.ci/postgres.sh start /tmp/hw-pg)\")");
    }

    /** Creates a new, empty database named after {@code prefix} and returns how to reach it. */
    public static Database freshDatabase(String prefix) {
        need();
        String admin = System.getenv("HEADWATER_TEST_PG_URL");
        String user = System.getenv().getOrDefault("HEADWATER_TEST_PG_USER", "headwater");
        String name = (prefix.replaceAll("[^a-zA-Z0-9]", "_") + "_" + ProcessHandle.current().pid() + "_"
                + COUNTER.incrementAndGet() + "_" + Long.toString(System.nanoTime() % 1_000_000L, 36)).toLowerCase();
        try (Connection c = DriverManager.getConnection(admin, user, ""); Statement s = c.createStatement()) {
            s.execute("create database " + name);
        } catch (SQLException e) {
            throw new IllegalStateException("Cannot create test database " + name + " on " + admin, e);
        }
        String url = admin.substring(0, admin.lastIndexOf('/') + 1) + name;
        return new Database(url, user, name);
    }
}
