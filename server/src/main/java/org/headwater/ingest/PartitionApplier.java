package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET_PARTITION;

import java.time.OffsetDateTime;
import java.util.Objects;
import org.headwater.ingest.Observation.PartitionGone;
import org.headwater.ingest.Observation.PartitionSeen;
import org.headwater.model.DatasetKind;
import org.headwater.store.schema.tables.records.DatasetPartitionRecord;

/** Applies the member files of partitioned sets, each with its own history. */
final class PartitionApplier {
    void apply(Tx tx, PartitionSeen seen) {
        long set = DatasetApplier.identity(tx, seen.setUri(), seen.setName(), DatasetKind.FILE_SET, seen.sourceId());
        OffsetDateTime modified = DatasetApplier.toStoredTime(seen.modifiedAt());
        String columns = Json.columns(seen.columns());
        String error = seen.error() == null ? null : Tx.truncate(seen.error(), 4000);
        DatasetPartitionRecord current = current(tx, set, seen.uri());
        if (current != null
                && current.getName().equals(seen.name())
                && current.getPartitionKeys().equals(seen.keys())
                && Objects.equals(current.getSizeBytes(), seen.sizeBytes())
                && DatasetApplier.sameInstant(current.getModifiedAt(), modified)
                && Objects.equals(current.getContentHash(), seen.contentHash())
                && Objects.equals(current.getRowCount(), seen.rowCount())
                && current.getRowCountExact() == seen.rowCountExact()
                && Objects.equals(current.getColumnsJson(), columns)
                && Objects.equals(current.getError(), error)) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        tx.db.insertInto(DATASET_PARTITION)
                .set(DATASET_PARTITION.DATASET_ID, set)
                .set(DATASET_PARTITION.URI, seen.uri())
                .set(DATASET_PARTITION.NAME, seen.name())
                .set(DATASET_PARTITION.PARTITION_KEYS, seen.keys())
                .set(DATASET_PARTITION.VALID_FROM, tx.now)
                .set(DATASET_PARTITION.SIZE_BYTES, seen.sizeBytes())
                .set(DATASET_PARTITION.MODIFIED_AT, modified)
                .set(DATASET_PARTITION.CONTENT_HASH, seen.contentHash())
                .set(DATASET_PARTITION.ROW_COUNT, seen.rowCount())
                .set(DATASET_PARTITION.ROW_COUNT_EXACT, seen.rowCountExact())
                .set(DATASET_PARTITION.COLUMNS_JSON, columns)
                .set(DATASET_PARTITION.ERROR, error)
                .execute();
        tx.changed(Change.DATASET, set, "partition", seen.name());
    }

    void apply(Tx tx, PartitionGone gone) {
        Long set = DatasetApplier.find(tx, gone.setUri());
        DatasetPartitionRecord current = set == null ? null : current(tx, set, gone.uri());
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
            tx.changed(Change.DATASET, set, "partition", "removed " + current.getName());
        }
    }

    private static DatasetPartitionRecord current(Tx tx, long set, String uri) {
        return tx.db.selectFrom(DATASET_PARTITION)
                .where(DATASET_PARTITION.DATASET_ID.eq(set), DATASET_PARTITION.URI.eq(uri),
                        DATASET_PARTITION.VALID_TO.isNull())
                .fetchOne();
    }
}
