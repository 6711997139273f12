package org.headwater.ingest;

import static org.headwater.store.schema.Tables.SOURCE;

import java.time.Clock;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import org.headwater.store.Store;
import org.headwater.store.schema.tables.records.SourceRecord;

/** Registers the roots the catalog harvests; a root keeps its source id across harvests. */
public final class Sources {
    private final Store store;
    private final Clock clock;

    public Sources(Store store, Clock clock) {
        this.store = store;
        this.clock = clock;
    }

    /**
     * The id of the source for this root, registering it on first use. A new source takes the preferred
     * name, or the name with a number appended when another root already has it.
     */
    public synchronized long ensure(String preferredName, String kind, String rootUri) {
        return store.dsl().transactionResult(c -> {
            var db = c.dsl();
            SourceRecord existing = db.selectFrom(SOURCE).where(SOURCE.ROOT_URI.eq(rootUri)).fetchOne();
            if (existing != null) {
                return existing.getId();
            }
            String name = preferredName;
            for (int n = 2; db.fetchExists(SOURCE, SOURCE.NAME.eq(name)); n++) {
                name = preferredName + "-" + n;
            }
            return db.insertInto(SOURCE)
                    .set(SOURCE.NAME, name)
                    .set(SOURCE.KIND, kind)
                    .set(SOURCE.ROOT_URI, rootUri)
                    .set(SOURCE.CREATED_AT, OffsetDateTime.ofInstant(clock.instant(), ZoneOffset.UTC))
                    .returningResult(SOURCE.ID)
                    .fetchOne(SOURCE.ID);
        });
    }
}
