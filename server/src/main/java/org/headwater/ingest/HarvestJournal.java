package org.headwater.ingest;

import static org.headwater.store.schema.Tables.HARVEST;
import static org.headwater.store.schema.Tables.HARVEST_ERROR;

import java.time.Clock;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import org.headwater.store.Store;

/**
 * Keeps the record of each harvest: when it ran, what it counted, what it could not read. These rows
 * describe the harvesting, not the catalog's content, so they are written directly rather than as
 * observations. A harvest that dies leaves a row in state {@code running}; the next catalog to open the
 * store marks it {@code interrupted} unless a live process still claims it ({@link Store#claim}).
 */
public final class HarvestJournal {
    /** Harvest outcomes as stored. */
    public static final String RUNNING = "running";
    public static final String OK = "ok";
    public static final String WITH_ERRORS = "with_errors";
    public static final String FAILED = "failed";
    /** Left {@code running} by a process that died; set when a catalog opens. */
    public static final String INTERRUPTED = "interrupted";

    private final Store store;
    private final Clock clock;
    private final Map<Long, Store.Claim> claims = new ConcurrentHashMap<>();

    public HarvestJournal(Store store, Clock clock) {
        this.store = store;
        this.clock = clock;
    }

    public long start(long sourceId) {
        Store.Claim claim = store.claimNew(db -> db.insertInto(HARVEST)
                .set(HARVEST.SOURCE_ID, sourceId)
                .set(HARVEST.STARTED_AT, now())
                .set(HARVEST.STATUS, RUNNING)
                .returningResult(HARVEST.ID)
                .fetchOne(HARVEST.ID));
        claims.put(claim.id(), claim);
        return claim.id();
    }

    /**
     * Marks as {@code interrupted} every harvest left {@code running} by a process that is gone.
     *
     * @return the ids marked
     */
    public List<Long> markInterrupted() {
        List<Long> marked = new ArrayList<>();
        for (long id : store.dsl().select(HARVEST.ID).from(HARVEST).where(HARVEST.STATUS.eq(RUNNING))
                .orderBy(HARVEST.ID).fetch(HARVEST.ID)) {
            if (!claims.containsKey(id) && store.unclaimed(id)) {
                int updated = store.dsl().update(HARVEST)
                        .set(HARVEST.STATUS, INTERRUPTED)
                        .set(HARVEST.FINISHED_AT, now())
                        .where(HARVEST.ID.eq(id)).and(HARVEST.STATUS.eq(RUNNING))
                        .execute();
                if (updated == 1) {
                    marked.add(id);
                }
            }
        }
        return marked;
    }

    public void error(long harvestId, String uri, String kind, String message) {
        store.dsl().insertInto(HARVEST_ERROR)
                .set(HARVEST_ERROR.HARVEST_ID, harvestId)
                .set(HARVEST_ERROR.URI, Tx.truncate(uri, 2000))
                .set(HARVEST_ERROR.KIND, kind)
                .set(HARVEST_ERROR.MESSAGE, Tx.truncate(message == null ? kind : message, 4000))
                .execute();
    }

    /** Records which entry of a sources file ran the harvest, when that is not the source's own name. */
    public void runAs(long harvestId, String configuredName) {
        store.dsl().update(HARVEST).set(HARVEST.RUN_AS, Tx.truncate(configuredName, 200))
                .where(HARVEST.ID.eq(harvestId)).execute();
    }

    /** Counts one harvest reports when it ends. */
    public record Counts(int filesSeen, int filesUnchanged, int filesIgnored, int datasets, int scripts, int changes, int removed,
            int errors) {
    }

    public void finish(long harvestId, String status, Counts counts) {
        store.dsl().update(HARVEST)
                .set(HARVEST.FINISHED_AT, now())
                .set(HARVEST.STATUS, status)
                .set(HARVEST.FILES_SEEN, counts.filesSeen())
                .set(HARVEST.FILES_UNCHANGED, counts.filesUnchanged())
                .set(HARVEST.FILES_IGNORED, counts.filesIgnored())
                .set(HARVEST.DATASETS_SEEN, counts.datasets())
                .set(HARVEST.SCRIPTS_SEEN, counts.scripts())
                .set(HARVEST.CHANGES, counts.changes())
                .set(HARVEST.REMOVED, counts.removed())
                .set(HARVEST.ERRORS, counts.errors())
                .where(HARVEST.ID.eq(harvestId))
                .execute();
        Store.Claim claim = claims.remove(harvestId);
        if (claim != null) {
            claim.close();
        }
    }

    /** Counts errors found after a harvest's files were done (its policy file), which make it one with errors. */
    public void addErrors(long harvestId, int errors) {
        store.dsl().update(HARVEST)
                .set(HARVEST.ERRORS, HARVEST.ERRORS.plus(errors))
                .set(HARVEST.STATUS, org.jooq.impl.DSL.when(HARVEST.STATUS.eq(OK), WITH_ERRORS).otherwise(HARVEST.STATUS))
                .where(HARVEST.ID.eq(harvestId))
                .execute();
    }

    private OffsetDateTime now() {
        return OffsetDateTime.ofInstant(clock.instant().truncatedTo(java.time.temporal.ChronoUnit.MICROS), ZoneOffset.UTC);
    }
}
