package org.headwater.ingest;

import static org.headwater.store.schema.Tables.CHANGE_LOG;

import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import org.headwater.store.Store;
import org.jooq.Condition;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Follows a shared store's change log so that this process's derived data (search index, lineage graph)
 * also learns what other processes wrote. It polls for rows after the newest sequence number it has
 * seen and hands them to the ingestor's listeners, which re-read the changed entities from the store.
 *
 * <p>Gap safety: writers take {@link Store#lockForWriting}, so sequence numbers become visible in order
 * and a gap is normally a rolled-back batch that will never appear. Still, a number skipped below the
 * newest seen is asked for again on every poll for {@link #GAP_GRACE}, so that a row committed late
 * (by a writer that did not take the lock) is not lost either.
 */
public final class ChangeFollower implements AutoCloseable {
    private static final Logger LOG = LoggerFactory.getLogger(ChangeFollower.class);
    static final Duration GAP_GRACE = Duration.ofMinutes(1);
    private static final int PAGE = 5000;
    /** More missing numbers than this at once is a mass rollback, not a late writer: stop tracking them. */
    private static final int MAX_GAPS = 10_000;

    private final Store store;
    private final Ingestor ingestor;
    private final Map<Long, Long> gaps = new HashMap<>();
    private final ScheduledExecutorService timer;
    private long seen;

    private ChangeFollower(Store store, Ingestor ingestor, long seen, Duration interval) {
        this.store = store;
        this.ingestor = ingestor;
        this.seen = seen;
        if (interval == null) {
            this.timer = null;
            return;
        }
        this.timer = Executors.newSingleThreadScheduledExecutor(r -> {
            Thread t = new Thread(r, "headwater-change-follower");
            t.setDaemon(true);
            return t;
        });
        timer.scheduleWithFixedDelay(this::pollQuietly, interval.toMillis(), interval.toMillis(), TimeUnit.MILLISECONDS);
    }

    /**
     * Follows the change log from after {@code seen}, polling every {@code interval}; a null interval
     * polls only when {@link #poll} is called.
     */
    public static ChangeFollower start(Store store, Ingestor ingestor, long seen, Duration interval) {
        return new ChangeFollower(store, ingestor, seen, interval);
    }

    /** The newest change-log sequence number delivered. */
    public synchronized long seen() {
        return seen;
    }

    /** Reads what was committed since the last poll and delivers it; returns the number of changes. */
    public synchronized int poll() {
        int delivered = 0;
        while (true) {
            Condition after = CHANGE_LOG.SEQ.gt(seen);
            Condition wanted = gaps.isEmpty() ? after : after.or(CHANGE_LOG.SEQ.in(gaps.keySet()));
            List<Change> page = store.dsl().select(CHANGE_LOG.SEQ, CHANGE_LOG.ENTITY, CHANGE_LOG.ENTITY_ID,
                            CHANGE_LOG.OPERATION)
                    .from(CHANGE_LOG).where(wanted).orderBy(CHANGE_LOG.SEQ).limit(PAGE)
                    .fetch(r -> new Change(r.value1(), r.value2(), r.value3(), r.value4()));
            expireGaps();
            if (page.isEmpty()) {
                return delivered;
            }
            List<Change> fresh = new ArrayList<>(page.size());
            for (Change change : page) {
                if (gaps.remove(change.seq()) != null) {
                    fresh.add(change);
                } else if (change.seq() > seen) {
                    for (long missing = seen + 1; missing < change.seq() && gaps.size() < MAX_GAPS; missing++) {
                        gaps.put(missing, System.nanoTime());
                    }
                    seen = change.seq();
                    fresh.add(change);
                }
            }
            ingestor.deliver(fresh);
            delivered += fresh.size();
            if (page.size() < PAGE) {
                return delivered;
            }
        }
    }

    private void expireGaps() {
        long now = System.nanoTime();
        gaps.values().removeIf(noticed -> now - noticed > GAP_GRACE.toNanos());
    }

    private void pollQuietly() {
        try {
            poll();
        } catch (RuntimeException e) {
            // The store may be briefly unreachable; the next poll starts from the same place.
            LOG.warn("Following the change log failed: {}", e.toString());
        }
    }

    @Override
    public void close() {
        if (timer != null) {
            // No interrupt: a poll interrupted inside the index's file I/O would close Lucene's channels
            // and leave its writer unusable. Shutting down cancels the next polls; the current one finishes.
            timer.shutdown();
            try {
                timer.awaitTermination(60, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
    }
}
