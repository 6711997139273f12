package org.headwater.ingest;

import static org.headwater.store.schema.Tables.SCRIPT;
import static org.headwater.store.schema.Tables.SCRIPT_STATE;

import java.time.OffsetDateTime;
import java.util.Objects;
import org.headwater.ingest.Observation.ScriptGone;
import org.headwater.ingest.Observation.ScriptSeen;
import org.headwater.store.schema.tables.records.ScriptRecord;
import org.headwater.store.schema.tables.records.ScriptStateRecord;

/** Applies what was seen of scripts: identity and versions (content hash, git commit), with history. */
final class ScriptApplier {

    void apply(Tx tx, ScriptSeen seen) {
        long id = identity(tx, seen);
        OffsetDateTime modified = DatasetApplier.toStoredTime(seen.modifiedAt());
        String authors = seen.gitAuthors().isEmpty() ? null : Json.stringArray(seen.gitAuthors());
        ScriptStateRecord current = tx.db.selectFrom(SCRIPT_STATE)
                .where(SCRIPT_STATE.SCRIPT_ID.eq(id), SCRIPT_STATE.VALID_TO.isNull())
                .fetchOne();
        if (current != null
                && Objects.equals(current.getSizeBytes(), seen.sizeBytes())
                && DatasetApplier.sameInstant(current.getModifiedAt(), modified)
                && Objects.equals(current.getContentHash(), seen.contentHash())
                && Objects.equals(current.getGitCommit(), seen.gitCommit())
                && Objects.equals(current.getGitAuthor(), seen.gitAuthor())
                && DatasetApplier.sameInstant(current.getGitCommittedAt(), DatasetApplier.toStoredTime(seen.gitCommittedAt()))
                && Objects.equals(current.getGitAuthors(), authors)) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        tx.db.insertInto(SCRIPT_STATE)
                .set(SCRIPT_STATE.SCRIPT_ID, id)
                .set(SCRIPT_STATE.VALID_FROM, tx.now)
                .set(SCRIPT_STATE.SIZE_BYTES, seen.sizeBytes())
                .set(SCRIPT_STATE.MODIFIED_AT, modified)
                .set(SCRIPT_STATE.CONTENT_HASH, seen.contentHash())
                .set(SCRIPT_STATE.GIT_COMMIT, seen.gitCommit())
                .set(SCRIPT_STATE.GIT_AUTHOR, seen.gitAuthor())
                .set(SCRIPT_STATE.GIT_COMMITTED_AT, DatasetApplier.toStoredTime(seen.gitCommittedAt()))
                .set(SCRIPT_STATE.GIT_AUTHORS, authors)
                .execute();
        tx.changed(Change.SCRIPT, id, "state", seen.name());
    }

    void apply(Tx tx, ScriptGone gone) {
        ScriptRecord script = tx.db.selectFrom(SCRIPT).where(SCRIPT.URI.eq(gone.uri())).fetchOne();
        if (script == null) {
            return;
        }
        int closed = tx.db.update(SCRIPT_STATE).set(SCRIPT_STATE.VALID_TO, tx.now)
                .where(SCRIPT_STATE.SCRIPT_ID.eq(script.getId()), SCRIPT_STATE.VALID_TO.isNull())
                .execute();
        if (closed > 0) {
            tx.changed(Change.SCRIPT, script.getId(), "removed", script.getName());
        }
    }

    private static long identity(Tx tx, ScriptSeen seen) {
        ScriptRecord existing = tx.db.selectFrom(SCRIPT).where(SCRIPT.URI.eq(seen.uri())).fetchOne();
        if (existing != null) {
            if (!existing.getName().equals(seen.name()) || !existing.getLanguage().equals(seen.language().word())) {
                existing.setName(seen.name());
                existing.setLanguage(seen.language().word());
                existing.update();
                tx.changed(Change.SCRIPT, existing.getId(), "renamed", seen.name());
            }
            return existing.getId();
        }
        long id = tx.db.insertInto(SCRIPT)
                .set(SCRIPT.URI, seen.uri())
                .set(SCRIPT.NAME, seen.name())
                .set(SCRIPT.LANGUAGE, seen.language().word())
                .set(SCRIPT.SOURCE_ID, seen.sourceId())
                .set(SCRIPT.FIRST_SEEN, tx.now)
                .returningResult(SCRIPT.ID)
                .fetchOne(SCRIPT.ID);
        tx.changed(Change.SCRIPT, id, "created", seen.name());
        return id;
    }

    /** The id of a script by URI, or null; edges may name scripts that were never harvested. */
    static Long find(Tx tx, String uri) {
        if (uri == null) {
            return null;
        }
        return Tx.remembered(tx.scriptIds, uri,
                u -> tx.db.select(SCRIPT.ID).from(SCRIPT).where(SCRIPT.URI.eq(u)).fetchOne(SCRIPT.ID));
    }
}
