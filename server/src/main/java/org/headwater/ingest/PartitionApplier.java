package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET_PARTITION;

import java.time.OffsetDateTime;
import java.util.Objects;
import org.headwater.ingest.Observation.PartitionGone;
import org.headwater.ingest.Observation.PartitionSeen;
import org.headwater.model.DatasetKind;
import org.headwater.store.schema.tables.records.DatasetPartitionRecord;

/** Applies the member files of partitioned sets, each with its own history (always inside a run of BatchRows). */
final class PartitionApplier {
    void apply(Tx tx, PartitionSeen seen) {
        long set = DatasetApplier.identity(tx, seen.setUri(), seen.setName(), DatasetKind.FILE_SET, seen.sourceId());
        OffsetDateTime modified = DatasetApplier.toStoredTime(seen.modifiedAt());
        String columns = Json.columns(seen.columns());
        String error = seen.error() == null ? null : Tx.truncate(seen.error(), 4000);
        DatasetPartitionRecord current = tx.rows.partition(set, seen.uri());
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
            tx.rows.closePartition(current);
        }
        DatasetPartitionRecord row = tx.db.newRecord(DATASET_PARTITION);
        row.setDatasetId(set);
        row.setUri(seen.uri());
        row.setName(seen.name());
        row.setPartitionKeys(seen.keys());
        row.setValidFrom(tx.now);
        row.setValidTo(null);
        row.setSizeBytes(seen.sizeBytes());
        row.setModifiedAt(modified);
        row.setContentHash(seen.contentHash());
        row.setRowCount(seen.rowCount());
        row.setRowCountExact(seen.rowCountExact());
        row.setColumnsJson(columns);
        row.setError(error);
        tx.rows.insertPartition(row);
        tx.changed(Change.DATASET, set, "partition", seen.name());
    }

    void apply(Tx tx, PartitionGone gone) {
        Long set = DatasetApplier.find(tx, gone.setUri());
        DatasetPartitionRecord current = set == null ? null : tx.rows.partition(set, gone.uri());
        if (current != null) {
            tx.rows.closePartition(current);
            tx.changed(Change.DATASET, set, "partition", "removed " + current.getName());
        }
    }
}
