package org.headwater.testing;

import java.nio.file.Path;
import java.time.Clock;
import java.util.UUID;
import org.headwater.Catalog;
import org.headwater.store.StoreConfig;

/** Catalogs for tests: the production settings, on a fresh in-memory H2 database and a temporary index. */
public final class TestCatalogs {
    private TestCatalogs() {
    }

    public static Catalog fresh(Path dataDir) {
        return fresh(dataDir, Clock.systemUTC());
    }

    public static Catalog fresh(Path dataDir, Clock clock) {
        return Catalog.open(dataDir, StoreConfig.inMemory("test-" + UUID.randomUUID()), clock);
    }
}
