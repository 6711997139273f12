package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.SCHEMA_COLUMN;
import static org.headwater.store.schema.Tables.SCHEMA_VERSION;

import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Objects;
import org.headwater.ingest.Observation.DatasetGone;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.store.schema.tables.records.DatasetRecord;
import org.headwater.store.schema.tables.records.DatasetStateRecord;
import org.headwater.store.schema.tables.records.SchemaVersionRecord;

/** Applies what was seen of datasets: identity, physical state and column structure, each with history. */
final class DatasetApplier {

    void apply(Tx tx, DatasetSeen seen) {
        long id = identity(tx, seen.uri(), seen.name(), seen.kind(), seen.sourceId());
        applyState(tx, id, seen);
        applySchema(tx, id, seen.columns());
    }

    void apply(Tx tx, DatasetGone gone) {
        DatasetRecord dataset = tx.db.selectFrom(DATASET).where(DATASET.URI.eq(gone.uri())).fetchOne();
        if (dataset == null) {
            return;
        }
        int closedStates = tx.db.update(DATASET_STATE).set(DATASET_STATE.VALID_TO, tx.now)
                .where(DATASET_STATE.DATASET_ID.eq(dataset.getId()), DATASET_STATE.VALID_TO.isNull())
                .execute();
        tx.db.update(SCHEMA_VERSION).set(SCHEMA_VERSION.VALID_TO, tx.now)
                .where(SCHEMA_VERSION.DATASET_ID.eq(dataset.getId()), SCHEMA_VERSION.VALID_TO.isNull())
                .execute();
        // A check says how fresh something is that exists; its last state stays as history. The policy
        // stays current, so a dataset that comes back is held to it again.
        tx.db.update(org.headwater.store.schema.Tables.FRESHNESS_CHECK)
                .set(org.headwater.store.schema.Tables.FRESHNESS_CHECK.VALID_TO, tx.now)
                .where(org.headwater.store.schema.Tables.FRESHNESS_CHECK.DATASET_ID.eq(dataset.getId()),
                        org.headwater.store.schema.Tables.FRESHNESS_CHECK.VALID_TO.isNull())
                .execute();
        if (closedStates > 0) {
            tx.changed(Change.DATASET, dataset.getId(), "removed", dataset.getName());
        }
    }

    /** The id of a dataset by URI, or null. */
    static Long find(Tx tx, String uri) {
        return tx.db.select(DATASET.ID).from(DATASET).where(DATASET.URI.eq(uri)).fetchOne(DATASET.ID);
    }

    /** Finds or creates the dataset's identity row; only the name and kind may be corrected later. */
    static long identity(Tx tx, String uri, String name, DatasetKind kind, Long sourceId) {
        DatasetRecord existing = tx.db.selectFrom(DATASET).where(DATASET.URI.eq(uri)).fetchOne();
        if (existing == null) {
            long id = tx.db.insertInto(DATASET)
                    .set(DATASET.URI, uri)
                    .set(DATASET.NAME, name)
                    .set(DATASET.KIND, kind.word())
                    .set(DATASET.SOURCE_ID, sourceId)
                    .set(DATASET.FIRST_SEEN, tx.now)
                    .returningResult(DATASET.ID)
                    .fetchOne(DATASET.ID);
            tx.changed(Change.DATASET, id, "created", name);
            return id;
        }
        boolean kindKnownBetter = kind != DatasetKind.OTHER && !kind.word().equals(existing.getKind());
        boolean sourceNowKnown = sourceId != null && !sourceId.equals(existing.getSourceId());
        if (!name.equals(existing.getName()) || kindKnownBetter || sourceNowKnown) {
            existing.setName(name);
            if (kindKnownBetter) {
                existing.setKind(kind.word());
            }
            if (sourceNowKnown) {
                existing.setSourceId(sourceId);
            }
            existing.update();
            tx.changed(Change.DATASET, existing.getId(), "renamed", name);
        }
        return existing.getId();
    }

    private void applyState(Tx tx, long id, DatasetSeen seen) {
        OffsetDateTime modified = toStoredTime(seen.modifiedAt());
        DatasetStateRecord current = tx.db.selectFrom(DATASET_STATE)
                .where(DATASET_STATE.DATASET_ID.eq(id), DATASET_STATE.VALID_TO.isNull())
                .fetchOne();
        if (current != null && sameState(current, seen, modified)) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        tx.db.insertInto(DATASET_STATE)
                .set(DATASET_STATE.DATASET_ID, id)
                .set(DATASET_STATE.VALID_FROM, tx.now)
                .set(DATASET_STATE.FORMAT, seen.format())
                .set(DATASET_STATE.SIZE_BYTES, seen.sizeBytes())
                .set(DATASET_STATE.MODIFIED_AT, modified)
                .set(DATASET_STATE.CONTENT_HASH, seen.contentHash())
                .set(DATASET_STATE.ROW_COUNT, seen.rowCount())
                .set(DATASET_STATE.ROW_COUNT_EXACT, seen.rowCountExact())
                .set(DATASET_STATE.DETAILS, seen.details())
                .set(DATASET_STATE.ERROR, seen.error() == null ? null : Tx.truncate(seen.error(), 4000))
                .execute();
        tx.changed(Change.DATASET, id, "state", seen.name());
    }

    private static boolean sameState(DatasetStateRecord current, DatasetSeen seen, OffsetDateTime modified) {
        return current.getFormat().equals(seen.format())
                && Objects.equals(current.getSizeBytes(), seen.sizeBytes())
                && sameInstant(current.getModifiedAt(), modified)
                && Objects.equals(current.getContentHash(), seen.contentHash())
                && Objects.equals(current.getRowCount(), seen.rowCount())
                && current.getRowCountExact() == seen.rowCountExact()
                && Objects.equals(current.getDetails(), seen.details())
                && Objects.equals(current.getError(), seen.error() == null ? null : Tx.truncate(seen.error(), 4000));
    }

    private void applySchema(Tx tx, long id, List<ColumnDef> columns) {
        SchemaVersionRecord current = tx.db.selectFrom(SCHEMA_VERSION)
                .where(SCHEMA_VERSION.DATASET_ID.eq(id), SCHEMA_VERSION.VALID_TO.isNull())
                .fetchOne();
        String fingerprint = columns == null ? null : SchemaFingerprint.of(columns);
        if (current == null ? columns == null : current.getFingerprint().equals(fingerprint)) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        if (columns == null) {
            tx.changed(Change.DATASET, id, "schema", "no columns");
            return;
        }
        Integer last = tx.db.select(org.jooq.impl.DSL.max(SCHEMA_VERSION.VERSION)).from(SCHEMA_VERSION)
                .where(SCHEMA_VERSION.DATASET_ID.eq(id)).fetchOne(0, Integer.class);
        int version = last == null ? 1 : last + 1;
        long versionId = tx.db.insertInto(SCHEMA_VERSION)
                .set(SCHEMA_VERSION.DATASET_ID, id)
                .set(SCHEMA_VERSION.VERSION, version)
                .set(SCHEMA_VERSION.FINGERPRINT, fingerprint)
                .set(SCHEMA_VERSION.VALID_FROM, tx.now)
                .returningResult(SCHEMA_VERSION.ID)
                .fetchOne(SCHEMA_VERSION.ID);
        var insert = tx.db.insertInto(SCHEMA_COLUMN, SCHEMA_COLUMN.SCHEMA_VERSION_ID, SCHEMA_COLUMN.ORDINAL,
                SCHEMA_COLUMN.NAME, SCHEMA_COLUMN.DATA_TYPE, SCHEMA_COLUMN.NULLABLE);
        for (int i = 0; i < columns.size(); i++) {
            ColumnDef c = columns.get(i);
            insert = insert.values(versionId, i + 1, c.name(), c.dataType(), c.nullable());
        }
        if (!columns.isEmpty()) {
            insert.execute();
        }
        tx.changed(Change.DATASET, id, "schema", "version " + version + ", " + columns.size() + " columns");
    }

    /** The store keeps microseconds; trimming here keeps re-observations of the same file equal. */
    static OffsetDateTime toStoredTime(Instant instant) {
        return instant == null ? null : OffsetDateTime.ofInstant(instant.truncatedTo(ChronoUnit.MICROS), ZoneOffset.UTC);
    }

    static boolean sameInstant(OffsetDateTime a, OffsetDateTime b) {
        return a == null ? b == null : b != null && a.toInstant().equals(b.toInstant());
    }
}
