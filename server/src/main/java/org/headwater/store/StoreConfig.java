package org.headwater.store;

import java.nio.file.Path;
import java.util.Objects;

/**
 * Where the catalog database lives.
 *
 * @param jdbcUrl a JDBC URL: {@code jdbc:h2:…} for the embedded store, {@code jdbc:postgresql:…} for a team store
 * @param user database user, may be empty
 * @param password database password, may be empty; never logged
 */
public record StoreConfig(String jdbcUrl, String user, String password) {
    public StoreConfig {
        Objects.requireNonNull(jdbcUrl, "jdbcUrl");
        user = user == null ? "" : user;
        password = password == null ? "" : password;
    }

    /**
     * The embedded H2 file database inside a catalog directory. {@code WRITE_DELAY=0} makes every commit
     * reach the file before it returns: with H2's default (a background write up to 500 ms later) a
     * process killed with SIGKILL lost run records it had already acknowledged (CrashSafetyTest).
     */
    public static StoreConfig embedded(Path dataDir) {
        return new StoreConfig("jdbc:h2:file:" + dataDir.toAbsolutePath().resolve("catalog") + ";WRITE_DELAY=0", "sa", "");
    }

    /** A private in-memory H2 database, gone when closed; for tests and throwaway catalogs. */
    public static StoreConfig inMemory(String name) {
        return new StoreConfig("jdbc:h2:mem:" + name + ";DB_CLOSE_DELAY=-1", "sa", "");
    }

    /** The URL without its query part, where drivers accept passwords; safe to log and show. */
    public String redactedUrl() {
        int query = jdbcUrl.indexOf('?');
        return query < 0 ? jdbcUrl : jdbcUrl.substring(0, query) + "?…";
    }

    @Override
    public String toString() {
        return "StoreConfig[" + redactedUrl() + ", user=" + user + "]";
    }
}
