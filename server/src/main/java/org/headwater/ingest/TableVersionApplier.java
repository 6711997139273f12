package org.headwater.ingest;

import static org.headwater.store.schema.Tables.SCHEMA_COLUMN;
import static org.headwater.store.schema.Tables.SCHEMA_VERSION;

import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.headwater.ingest.Observation.TableVersion;
import org.headwater.ingest.Observation.TableVersionsSeen;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.store.schema.tables.records.SchemaVersionRecord;
import org.jooq.impl.DSL;

/**
 * Turns a table format's own versions into schema versions of the table's dataset. The catalog's validity
 * stays the catalog's own (versions first seen together open and close at the same instant); the table's
 * clock goes in {@code recorded_at}.
 */
final class TableVersionApplier {

    void apply(Tx tx, TableVersionsSeen seen) {
        long id = DatasetApplier.identity(tx, seen.uri(), seen.name(), DatasetKind.TABLE, seen.sourceId());
        List<TableVersion> fresh = unknown(tx, id, seen.versions());
        if (fresh.isEmpty()) {
            return;
        }
        Integer last = tx.db.select(DSL.max(SCHEMA_VERSION.VERSION)).from(SCHEMA_VERSION)
                .where(SCHEMA_VERSION.DATASET_ID.eq(id)).fetchOne(0, Integer.class);
        int number = last == null ? 0 : last;
        for (TableVersion v : fresh) {
            tx.db.update(SCHEMA_VERSION).set(SCHEMA_VERSION.VALID_TO, tx.now)
                    .where(SCHEMA_VERSION.DATASET_ID.eq(id), SCHEMA_VERSION.VALID_TO.isNull())
                    .execute();
            number++;
            long versionId = tx.db.insertInto(SCHEMA_VERSION)
                    .set(SCHEMA_VERSION.DATASET_ID, id)
                    .set(SCHEMA_VERSION.VERSION, number)
                    .set(SCHEMA_VERSION.FINGERPRINT, SchemaFingerprint.of(v.columns()))
                    .set(SCHEMA_VERSION.VALID_FROM, tx.now)
                    .set(SCHEMA_VERSION.TABLE_VERSION, Tx.truncate(v.version(), 100))
                    .set(SCHEMA_VERSION.RECORDED_AT, DatasetApplier.toStoredTime(v.recordedAt()))
                    .set(SCHEMA_VERSION.OPERATION, v.operation() == null ? null : Tx.truncate(v.operation(), 200))
                    .set(SCHEMA_VERSION.PARTITION_COLUMNS, Tx.truncate(Json.stringArray(v.partitionColumns()), 4000))
                    .returningResult(SCHEMA_VERSION.ID)
                    .fetchOne(SCHEMA_VERSION.ID);
            List<ColumnDef> columns = v.columns();
            if (!columns.isEmpty()) {
                var insert = tx.db.insertInto(SCHEMA_COLUMN, SCHEMA_COLUMN.SCHEMA_VERSION_ID, SCHEMA_COLUMN.ORDINAL,
                        SCHEMA_COLUMN.NAME, SCHEMA_COLUMN.DATA_TYPE, SCHEMA_COLUMN.NULLABLE);
                for (int i = 0; i < columns.size(); i++) {
                    ColumnDef c = columns.get(i);
                    insert = insert.values(versionId, i + 1, c.name(), c.dataType(), c.nullable());
                }
                insert.execute();
            }
        }
        TableVersion newest = fresh.get(fresh.size() - 1);
        tx.changed(Change.DATASET, id, "schema", fresh.size() + " table version(s) up to " + newest.version() + ", "
                + newest.columns().size() + " columns");
    }

    /**
     * The versions after the newest one already stored, in the table's order. Versions the table no longer
     * lists (cleaned-up commits, expired snapshots) stay in the history; one the store already holds is never
     * added twice.
     */
    private static List<TableVersion> unknown(Tx tx, long id, List<TableVersion> versions) {
        Set<String> known = new HashSet<>(tx.db.select(SCHEMA_VERSION.TABLE_VERSION).from(SCHEMA_VERSION)
                .where(SCHEMA_VERSION.DATASET_ID.eq(id), SCHEMA_VERSION.TABLE_VERSION.isNotNull())
                .fetch(SCHEMA_VERSION.TABLE_VERSION));
        int after = -1;
        for (int i = 0; i < versions.size(); i++) {
            if (known.contains(Tx.truncate(versions.get(i).version(), 100))) {
                after = i;
            }
        }
        return versions.subList(after + 1, versions.size());
    }
}
