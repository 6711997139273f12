package org.headwater.access;

import static org.headwater.store.schema.Tables.AUDIT_EVENT;

import java.time.Clock;
import java.time.Instant;
import java.util.List;
import org.headwater.store.Store;
import org.jooq.Condition;
import org.jooq.impl.DSL;

/** The append-only audit log: edits, refused writes, token creation, use and revocation. */
public final class Audit {
    private final Store store;
    private final Clock clock;

    public Audit(Store store, Clock clock) {
        this.store = store;
        this.clock = clock;
    }

    /** One audit entry; {@code tokenId} is null for anonymous callers and for the command line. */
    public record Event(long id, Instant at, Long tokenId, String actor, String action, String target, Integer status,
            String address, String detail) {
    }

    /** Appends an entry. Texts are cut to their column sizes rather than refused: the log must not fail. */
    public void record(Long tokenId, String actor, String action, String target, Integer status, String address,
            String detail) {
        store.dsl().insertInto(AUDIT_EVENT)
                .set(AUDIT_EVENT.AT, Tokens.odt(clock.instant()))
                .set(AUDIT_EVENT.TOKEN_ID, tokenId)
                .set(AUDIT_EVENT.ACTOR, cut(actor, 200))
                .set(AUDIT_EVENT.ACTION, cut(action, 60))
                .set(AUDIT_EVENT.TARGET, cut(target, 2000))
                .set(AUDIT_EVENT.STATUS, status)
                .set(AUDIT_EVENT.ADDRESS, cut(address, 100))
                .set(AUDIT_EVENT.DETAIL, cut(detail, 4000))
                .execute();
    }

    /** The newest entries first, optionally only those after {@code since} or of one action. */
    public List<Event> list(Instant since, String action, int limit) {
        Condition where = DSL.trueCondition();
        if (since != null) {
            where = where.and(AUDIT_EVENT.AT.ge(Tokens.odt(since)));
        }
        if (action != null) {
            where = where.and(AUDIT_EVENT.ACTION.eq(action));
        }
        return store.dsl().selectFrom(AUDIT_EVENT).where(where).orderBy(AUDIT_EVENT.ID.desc()).limit(limit)
                .fetch(r -> new Event(r.getId(), Tokens.instant(r.getAt()), r.getTokenId(), r.getActor(), r.getAction(),
                        r.getTarget(), r.getStatus(), r.getAddress(), r.getDetail()));
    }

    private static String cut(String text, int max) {
        if (text == null) {
            return null;
        }
        return text.length() <= max ? text : text.substring(0, max - 1) + "…";
    }
}
