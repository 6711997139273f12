package org.headwater.testing;

import java.nio.file.Path;
import java.time.Clock;
import java.util.Map;
import java.util.UUID;
import java.util.concurrent.ConcurrentHashMap;
import org.headwater.Catalog;
import org.headwater.store.StoreConfig;

/**
 * Catalogs for tests: the production settings, on a fresh store and a temporary index. The store is a
 * private in-memory H2 database, or, when the build runs a test class a second time with the system
 * property {@code headwater.testStore=postgresql} (the server pom's {@code postgresql-store} execution),
 * a fresh database on the throwaway PostgreSQL server. So the same test methods check both dialects.
 */
public final class TestCatalogs {
    private static final Map<Path, StoreConfig> PERSISTENT = new ConcurrentHashMap<>();

    private TestCatalogs() {
    }

    /** True in the test run that puts every catalog on PostgreSQL. */
    public static boolean onPostgres() {
        return "postgresql".equals(System.getProperty("headwater.testStore"));
    }

    /** The name of the dialect under test, for messages. */
    public static String dialect() {
        return onPostgres() ? "postgresql" : "h2";
    }

    public static Catalog fresh(Path dataDir) {
        return fresh(dataDir, Clock.systemUTC());
    }

    public static Catalog fresh(Path dataDir, Clock clock) {
        return Catalog.open(dataDir, freshStore("test"), clock);
    }

    /** An empty store of the dialect under test. */
    public static StoreConfig freshStore(String prefix) {
        if (onPostgres()) {
            TestPostgres.Database db = TestPostgres.freshDatabase(prefix);
            return new StoreConfig(db.url(), db.user(), "");
        }
        return StoreConfig.inMemory(prefix + "-" + UUID.randomUUID());
    }

    /**
     * A catalog that can be closed and opened again with its content: the H2 file in {@code dataDir}, or
     * the same PostgreSQL database every time this {@code dataDir} is named.
     */
    public static Catalog reopenable(Path dataDir) {
        return Catalog.open(dataDir, persistentStore(dataDir), Clock.systemUTC());
    }

    /** The store {@link #reopenable} uses for {@code dataDir}. */
    public static StoreConfig persistentStore(Path dataDir) {
        Path key = dataDir.toAbsolutePath().normalize();
        if (!onPostgres()) {
            return StoreConfig.embedded(key);
        }
        return PERSISTENT.computeIfAbsent(key, k -> freshStore("reopen"));
    }
}
