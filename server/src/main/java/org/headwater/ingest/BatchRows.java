package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_PARTITION;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.FRESHNESS_CHECK;
import static org.headwater.store.schema.Tables.SCHEMA_COLUMN;
import static org.headwater.store.schema.Tables.SCHEMA_VERSION;

import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.ingest.Observation.DatasetGone;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.PartitionGone;
import org.headwater.ingest.Observation.PartitionSeen;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.store.schema.tables.records.DatasetPartitionRecord;
import org.headwater.store.schema.tables.records.DatasetRecord;
import org.headwater.store.schema.tables.records.DatasetStateRecord;
import org.headwater.store.schema.tables.records.SchemaColumnRecord;
import org.headwater.store.schema.tables.records.SchemaVersionRecord;
import org.jooq.Field;
import org.jooq.impl.DSL;

/**
 * The rows a run of dataset and partition observations touches, read for the whole run with a few
 * queries and written back with a few statements when the run ends. The appliers decide exactly as they
 * would row by row, against this memory instead of the store: a row inserted earlier in the run has no
 * id yet, and closing it sets its end before it is written. The change log is buffered by {@link Tx}, so
 * its order stays the order of the observations.
 */
final class BatchRows {
    /** Rows per query or statement: well under PostgreSQL's 32,767 bind values for every table here. */
    private static final int CHUNK = 500;

    private final Tx tx;
    private boolean active;
    private final Map<String, DatasetRecord> datasets = new HashMap<>();
    /** Every URI the run looked up: one missing from {@link #datasets} is known to have no identity row. */
    private final Set<String> loadedUris = new HashSet<>();
    /** Identities inserted for this run whose "created" change is due when their first observation applies. */
    private final Set<String> createdPending = new HashSet<>();
    private final Map<Long, DatasetStateRecord> states = new HashMap<>();
    private final Map<Long, SchemaVersionRecord> schemas = new HashMap<>();
    private final Map<Long, Integer> lastVersion = new HashMap<>();
    private final Map<String, DatasetPartitionRecord> partitions = new HashMap<>();

    private final List<Long> stateCloses = new ArrayList<>();
    private final List<DatasetStateRecord> stateInserts = new ArrayList<>();
    private final List<Long> schemaCloses = new ArrayList<>();
    private final List<SchemaVersionRecord> schemaInserts = new ArrayList<>();
    /** The columns of each new version, in the order of {@link #schemaInserts}. */
    private final List<List<ColumnDef>> schemaColumns = new ArrayList<>();
    private final List<Long> partitionCloses = new ArrayList<>();
    private final List<DatasetPartitionRecord> partitionInserts = new ArrayList<>();
    /** Datasets gone in this run whose current freshness check ends with them (checks are not loaded). */
    private final List<Long> checkEnds = new ArrayList<>();

    BatchRows(Tx tx) {
        this.tx = tx;
    }

    /** The observations a run covers; the rest apply row by row against the store. */
    static boolean covers(Observation o) {
        return o instanceof DatasetSeen || o instanceof DatasetGone || o instanceof PartitionSeen
                || o instanceof PartitionGone;
    }

    boolean active() {
        return active;
    }

    /**
     * Reads what the run will compare with, and inserts the identities it will create (in the order of
     * their first observation, so ids come out as they would one by one).
     */
    void load(List<? extends Observation> run) {
        // Identities are created by the first observation that sees the URI, in that order; a "gone" only looks.
        Map<String, Observation> firstByUri = new LinkedHashMap<>();
        Set<String> uris = new HashSet<>();
        Set<String> partitionUris = new HashSet<>();
        for (Observation o : run) {
            if (o instanceof DatasetSeen s) {
                firstByUri.putIfAbsent(s.uri(), o);
                uris.add(s.uri());
            } else if (o instanceof DatasetGone g) {
                uris.add(g.uri());
            } else if (o instanceof PartitionSeen p) {
                firstByUri.putIfAbsent(p.setUri(), o);
                uris.add(p.setUri());
                partitionUris.add(p.uri());
            } else if (o instanceof PartitionGone g) {
                uris.add(g.setUri());
                partitionUris.add(g.uri());
            }
        }
        loadedUris.addAll(uris);
        for (List<String> chunk : chunks(new ArrayList<>(uris))) {
            for (DatasetRecord d : tx.db.selectFrom(DATASET).where(in(DATASET.URI, chunk)).fetch()) {
                datasets.put(d.getUri(), d);
            }
        }
        createIdentities(firstByUri);
        List<Long> ids = new ArrayList<>();
        for (DatasetRecord d : datasets.values()) {
            if (!createdPending.contains(d.getUri())) {
                ids.add(d.getId());
            }
        }
        for (List<Long> chunk : chunks(ids)) {
            for (DatasetStateRecord s : tx.db.selectFrom(DATASET_STATE)
                    .where(in(DATASET_STATE.DATASET_ID, chunk), DATASET_STATE.VALID_TO.isNull()).fetch()) {
                states.put(s.getDatasetId(), s);
            }
            for (SchemaVersionRecord v : tx.db.selectFrom(SCHEMA_VERSION)
                    .where(in(SCHEMA_VERSION.DATASET_ID, chunk), SCHEMA_VERSION.VALID_TO.isNull()).fetch()) {
                schemas.put(v.getDatasetId(), v);
            }
            tx.db.select(SCHEMA_VERSION.DATASET_ID, DSL.max(SCHEMA_VERSION.VERSION)).from(SCHEMA_VERSION)
                    .where(in(SCHEMA_VERSION.DATASET_ID, chunk)).groupBy(SCHEMA_VERSION.DATASET_ID)
                    .forEach(r -> lastVersion.put(r.value1(), r.value2()));
        }
        for (List<String> chunk : chunks(new ArrayList<>(partitionUris))) {
            for (DatasetPartitionRecord p : tx.db.selectFrom(DATASET_PARTITION)
                    .where(in(DATASET_PARTITION.URI, chunk), DATASET_PARTITION.VALID_TO.isNull()).fetch()) {
                partitions.put(partitionKey(p.getDatasetId(), p.getUri()), p);
            }
        }
        active = true;
    }

    private void createIdentities(Map<String, Observation> firstByUri) {
        List<DatasetRecord> fresh = new ArrayList<>();
        for (Map.Entry<String, Observation> e : firstByUri.entrySet()) {
            if (datasets.containsKey(e.getKey())) {
                continue;
            }
            DatasetRecord d = tx.db.newRecord(DATASET);
            if (e.getValue() instanceof DatasetSeen s) {
                d.setName(s.name());
                d.setKind(s.kind().word());
                d.setSourceId(s.sourceId());
            } else if (e.getValue() instanceof PartitionSeen p) {
                d.setName(p.setName());
                d.setKind(DatasetKind.FILE_SET.word());
                d.setSourceId(p.sourceId());
            }
            d.setUri(e.getKey());
            d.setFirstSeen(tx.now);
            fresh.add(d);
        }
        if (fresh.isEmpty()) {
            return;
        }
        RecordBatch.insert(tx.db, fresh);
        List<String> freshUris = new ArrayList<>();
        fresh.forEach(d -> freshUris.add(d.getUri()));
        for (List<String> chunk : chunks(freshUris)) {
            for (DatasetRecord d : tx.db.selectFrom(DATASET).where(in(DATASET.URI, chunk)).fetch()) {
                datasets.put(d.getUri(), d);
                createdPending.add(d.getUri());
            }
        }
    }

    /** The identity row of a loaded URI, or null when the store has none (yet, as far as the run goes). */
    DatasetRecord dataset(String uri) {
        return createdPending.contains(uri) ? null : datasets.get(uri);
    }

    /** Whether the run loaded this URI, so that {@link #dataset} is the whole truth about it. */
    boolean loaded(String uri) {
        return active && (datasets.containsKey(uri) || loadedUris.contains(uri));
    }

    /** Takes the identity inserted for this URI at load, once: the caller logs its creation. */
    DatasetRecord takeCreated(String uri) {
        return createdPending.remove(uri) ? datasets.get(uri) : null;
    }

    DatasetStateRecord state(long datasetId) {
        return states.get(datasetId);
    }

    void closeState(DatasetStateRecord current) {
        close(current, DATASET_STATE.ID, DATASET_STATE.VALID_TO, stateCloses);
        states.remove(current.getDatasetId());
    }

    void insertState(DatasetStateRecord row) {
        stateInserts.add(row);
        states.put(row.getDatasetId(), row);
    }

    SchemaVersionRecord schema(long datasetId) {
        return schemas.get(datasetId);
    }

    void closeSchema(SchemaVersionRecord current) {
        close(current, SCHEMA_VERSION.ID, SCHEMA_VERSION.VALID_TO, schemaCloses);
        schemas.remove(current.getDatasetId());
    }

    int nextVersion(long datasetId) {
        Integer last = lastVersion.get(datasetId);
        int next = last == null ? 1 : last + 1;
        lastVersion.put(datasetId, next);
        return next;
    }

    void insertSchema(SchemaVersionRecord row, List<ColumnDef> columns) {
        schemaInserts.add(row);
        schemaColumns.add(columns);
        schemas.put(row.getDatasetId(), row);
    }

    DatasetPartitionRecord partition(long setId, String uri) {
        return partitions.get(partitionKey(setId, uri));
    }

    void closePartition(DatasetPartitionRecord current) {
        close(current, DATASET_PARTITION.ID, DATASET_PARTITION.VALID_TO, partitionCloses);
        partitions.remove(partitionKey(current.getDatasetId(), current.getUri()));
    }

    void insertPartition(DatasetPartitionRecord row) {
        partitionInserts.add(row);
        partitions.put(partitionKey(row.getDatasetId(), row.getUri()), row);
    }

    /**
     * Ends the current freshness check of a dataset that went away; its last state stays as history.
     * Nothing in a run reads checks, so they are closed by dataset when the run is written.
     */
    void endCheck(long datasetId) {
        checkEnds.add(datasetId);
    }

    private void close(org.jooq.Record row, Field<Long> idField, Field<OffsetDateTime> validTo, List<Long> closes) {
        Long id = row.get(idField);
        if (id == null) {
            // Inserted earlier in this run: it is written already closed.
            row.set(validTo, tx.now);
        } else {
            closes.add(id);
        }
    }

    /** Writes what the run decided and forgets it, so later observations read the store again. */
    void flush() {
        closeAll(stateCloses, DATASET_STATE.ID, DATASET_STATE.VALID_TO, DATASET_STATE);
        closeAll(schemaCloses, SCHEMA_VERSION.ID, SCHEMA_VERSION.VALID_TO, SCHEMA_VERSION);
        closeAll(partitionCloses, DATASET_PARTITION.ID, DATASET_PARTITION.VALID_TO, DATASET_PARTITION);
        for (List<Long> chunk : chunks(checkEnds)) {
            tx.db.update(FRESHNESS_CHECK).set(FRESHNESS_CHECK.VALID_TO, tx.now)
                    .where(in(FRESHNESS_CHECK.DATASET_ID, chunk), FRESHNESS_CHECK.VALID_TO.isNull()).execute();
        }
        checkEnds.clear();
        if (!stateInserts.isEmpty()) {
            RecordBatch.insert(tx.db, stateInserts);
        }
        if (!partitionInserts.isEmpty()) {
            RecordBatch.insert(tx.db, partitionInserts);
        }
        writeSchemas();
        datasets.clear();
        loadedUris.clear();
        createdPending.clear();
        states.clear();
        schemas.clear();
        lastVersion.clear();
        partitions.clear();
        stateInserts.clear();
        schemaInserts.clear();
        schemaColumns.clear();
        partitionInserts.clear();
        active = false;
    }

    private void writeSchemas() {
        if (schemaInserts.isEmpty()) {
            return;
        }
        RecordBatch.insert(tx.db, schemaInserts);
        // The new versions' ids, by their natural key (dataset, version), which is unique.
        Map<String, Long> ids = new HashMap<>();
        List<Long> datasetIds = new ArrayList<>(new HashSet<>(schemaInserts.stream().map(SchemaVersionRecord::getDatasetId).toList()));
        for (List<Long> chunk : chunks(datasetIds)) {
            tx.db.select(SCHEMA_VERSION.ID, SCHEMA_VERSION.DATASET_ID, SCHEMA_VERSION.VERSION).from(SCHEMA_VERSION)
                    .where(in(SCHEMA_VERSION.DATASET_ID, chunk), SCHEMA_VERSION.VALID_FROM.eq(tx.now))
                    .forEach(r -> ids.put(r.value2() + "/" + r.value3(), r.value1()));
        }
        List<SchemaColumnRecord> columns = new ArrayList<>();
        for (int v = 0; v < schemaInserts.size(); v++) {
            SchemaVersionRecord version = schemaInserts.get(v);
            long versionId = ids.get(version.getDatasetId() + "/" + version.getVersion());
            List<ColumnDef> defs = schemaColumns.get(v);
            for (int i = 0; i < defs.size(); i++) {
                SchemaColumnRecord c = tx.db.newRecord(SCHEMA_COLUMN);
                c.setSchemaVersionId(versionId);
                c.setOrdinal(i + 1);
                c.setName(defs.get(i).name());
                c.setDataType(defs.get(i).dataType());
                c.setNullable(defs.get(i).nullable());
                columns.add(c);
            }
        }
        for (List<SchemaColumnRecord> chunk : chunks(columns)) {
            RecordBatch.insert(tx.db, chunk);
        }
    }

    private <R extends org.jooq.TableRecord<R>> void closeAll(List<Long> ids, Field<Long> id,
            Field<OffsetDateTime> validTo, org.jooq.Table<R> table) {
        for (List<Long> chunk : chunks(ids)) {
            tx.db.update(table).set(validTo, tx.now).where(in(id, chunk)).execute();
        }
        ids.clear();
    }

    /**
     * An IN list of literals. With bind values jOOQ wraps each one in a cast on H2, which keeps H2 from
     * using the index (a scan per query, growing with the table); literals are escaped by jOOQ.
     */
    private static <T> org.jooq.Condition in(Field<T> field, List<T> values) {
        return field.in(values.stream().map(DSL::inline).toList());
    }

    private static String partitionKey(long setId, String uri) {
        return setId + " " + uri;
    }

    private static <T> List<List<T>> chunks(List<T> all) {
        List<List<T>> out = new ArrayList<>();
        for (int from = 0; from < all.size(); from += CHUNK) {
            out.add(all.subList(from, Math.min(all.size(), from + CHUNK)));
        }
        return out;
    }
}
