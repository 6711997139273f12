package org.headwater.ingest;

import static org.headwater.store.schema.Tables.CHANGE_LOG;

import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.jooq.DSLContext;
import org.jooq.Record1;

/** One ingestion transaction: its connection, its single timestamp, and the changes it made so far. */
final class Tx {
    /** Change-log rows per insert statement (7 bind values each). */
    private static final int LOG_CHUNK = 500;

    final DSLContext db;
    final OffsetDateTime now;
    private final String origin;
    private final List<Pending> pending = new ArrayList<>();
    private final List<Change> changes = new ArrayList<>();
    /** What the current run of dataset and partition observations has read and will write. */
    final BatchRows rows;
    /**
     * Dataset and script ids found by URI in this transaction. An id, once given, never changes and its row
     * is never deleted, so the lineage and reference observations of a whole analysis look each URI up once.
     */
    final Map<String, Long> datasetIds = new HashMap<>();
    final Map<String, Long> scriptIds = new HashMap<>();

    /** The id {@code memo} holds for a URI, else what {@code lookup} finds, remembered when it finds one. */
    static Long remembered(Map<String, Long> memo, String uri, java.util.function.Function<String, Long> lookup) {
        Long known = memo.get(uri);
        if (known != null) {
            return known;
        }
        Long id = lookup.apply(uri);
        if (id != null) {
            memo.put(uri, id);
        }
        return id;
    }

    private record Pending(String entity, long entityId, String operation, String summary) {
    }

    Tx(DSLContext db, OffsetDateTime now, String origin) {
        this.db = db;
        this.now = now;
        this.origin = origin;
        this.rows = new BatchRows(this);
    }

    /**
     * Appends to the change log; every real change goes through here, nothing else writes the log. The rows
     * are written together at the end of the transaction ({@link #writeChanges}), in the order they came.
     */
    void changed(String entity, long entityId, String operation, String summary) {
        pending.add(new Pending(entity, entityId, operation, summary == null ? null : truncate(summary, 4000)));
    }

    /**
     * Writes the buffered change-log rows, a multi-row insert per chunk. The sequence numbers of one insert
     * are drawn in the order of its rows (one identity value per row, in order, on H2 and PostgreSQL), so
     * sorting the returned numbers pairs them with the rows whatever order the driver returns them in.
     */
    void writeChanges() {
        for (int from = 0; from < pending.size(); from += LOG_CHUNK) {
            List<Pending> chunk = pending.subList(from, Math.min(pending.size(), from + LOG_CHUNK));
            var insert = db.insertInto(CHANGE_LOG, CHANGE_LOG.CHANGED_AT, CHANGE_LOG.ENTITY, CHANGE_LOG.ENTITY_ID,
                    CHANGE_LOG.OPERATION, CHANGE_LOG.ORIGIN, CHANGE_LOG.SUMMARY);
            for (Pending p : chunk) {
                insert = insert.values(now, p.entity(), p.entityId(), p.operation(), origin, p.summary());
            }
            List<Long> seqs = new ArrayList<>(insert.returningResult(CHANGE_LOG.SEQ).fetch().map(Record1::value1));
            if (seqs.size() != chunk.size()) {
                throw new IllegalStateException("The change log returned " + seqs.size() + " numbers for "
                        + chunk.size() + " rows");
            }
            seqs.sort(null);
            for (int i = 0; i < chunk.size(); i++) {
                Pending p = chunk.get(i);
                changes.add(new Change(seqs.get(i), p.entity(), p.entityId(), p.operation()));
            }
        }
        pending.clear();
    }

    List<Change> changes() {
        return changes;
    }

    static String truncate(String text, int max) {
        return text.length() <= max ? text : text.substring(0, max);
    }
}
