package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_STATE;
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

    // DatasetSeen and DatasetGone always apply inside a run of BatchRows, so their rows come from there.
    void apply(Tx tx, DatasetSeen seen) {
        long id = identity(tx, seen.uri(), seen.name(), seen.kind(), seen.sourceId());
        applyState(tx, id, seen);
        applySchema(tx, id, seen.columns());
    }

    void apply(Tx tx, DatasetGone gone) {
        DatasetRecord dataset = tx.rows.dataset(gone.uri());
        if (dataset == null) {
            return;
        }
        DatasetStateRecord state = tx.rows.state(dataset.getId());
        if (state != null) {
            tx.rows.closeState(state);
        }
        SchemaVersionRecord schema = tx.rows.schema(dataset.getId());
        if (schema != null) {
            tx.rows.closeSchema(schema);
        }
        // A check says how fresh something is that exists. The policy stays current, so a dataset that
        // comes back is held to it again.
        tx.rows.endCheck(dataset.getId());
        if (state != null) {
            tx.changed(Change.DATASET, dataset.getId(), "removed", dataset.getName());
        }
    }

    /** The id of a dataset by URI, or null. */
    static Long find(Tx tx, String uri) {
        if (tx.rows.loaded(uri)) {
            DatasetRecord d = tx.rows.dataset(uri);
            return d == null ? null : d.getId();
        }
        return Tx.remembered(tx.datasetIds, uri,
                u -> tx.db.select(DATASET.ID).from(DATASET).where(DATASET.URI.eq(u)).fetchOne(DATASET.ID));
    }

    /** Finds or creates the dataset's identity row; only the name and kind may be corrected later. */
    static long identity(Tx tx, String uri, String name, DatasetKind kind, Long sourceId) {
        DatasetRecord existing;
        if (tx.rows.loaded(uri)) {
            DatasetRecord created = tx.rows.takeCreated(uri);
            if (created != null) {
                // Inserted when the run was loaded, from this very observation (the URI's first).
                tx.changed(Change.DATASET, created.getId(), "created", name);
                return created.getId();
            }
            existing = tx.rows.dataset(uri);
        } else {
            existing = tx.db.selectFrom(DATASET).where(DATASET.URI.eq(uri)).fetchOne();
        }
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
            tx.datasetIds.put(uri, id);
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
        DatasetStateRecord current = tx.rows.state(id);
        if (current != null && sameState(current, seen, modified)) {
            return;
        }
        if (current != null) {
            tx.rows.closeState(current);
        }
        DatasetStateRecord row = tx.db.newRecord(DATASET_STATE);
        row.setDatasetId(id);
        row.setValidFrom(tx.now);
        row.setValidTo(null);
        row.setFormat(seen.format());
        row.setSizeBytes(seen.sizeBytes());
        row.setModifiedAt(modified);
        row.setContentHash(seen.contentHash());
        row.setRowCount(seen.rowCount());
        row.setRowCountExact(seen.rowCountExact());
        row.setDetails(seen.details());
        row.setError(seen.error() == null ? null : Tx.truncate(seen.error(), 4000));
        tx.rows.insertState(row);
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
        SchemaVersionRecord current = tx.rows.schema(id);
        String fingerprint = columns == null ? null : SchemaFingerprint.of(columns);
        if (current == null ? columns == null : current.getFingerprint().equals(fingerprint)) {
            return;
        }
        if (current != null) {
            tx.rows.closeSchema(current);
        }
        if (columns == null) {
            tx.changed(Change.DATASET, id, "schema", "no columns");
            return;
        }
        int version = tx.rows.nextVersion(id);
        SchemaVersionRecord row = tx.db.newRecord(SCHEMA_VERSION);
        row.setDatasetId(id);
        row.setVersion(version);
        row.setFingerprint(fingerprint);
        row.setValidFrom(tx.now);
        row.setValidTo(null);
        tx.rows.insertSchema(row, columns);
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
