package org.headwater.ingest;

import static org.headwater.store.schema.Tables.HARVEST;
import static org.headwater.store.schema.Tables.HARVEST_ERROR;
import static org.headwater.store.schema.Tables.SOURCE;

import java.time.Clock;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.function.Consumer;
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
    /** Harvests of this process still running, with their counts so far (memory only: live status). */
    private final Map<Long, HarvestEvent> live = new ConcurrentHashMap<>();
    private final List<Consumer<HarvestEvent>> listeners = new CopyOnWriteArrayList<>();

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
        String source = store.dsl().select(SOURCE.NAME)
                .from(SOURCE)
                .where(SOURCE.ID.eq(sourceId)).fetchOne(SOURCE.NAME);
        HarvestEvent started = new HarvestEvent(HarvestEvent.STARTED, claim.id(), source, clock.instant(), 0, 0,
                RUNNING, null, null, null, null);
        live.put(claim.id(), started);
        publish(started);
        return claim.id();
    }

    /**
     * Hears every harvest event of this process, on the harvesting thread: a listener must hand slow work
     * elsewhere. Closing the handle stops the events.
     */
    public AutoCloseable listen(Consumer<HarvestEvent> listener) {
        listeners.add(listener);
        return () -> listeners.remove(listener);
    }

    /** The harvests of this process that are running, each as its latest {@code progress} (or start). */
    public List<HarvestEvent> running() {
        return live.values().stream().sorted(java.util.Comparator.comparingLong(HarvestEvent::harvestId)).toList();
    }

    /** Counts one more file (or table) looked at; kept in memory and told to listeners, not stored. */
    public void seen(long harvestId, int filesSeen) {
        HarvestEvent now = live.computeIfPresent(harvestId, (id, e) -> new HarvestEvent(HarvestEvent.PROGRESS, id, e.source(),
                clock.instant(), filesSeen, e.errors(), RUNNING, null, null, null, null));
        if (now != null) {
            publish(now);
        }
    }

    private void publish(HarvestEvent event) {
        for (Consumer<HarvestEvent> l : listeners) {
            try {
                l.accept(event);
            } catch (RuntimeException e) {
                // a listener's fault must never stop a harvest
                org.slf4j.LoggerFactory.getLogger(HarvestJournal.class).warn("A harvest listener failed: {}", e.toString());
            }
        }
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
        HarvestEvent now = live.computeIfPresent(harvestId, (id, e) -> new HarvestEvent(HarvestEvent.PROGRESS, id, e.source(),
                e.at(), e.filesSeen(), e.errors() + 1, RUNNING, null, null, null, null));
        publish(new HarvestEvent(HarvestEvent.PROBLEM, harvestId, now == null ? null : now.source(), clock.instant(), null,
                now == null ? null : now.errors(), null, null, Tx.truncate(uri, 2000), kind, Tx.truncate(message == null ? kind : message, 4000)));
    }

    /** Records which entry of a sources file ran the harvest; shown in place of the source's own name. */
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
        HarvestEvent last = live.remove(harvestId);
        publish(new HarvestEvent(HarvestEvent.FINISHED, harvestId, last == null ? sourceOf(harvestId) : last.source(), clock.instant(),
                counts.filesSeen(), counts.errors(), status, counts, null, null, null));
    }

    private String sourceOf(long harvestId) {
        return store.dsl().select(SOURCE.NAME).from(HARVEST)
                .join(SOURCE).on(SOURCE.ID.eq(HARVEST.SOURCE_ID))
                .where(HARVEST.ID.eq(harvestId)).fetchOne(SOURCE.NAME);
    }

    /** Counts errors found after a harvest's files were done (its policy file), which make it one with errors. */
    public void addErrors(long harvestId, int errors) {
        store.dsl().update(HARVEST)
                .set(HARVEST.ERRORS, HARVEST.ERRORS.plus(errors))
                .set(HARVEST.STATUS, org.jooq.impl.DSL.when(HARVEST.STATUS.eq(OK), WITH_ERRORS).otherwise(HARVEST.STATUS))
                .where(HARVEST.ID.eq(harvestId))
                .execute();
        var row = store.dsl().select(HARVEST.STATUS, HARVEST.FILES_SEEN, HARVEST.FILES_UNCHANGED, HARVEST.FILES_IGNORED,
                HARVEST.DATASETS_SEEN, HARVEST.SCRIPTS_SEEN, HARVEST.CHANGES, HARVEST.REMOVED, HARVEST.ERRORS)
                .from(HARVEST).where(HARVEST.ID.eq(harvestId)).fetchOne();
        if (row != null && !RUNNING.equals(row.value1())) {
            Counts counts = new Counts(n(row.value2()), n(row.value3()), n(row.value4()), n(row.value5()), n(row.value6()),
                    n(row.value7()), n(row.value8()), n(row.value9()));
            publish(new HarvestEvent(HarvestEvent.FINISHED, harvestId, sourceOf(harvestId), clock.instant(), counts.filesSeen(),
                    counts.errors(), row.value1(), counts, null, null, null));
        }
    }

    private static int n(Integer value) {
        return value == null ? 0 : value;
    }

    private OffsetDateTime now() {
        return OffsetDateTime.ofInstant(clock.instant().truncatedTo(java.time.temporal.ChronoUnit.MICROS), ZoneOffset.UTC);
    }
}
