package org.headwater.ingest;

import static org.headwater.store.schema.Tables.CHANGE_LOG;

import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import org.jooq.DSLContext;

/** One ingestion transaction: its connection, its single timestamp, and the changes it made so far. */
final class Tx {
    final DSLContext db;
    final OffsetDateTime now;
    private final String origin;
    private final List<Change> changes = new ArrayList<>();

    Tx(DSLContext db, OffsetDateTime now, String origin) {
        this.db = db;
        this.now = now;
        this.origin = origin;
    }

    /** Appends to the change log; every real change goes through here, nothing else writes the log. */
    void changed(String entity, long entityId, String operation, String summary) {
        Long seq = db.insertInto(CHANGE_LOG)
                .set(CHANGE_LOG.CHANGED_AT, now)
                .set(CHANGE_LOG.ENTITY, entity)
                .set(CHANGE_LOG.ENTITY_ID, entityId)
                .set(CHANGE_LOG.OPERATION, operation)
                .set(CHANGE_LOG.ORIGIN, origin)
                .set(CHANGE_LOG.SUMMARY, summary == null ? null : truncate(summary, 4000))
                .returningResult(CHANGE_LOG.SEQ)
                .fetchOne(CHANGE_LOG.SEQ);
        changes.add(new Change(seq, entity, entityId, operation));
    }

    List<Change> changes() {
        return changes;
    }

    static String truncate(String text, int max) {
        return text.length() <= max ? text : text.substring(0, max);
    }
}
