package org.headwater.testing;

import static org.headwater.store.schema.Tables.CHANGE_LOG;
import static org.headwater.store.schema.Tables.COLUMN_LINEAGE;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_NOTE;
import static org.headwater.store.schema.Tables.DATASET_OWNER;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.SCHEMA_COLUMN;
import static org.headwater.store.schema.Tables.SCHEMA_VERSION;
import static org.headwater.store.schema.Tables.SCRIPT;
import static org.headwater.store.schema.Tables.SCRIPT_STATE;

import org.headwater.Catalog;

/** Row counts of every catalog table that holds facts or history; equal counts mean nothing was rewritten. */
public record StoreCounts(int datasets, int datasetStates, int schemaVersions, int schemaColumns, int scripts,
        int scriptStates, int edges, int columnFlows, int notes, int owners, int changeLog) {

    public static StoreCounts of(Catalog catalog) {
        var db = catalog.store().dsl();
        return new StoreCounts(db.fetchCount(DATASET), db.fetchCount(DATASET_STATE), db.fetchCount(SCHEMA_VERSION),
                db.fetchCount(SCHEMA_COLUMN), db.fetchCount(SCRIPT), db.fetchCount(SCRIPT_STATE),
                db.fetchCount(LINEAGE_EDGE), db.fetchCount(COLUMN_LINEAGE), db.fetchCount(DATASET_NOTE),
                db.fetchCount(DATASET_OWNER), db.fetchCount(CHANGE_LOG));
    }
}
