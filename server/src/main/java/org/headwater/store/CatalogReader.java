package org.headwater.store;

import static org.headwater.store.Validity.instant;
import static org.headwater.store.schema.Tables.CHANGE_LOG;
import static org.headwater.store.schema.Tables.COLUMN_LINEAGE;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_NOTE;
import static org.headwater.store.schema.Tables.DATASET_OWNER;
import static org.headwater.store.schema.Tables.DATASET_PARTITION;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.HARVEST;
import static org.headwater.store.schema.Tables.HARVEST_ERROR;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.OWNER;
import static org.headwater.store.schema.Tables.RUN;
import static org.headwater.store.schema.Tables.RUN_IO;
import static org.headwater.store.schema.Tables.SCHEMA_COLUMN;
import static org.headwater.store.schema.Tables.SCHEMA_VERSION;
import static org.headwater.store.schema.Tables.SCRIPT;
import static org.headwater.store.schema.Tables.SCRIPT_ANALYSIS;
import static org.headwater.store.schema.Tables.SCRIPT_REFERENCE;
import static org.headwater.store.schema.Tables.SCRIPT_STATE;
import static org.headwater.store.schema.Tables.SOURCE;

import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.store.Views.DatasetView;
import org.headwater.store.Views.EdgeView;
import org.headwater.store.Views.HarvestErrorView;
import org.headwater.store.Views.HarvestView;
import org.headwater.store.Views.IndexEntry;
import org.headwater.store.Views.FileRole;
import org.headwater.store.Views.KnownFile;
import org.headwater.store.Views.PartitionView;
import org.headwater.store.Views.OwnerView;
import org.headwater.store.Views.SchemaVersionView;
import org.headwater.store.Views.ScriptView;
import org.headwater.store.schema.tables.LineageEdge;
import org.jooq.Condition;
import org.jooq.DSLContext;
import org.jooq.Record;
import org.jooq.impl.DSL;

/** Read-only questions to the store. Every method that takes {@code asOf} answers from history when it is set. */
public final class CatalogReader {
    private static final ObjectMapper JSON = new ObjectMapper();

    private final DSLContext db;

    public CatalogReader(Store store) {
        this.db = store.dsl();
    }

    /** Questions about owners, on the same connection. */
    public OwnerReader owners() {
        return new OwnerReader(db);
    }

    /** The query context, for the other read-side classes of this package. */
    DSLContext db() {
        return db;
    }

    /** Number of datasets present now. */
    public int datasetCount() {
        return db.fetchCount(DATASET_STATE, DATASET_STATE.VALID_TO.isNull());
    }

    /** Datasets present at {@code asOf} (or now), by name, one page at a time. */
    public List<DatasetSummary> datasets(String kind, int offset, int limit, Instant asOf) {
        Condition condition = Validity.at(DATASET_STATE.VALID_FROM, DATASET_STATE.VALID_TO, asOf);
        if (kind != null) {
            condition = condition.and(DATASET.KIND.eq(kind));
        }
        var columnCount = DSL.field(DSL.selectCount().from(SCHEMA_COLUMN).join(SCHEMA_VERSION)
                .on(SCHEMA_COLUMN.SCHEMA_VERSION_ID.eq(SCHEMA_VERSION.ID))
                .where(SCHEMA_VERSION.DATASET_ID.eq(DATASET.ID),
                        Validity.at(SCHEMA_VERSION.VALID_FROM, SCHEMA_VERSION.VALID_TO, asOf)));
        return db.select(DATASET.ID, DATASET.URI, DATASET.NAME, DATASET.KIND, SOURCE.NAME, DATASET_STATE.FORMAT,
                        DATASET_STATE.SIZE_BYTES, DATASET_STATE.MODIFIED_AT, columnCount)
                .from(DATASET)
                .join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID))
                .leftJoin(SOURCE).on(SOURCE.ID.eq(DATASET.SOURCE_ID))
                .where(condition)
                .orderBy(DATASET.NAME, DATASET.ID)
                .offset(offset).limit(limit)
                .fetch(r -> new DatasetSummary(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6(),
                        r.value7(), instant(r.value8()), r.value9(), true));
    }

    /** Total datasets present, for paging. */
    public int datasetTotal(String kind, Instant asOf) {
        Condition condition = Validity.at(DATASET_STATE.VALID_FROM, DATASET_STATE.VALID_TO, asOf);
        if (kind != null) {
            condition = condition.and(DATASET.KIND.eq(kind));
        }
        return db.fetchCount(DSL.select(DATASET.ID).from(DATASET).join(DATASET_STATE)
                .on(DATASET_STATE.DATASET_ID.eq(DATASET.ID)).where(condition));
    }

    /** One dataset as it is now, or as it was at {@code asOf}. */
    public Optional<DatasetView> dataset(long id, Instant asOf) {
        Record identity = db.select(DATASET.ID, DATASET.URI, DATASET.NAME, DATASET.KIND, DATASET.FIRST_SEEN, SOURCE.NAME)
                .from(DATASET).leftJoin(SOURCE).on(SOURCE.ID.eq(DATASET.SOURCE_ID))
                .where(DATASET.ID.eq(id)).fetchOne();
        if (identity == null) {
            return Optional.empty();
        }
        var state = db.selectFrom(DATASET_STATE)
                .where(DATASET_STATE.DATASET_ID.eq(id), Validity.at(DATASET_STATE.VALID_FROM, DATASET_STATE.VALID_TO, asOf))
                .fetchOne();
        var note = db.selectFrom(DATASET_NOTE)
                .where(DATASET_NOTE.DATASET_ID.eq(id), Validity.at(DATASET_NOTE.VALID_FROM, DATASET_NOTE.VALID_TO, asOf))
                .fetchOne();
        var schema = db.selectFrom(SCHEMA_VERSION)
                .where(SCHEMA_VERSION.DATASET_ID.eq(id), Validity.at(SCHEMA_VERSION.VALID_FROM, SCHEMA_VERSION.VALID_TO, asOf))
                .fetchOne();
        List<ColumnView> columns = schema == null ? List.of() : columnsOf(schema.getId());
        List<OwnerView> owners = new OwnerReader(db).ownersOf(id, asOf);
        return Optional.of(new DatasetView(
                id, identity.get(DATASET.URI), identity.get(DATASET.NAME), identity.get(DATASET.KIND),
                identity.get(SOURCE.NAME), state != null, instant(identity.get(DATASET.FIRST_SEEN)),
                state == null ? null : state.getFormat(),
                state == null ? null : state.getSizeBytes(),
                state == null ? null : instant(state.getModifiedAt()),
                state == null ? null : state.getContentHash(),
                state == null ? null : state.getRowCount(),
                state != null && state.getRowCountExact(),
                state == null ? null : state.getDetails(),
                state == null ? null : state.getError(),
                note == null ? null : note.getDescription(),
                note == null ? List.of() : parseTags(note.getTags()),
                owners,
                schema == null ? null : schema.getVersion(),
                columns,
                partitions(id, asOf),
                edges(id, true, asOf, null),
                edges(id, false, asOf, null)));
    }

    /**
     * One dataset with only what its lineage needs (identity, columns, links; every other fact left empty),
     * for the web UI's lineage view, which reads hundreds at once. {@code recentRuns} is shared across
     * those calls so that each script's latest runs are read once, not once per link.
     */
    public Optional<DatasetView> lineageView(long id, Instant asOf, Map<Long, List<String>> recentRuns) {
        Record identity = db.select(DATASET.NAME, DATASET.KIND).from(DATASET).where(DATASET.ID.eq(id)).fetchOne();
        if (identity == null) {
            return Optional.empty();
        }
        var schema = db.selectFrom(SCHEMA_VERSION)
                .where(SCHEMA_VERSION.DATASET_ID.eq(id), Validity.at(SCHEMA_VERSION.VALID_FROM, SCHEMA_VERSION.VALID_TO, asOf))
                .fetchOne();
        return Optional.of(new DatasetView(id, null, identity.get(DATASET.NAME), identity.get(DATASET.KIND), null, true, null,
                null, null, null, null, null, false, null, null, null, List.of(), List.of(),
                schema == null ? null : schema.getVersion(), schema == null ? List.of() : columnsOf(schema.getId()), List.of(),
                edges(id, true, asOf, recentRuns), edges(id, false, asOf, recentRuns)));
    }

    /** The member files of a partitioned set, by name. */
    public List<PartitionView> partitions(long datasetId, Instant asOf) {
        // The members of a set mostly share one column list: each distinct text is parsed once.
        Map<String, List<ColumnView>> parsed = new HashMap<>();
        return db.selectFrom(DATASET_PARTITION)
                .where(DATASET_PARTITION.DATASET_ID.eq(datasetId),
                        Validity.at(DATASET_PARTITION.VALID_FROM, DATASET_PARTITION.VALID_TO, asOf))
                .orderBy(DATASET_PARTITION.NAME)
                .fetch(p -> new PartitionView(p.getName(), p.getUri(), p.getPartitionKeys(), p.getSizeBytes(),
                        instant(p.getModifiedAt()), p.getContentHash(), p.getRowCount(), p.getRowCountExact(),
                        parsed.computeIfAbsent(p.getColumnsJson(), CatalogReader::parseColumns),
                        p.getError()));
    }

    private static List<ColumnView> parseColumns(String json) {
        if (json == null) {
            return List.of();
        }
        try {
            List<ColumnView> columns = new ArrayList<>();
            int ordinal = 1;
            for (var c : JSON.readTree(json)) {
                columns.add(new ColumnView(ordinal++, c.get("name").asText(), c.get("dataType").asText(),
                        c.get("nullable").asBoolean()));
            }
            return List.copyOf(columns);
        } catch (IOException e) {
            throw new StoreException("A stored partition column list is not valid JSON", e);
        }
    }

    /** Every schema version a dataset has had, oldest first, each with its drift from the one before. */
    public List<SchemaVersionView> schemaHistory(long datasetId) {
        List<SchemaVersionView> history = new ArrayList<>();
        List<ColumnView> previous = List.of();
        for (var v : db.selectFrom(SCHEMA_VERSION).where(SCHEMA_VERSION.DATASET_ID.eq(datasetId))
                .orderBy(SCHEMA_VERSION.VERSION).fetch()) {
            List<ColumnView> columns = columnsOf(v.getId());
            history.add(new SchemaVersionView(v.getVersion(), instant(v.getValidFrom()), instant(v.getValidTo()), columns,
                    Views.Drift.between(previous, columns), v.getTableVersion(), instant(v.getRecordedAt()),
                    v.getOperation(), v.getPartitionColumns() == null ? null : parseTags(v.getPartitionColumns())));
            previous = columns;
        }
        return history;
    }

    private List<ColumnView> columnsOf(long schemaVersionId) {
        return db.selectFrom(SCHEMA_COLUMN).where(SCHEMA_COLUMN.SCHEMA_VERSION_ID.eq(schemaVersionId))
                .orderBy(SCHEMA_COLUMN.ORDINAL)
                .fetch(c -> new ColumnView(c.getOrdinal(), c.getName(), c.getDataType(), c.getNullable()));
    }

    private List<EdgeView> edges(long datasetId, boolean upstream, Instant asOf, Map<Long, List<String>> recentRuns) {
        LineageEdge e = LINEAGE_EDGE;
        var here = upstream ? e.TARGET_DATASET_ID : e.SOURCE_DATASET_ID;
        var there = upstream ? e.SOURCE_DATASET_ID : e.TARGET_DATASET_ID;
        return db.select(e.ID, there, DATASET.NAME, SCRIPT.NAME, e.EVIDENCE, e.CONFIDENCE, e.SOURCE_DATASET_ID,
                        e.TARGET_DATASET_ID, e.SCRIPT_ID)
                .from(e)
                .join(DATASET).on(DATASET.ID.eq(there))
                .leftJoin(SCRIPT).on(SCRIPT.ID.eq(e.SCRIPT_ID))
                .where(here.eq(datasetId), Validity.at(e.VALID_FROM, e.VALID_TO, asOf))
                .orderBy(DATASET.NAME, e.ID)
                .fetch(r -> {
                    Corroboration c = corroborate(r.value7(), r.value8(), r.value9(), r.value5(), r.value6(), asOf, recentRuns);
                    return new EdgeView(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6(),
                            c.word(), c.confidence());
                });
    }

    /** How many of a script's latest runs count when asking whether a flow found in its code still happens. */
    static final int RECENT_RUNS = 5;

    private record Corroboration(String word, double confidence) {
    }

    /**
     * Merges the evidence of the code and of the runs for one edge (see {@link EdgeView}). A flow found in
     * the code counts as seen at run time only when one of the script's {@value #RECENT_RUNS} latest runs
     * read its source and wrote its target.
     */
    private Corroboration corroborate(long source, long target, Long script, String evidence, double confidence,
            Instant asOf, Map<Long, List<String>> recentRuns) {
        if (script == null || (!evidence.equals("static") && !evidence.equals("runtime"))) {
            return new Corroboration(evidence, confidence);
        }
        if (evidence.equals("runtime")) {
            Double staticTwin = twin(source, target, script, "static", asOf);
            return staticTwin == null ? new Corroboration("runtime only", confidence)
                    : new Corroboration("static and runtime", 1 - (1 - confidence) * (1 - staticTwin));
        }
        List<String> recent = recentRuns == null ? recentRuns(script)
                : recentRuns.computeIfAbsent(script, this::recentRuns);
        if (recent.isEmpty()) {
            return new Corroboration("static only", confidence);
        }
        var read = RUN_IO.as("read_io");
        var wrote = RUN_IO.as("write_io");
        boolean seen = db.fetchExists(DSL.selectOne().from(read).join(wrote).on(wrote.RUN_ID.eq(read.RUN_ID))
                .where(read.RUN_ID.in(recent), read.DIRECTION.eq("read"), read.DATASET_ID.eq(source),
                        wrote.DIRECTION.in("write", "rename_to"), wrote.DATASET_ID.eq(target)));
        if (!seen) {
            return new Corroboration("static, not seen in recent runs", confidence);
        }
        Double runtimeTwin = twin(source, target, script, "runtime", asOf);
        double other = runtimeTwin == null ? 1.0 : runtimeTwin;
        return new Corroboration("static and runtime", 1 - (1 - confidence) * (1 - other));
    }

    private List<String> recentRuns(long script) {
        return db.select(RUN.ID).from(RUN).where(RUN.SCRIPT_ID.eq(script))
                .orderBy(RUN.STARTED_AT.desc()).limit(RECENT_RUNS).fetch(RUN.ID);
    }

    private Double twin(long source, long target, long script, String evidence, Instant asOf) {
        return db.select(LINEAGE_EDGE.CONFIDENCE).from(LINEAGE_EDGE)
                .where(LINEAGE_EDGE.SOURCE_DATASET_ID.eq(source), LINEAGE_EDGE.TARGET_DATASET_ID.eq(target),
                        LINEAGE_EDGE.SCRIPT_ID.eq(script), LINEAGE_EDGE.EVIDENCE.eq(evidence),
                        Validity.at(LINEAGE_EDGE.VALID_FROM, LINEAGE_EDGE.VALID_TO, asOf))
                .limit(1).fetchOne(LINEAGE_EDGE.CONFIDENCE);
    }

    /** Runs of one script, newest first. */
    public List<Views.RunSummary> runsOfScript(long scriptId, int limit) {
        return runs(RUN.SCRIPT_ID.eq(scriptId), limit);
    }

    /** Runs that read or wrote one dataset, newest first. */
    public List<Views.RunSummary> runsOfDataset(long datasetId, int limit) {
        return runs(RUN.ID.in(DSL.select(RUN_IO.RUN_ID).from(RUN_IO).where(RUN_IO.DATASET_ID.eq(datasetId))), limit);
    }

    /**
     * Datasets a person may mean by {@code key}: an exact URI, an exact name, a path on this machine, or
     * (when nothing matches exactly) a unique end of a name. Datasets present now come first.
     */
    public List<DatasetSummary> findDatasets(String key) {
        List<Long> ids = db.select(DATASET.ID).from(DATASET).where(DATASET.URI.eq(key).or(DATASET.NAME.eq(key))).fetch(DATASET.ID);
        if (ids.isEmpty()) {
            String asPath = pathUri(key);
            if (asPath != null) {
                ids = db.select(DATASET.ID).from(DATASET).where(DATASET.URI.eq(asPath)).fetch(DATASET.ID);
            }
        }
        if (ids.isEmpty()) {
            String suffix = key.startsWith("/") ? key : "/" + key;
            ids = db.select(DATASET.ID).from(DATASET)
                    .where(DATASET.NAME.endsWith(suffix).or(DATASET.URI.endsWith(suffix)))
                    .limit(50).fetch(DATASET.ID);
        }
        return summaries(ids);
    }

    private static String pathUri(String key) {
        try {
            return Path.of(key).toAbsolutePath().normalize().toUri().toString();
        } catch (RuntimeException e) {
            return null;
        }
    }

    private List<DatasetSummary> summaries(Collection<Long> ids) {
        if (ids.isEmpty()) {
            return List.of();
        }
        var columnCount = DSL.field(DSL.selectCount().from(SCHEMA_COLUMN).join(SCHEMA_VERSION)
                .on(SCHEMA_COLUMN.SCHEMA_VERSION_ID.eq(SCHEMA_VERSION.ID))
                .where(SCHEMA_VERSION.DATASET_ID.eq(DATASET.ID), SCHEMA_VERSION.VALID_TO.isNull()));
        return db.select(DATASET.ID, DATASET.URI, DATASET.NAME, DATASET.KIND, SOURCE.NAME, DATASET_STATE.FORMAT,
                        DATASET_STATE.SIZE_BYTES, DATASET_STATE.MODIFIED_AT, columnCount, DATASET_STATE.ID)
                .from(DATASET)
                .leftJoin(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID), DATASET_STATE.VALID_TO.isNull())
                .leftJoin(SOURCE).on(SOURCE.ID.eq(DATASET.SOURCE_ID))
                .where(DATASET.ID.in(ids))
                .orderBy(DATASET_STATE.ID.isNull(), DATASET.NAME)
                .fetch(r -> new DatasetSummary(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6(),
                        r.value7(), instant(r.value8()), r.value9(), r.value10() != null));
    }

    /**
     * The other datasets holding the same bytes as {@code id} (equal SHA-256), now or at {@code asOf}: copies
     * and renamed files. The one seen first comes first; it is the likely original.
     */
    public List<DatasetSummary> copiesOf(long id, Instant asOf) {
        var state = Validity.at(DATASET_STATE.VALID_FROM, DATASET_STATE.VALID_TO, asOf);
        String hash = db.select(DATASET_STATE.CONTENT_HASH).from(DATASET_STATE)
                .where(DATASET_STATE.DATASET_ID.eq(id), state).fetchOne(DATASET_STATE.CONTENT_HASH);
        if (hash == null) {
            return List.of();
        }
        List<Long> ids = db.select(DATASET.ID).from(DATASET_STATE).join(DATASET).on(DATASET.ID.eq(DATASET_STATE.DATASET_ID))
                .where(DATASET_STATE.CONTENT_HASH.eq(hash), state, DATASET.ID.ne(id))
                .orderBy(DATASET.FIRST_SEEN, DATASET.ID).limit(200).fetch(DATASET.ID);
        Map<Long, DatasetSummary> byId = new HashMap<>();
        summaries(ids).forEach(d -> byId.put(d.id(), d));
        List<DatasetSummary> out = new ArrayList<>();
        ids.forEach(i -> {
            if (byId.containsKey(i)) {
                out.add(byId.get(i));
            }
        });
        return out;
    }

    /** Scripts present now, by name. */
    public List<ScriptView> scripts(int offset, int limit) {
        return scriptQuery(SCRIPT_STATE.VALID_TO.isNull(), offset, limit);
    }

    public Optional<ScriptView> script(long id) {
        return scriptQuery(SCRIPT.ID.eq(id), 0, 1).stream().findFirst();
    }

    private List<ScriptView> scriptQuery(Condition condition, int offset, int limit) {
        return db.select(SCRIPT.ID, SCRIPT.URI, SCRIPT.NAME, SCRIPT.LANGUAGE, SOURCE.NAME, SCRIPT_STATE.ID,
                        SCRIPT_STATE.SIZE_BYTES, SCRIPT_STATE.MODIFIED_AT, SCRIPT_STATE.CONTENT_HASH, SCRIPT_STATE.GIT_COMMIT,
                        SCRIPT_STATE.GIT_AUTHOR, SCRIPT_STATE.GIT_COMMITTED_AT, SCRIPT_STATE.GIT_AUTHORS)
                .from(SCRIPT)
                .leftJoin(SCRIPT_STATE).on(SCRIPT_STATE.SCRIPT_ID.eq(SCRIPT.ID), SCRIPT_STATE.VALID_TO.isNull())
                .leftJoin(SOURCE).on(SOURCE.ID.eq(SCRIPT.SOURCE_ID))
                .where(condition)
                .orderBy(SCRIPT.NAME, SCRIPT.ID)
                .offset(offset).limit(limit)
                .fetch(r -> new ScriptView(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6() != null,
                        r.value7(), instant(r.value8()), r.value9(), r.value10(), r.value11(), instant(r.value12()),
                        r.value13()));
    }

    public int scriptCount() {
        return db.fetchCount(SCRIPT_STATE, SCRIPT_STATE.VALID_TO.isNull());
    }

    /** Files of one source that are present now, keyed by URI, for incremental harvest. */
    public Map<String, KnownFile> knownFiles(long sourceId) {
        Map<String, KnownFile> known = new HashMap<>();
        // Only files and objects (s3: on AWS, the object's http(s) address on another store): tables and views
        // that scripts define belong to the source but are no files of it.
        db.select(DATASET.URI, DATASET_STATE.SIZE_BYTES, DATASET_STATE.MODIFIED_AT, DATASET_STATE.CONTENT_HASH)
                .from(DATASET).join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID))
                .where(DATASET.SOURCE_ID.eq(sourceId), DATASET_STATE.VALID_TO.isNull(),
                        DATASET.URI.startsWith("file:").or(DATASET.URI.startsWith("s3:"))
                                .or(DATASET.URI.startsWith("http:")).or(DATASET.URI.startsWith("https:")))
                .forEach(r -> known.put(r.value1(), new KnownFile(r.value1(), r.value2(), instant(r.value3()),
                        FileRole.DATASET, null, r.value4())));
        db.select(SCRIPT.URI, SCRIPT_STATE.SIZE_BYTES, SCRIPT_STATE.MODIFIED_AT, SCRIPT_STATE.CONTENT_HASH)
                .from(SCRIPT).join(SCRIPT_STATE).on(SCRIPT_STATE.SCRIPT_ID.eq(SCRIPT.ID))
                .where(SCRIPT.SOURCE_ID.eq(sourceId), SCRIPT_STATE.VALID_TO.isNull())
                .forEach(r -> known.put(r.value1(), new KnownFile(r.value1(), r.value2(), instant(r.value3()),
                        FileRole.SCRIPT, null, r.value4())));
        db.select(DATASET_PARTITION.URI, DATASET_PARTITION.SIZE_BYTES, DATASET_PARTITION.MODIFIED_AT, DATASET.URI,
                        DATASET_PARTITION.CONTENT_HASH)
                .from(DATASET_PARTITION).join(DATASET).on(DATASET.ID.eq(DATASET_PARTITION.DATASET_ID))
                .where(DATASET.SOURCE_ID.eq(sourceId), DATASET_PARTITION.VALID_TO.isNull())
                .forEach(r -> known.put(r.value1(), new KnownFile(r.value1(), r.value2(), instant(r.value3()),
                        FileRole.PARTITION, r.value4(), r.value5())));
        return known;
    }

    /**
     * The names a script may use for this source's files: every present dataset's workspace-relative name,
     * and every partition's name, each with the URI of the dataset it belongs to (a partition's set).
     */
    public Map<String, String> namesOfSource(long sourceId) {
        Map<String, String> names = new HashMap<>();
        db.select(DATASET.NAME, DATASET.URI).from(DATASET).join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID))
                .where(DATASET.SOURCE_ID.eq(sourceId), DATASET_STATE.VALID_TO.isNull())
                .forEach(r -> names.put(r.value1(), r.value2()));
        db.select(DATASET_PARTITION.NAME, DATASET.URI).from(DATASET_PARTITION).join(DATASET)
                .on(DATASET.ID.eq(DATASET_PARTITION.DATASET_ID))
                .where(DATASET.SOURCE_ID.eq(sourceId), DATASET_PARTITION.VALID_TO.isNull())
                .forEach(r -> names.put(r.value1(), r.value2()));
        return names;
    }

    /** A current lineage edge found by static analysis, by the URIs of its ends and its script. */
    public record StaticEdge(String sourceUri, String targetUri, String scriptUri) {
    }

    /** The current static edges of the scripts of one source. */
    public List<StaticEdge> staticEdges(long sourceId) {
        var source = DATASET.as("s");
        var target = DATASET.as("t");
        return db.select(source.URI, target.URI, SCRIPT.URI).from(LINEAGE_EDGE)
                .join(source).on(source.ID.eq(LINEAGE_EDGE.SOURCE_DATASET_ID))
                .join(target).on(target.ID.eq(LINEAGE_EDGE.TARGET_DATASET_ID))
                .join(SCRIPT).on(SCRIPT.ID.eq(LINEAGE_EDGE.SCRIPT_ID))
                .where(SCRIPT.SOURCE_ID.eq(sourceId), LINEAGE_EDGE.EVIDENCE.eq("static"), LINEAGE_EDGE.VALID_TO.isNull())
                .fetch(r -> new StaticEdge(r.value1(), r.value2(), r.value3()));
    }

    /** Search-index entries for datasets present now; absent ids are simply not returned. */
    public List<IndexEntry> datasetEntries(Collection<Long> ids) {
        if (ids.isEmpty()) {
            return List.of();
        }
        Map<Long, List<String>> columns = new HashMap<>();
        db.select(SCHEMA_VERSION.DATASET_ID, SCHEMA_COLUMN.NAME)
                .from(SCHEMA_COLUMN).join(SCHEMA_VERSION).on(SCHEMA_COLUMN.SCHEMA_VERSION_ID.eq(SCHEMA_VERSION.ID))
                .where(SCHEMA_VERSION.DATASET_ID.in(ids), SCHEMA_VERSION.VALID_TO.isNull())
                .orderBy(SCHEMA_VERSION.DATASET_ID, SCHEMA_COLUMN.ORDINAL)
                .forEach(r -> columns.computeIfAbsent(r.value1(), k -> new ArrayList<>()).add(r.value2()));
        return datasetEntries(ids, columns);
    }

    /** As {@link #datasetEntries(Collection)}, with the current column names already read by the caller. */
    List<IndexEntry> datasetEntries(Collection<Long> ids, Map<Long, List<String>> columns) {
        if (ids.isEmpty()) {
            return List.of();
        }
        Map<Long, List<String>> owners = new HashMap<>();
        db.select(DATASET_OWNER.DATASET_ID, OWNER.NAME)
                .from(DATASET_OWNER).join(OWNER).on(OWNER.ID.eq(DATASET_OWNER.OWNER_ID))
                .where(DATASET_OWNER.DATASET_ID.in(ids), DATASET_OWNER.VALID_TO.isNull())
                .forEach(r -> owners.computeIfAbsent(r.value1(), k -> new ArrayList<>()).add(r.value2()));
        Map<Long, IndexEntry> entries = new LinkedHashMap<>();
        db.select(DATASET.ID, DATASET.URI, DATASET.NAME, DATASET.KIND, DATASET_STATE.FORMAT, SOURCE.NAME,
                        DATASET_NOTE.DESCRIPTION, DATASET_NOTE.TAGS)
                .from(DATASET)
                .join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID), DATASET_STATE.VALID_TO.isNull())
                .leftJoin(SOURCE).on(SOURCE.ID.eq(DATASET.SOURCE_ID))
                .leftJoin(DATASET_NOTE).on(DATASET_NOTE.DATASET_ID.eq(DATASET.ID), DATASET_NOTE.VALID_TO.isNull())
                .where(DATASET.ID.in(ids))
                .forEach(r -> entries.put(r.value1(), new IndexEntry(r.value4(), r.value1(), r.value2(), r.value3(),
                        r.value5(), r.value6(), columns.getOrDefault(r.value1(), List.of()), r.value7(),
                        r.value8() == null ? List.of() : parseTags(r.value8()), owners.getOrDefault(r.value1(), List.of()))));
        return List.copyOf(entries.values());
    }

    /** Search-index entries for scripts present now. */
    public List<IndexEntry> scriptEntries(Collection<Long> ids) {
        if (ids.isEmpty()) {
            return List.of();
        }
        return db.select(SCRIPT.ID, SCRIPT.URI, SCRIPT.NAME, SCRIPT.LANGUAGE, SOURCE.NAME)
                .from(SCRIPT)
                .join(SCRIPT_STATE).on(SCRIPT_STATE.SCRIPT_ID.eq(SCRIPT.ID), SCRIPT_STATE.VALID_TO.isNull())
                .leftJoin(SOURCE).on(SOURCE.ID.eq(SCRIPT.SOURCE_ID))
                .where(SCRIPT.ID.in(ids))
                .fetch(r -> new IndexEntry("script", r.value1(), r.value2(), r.value3(), r.value4(), r.value5(),
                        List.of(), null, List.of(), List.of()));
    }

    /** Ids of every dataset present now, for a full index rebuild. */
    public List<Long> presentDatasetIds() {
        return db.select(DATASET_STATE.DATASET_ID).from(DATASET_STATE).where(DATASET_STATE.VALID_TO.isNull())
                .orderBy(DATASET_STATE.DATASET_ID).fetch(DATASET_STATE.DATASET_ID);
    }

    public List<Long> presentScriptIds() {
        return db.select(SCRIPT_STATE.SCRIPT_ID).from(SCRIPT_STATE).where(SCRIPT_STATE.VALID_TO.isNull())
                .orderBy(SCRIPT_STATE.SCRIPT_ID).fetch(SCRIPT_STATE.SCRIPT_ID);
    }

    /** The newest change-log sequence number, 0 for an empty catalog. */
    public long lastChangeSeq() {
        Long seq = db.select(DSL.max(CHANGE_LOG.SEQ)).from(CHANGE_LOG).fetchOne(0, Long.class);
        return seq == null ? 0 : seq;
    }

    /** Number of change-log rows; history tests use it to prove that nothing was rewritten. */
    public int changeLogSize() {
        return db.fetchCount(CHANGE_LOG);
    }

    /** Entities changed after {@code seq}: (entity, id) pairs, oldest first, without repeats. */
    public List<Map.Entry<String, Long>> changedSince(long seq) {
        return db.selectDistinct(CHANGE_LOG.ENTITY, CHANGE_LOG.ENTITY_ID).from(CHANGE_LOG)
                .where(CHANGE_LOG.SEQ.gt(seq))
                .fetch(r -> Map.entry(r.value1(), r.value2()));
    }

    /** Column flows into a dataset from its current lineage edges, by target column. */
    public List<Views.ColumnFlowView> columnFlowsInto(long datasetId) {
        var source = DATASET.as("source_dataset");
        return db.select(source.NAME, COLUMN_LINEAGE.SOURCE_COLUMN, COLUMN_LINEAGE.TARGET_COLUMN, COLUMN_LINEAGE.ROLE,
                        LINEAGE_EDGE.EVIDENCE, SCRIPT.NAME)
                .from(COLUMN_LINEAGE)
                .join(LINEAGE_EDGE).on(LINEAGE_EDGE.ID.eq(COLUMN_LINEAGE.EDGE_ID))
                .join(source).on(source.ID.eq(LINEAGE_EDGE.SOURCE_DATASET_ID))
                .leftJoin(SCRIPT).on(SCRIPT.ID.eq(LINEAGE_EDGE.SCRIPT_ID))
                .where(LINEAGE_EDGE.TARGET_DATASET_ID.eq(datasetId), LINEAGE_EDGE.VALID_TO.isNull())
                .orderBy(COLUMN_LINEAGE.TARGET_COLUMN, source.NAME, COLUMN_LINEAGE.SOURCE_COLUMN)
                .fetch(r -> new Views.ColumnFlowView(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6()));
    }

    /** What the current analysis of a script found it reads and writes, in code order. */
    public List<Views.ReferenceView> references(long scriptId) {
        return db.select(SCRIPT_REFERENCE.DIRECTION, SCRIPT_REFERENCE.PATTERN, SCRIPT_REFERENCE.RESOLVED, DATASET.NAME,
                        SCRIPT_REFERENCE.FUNCTION_NAME, SCRIPT_REFERENCE.EXPRESSION, SCRIPT_REFERENCE.LINE_NO,
                        SCRIPT_REFERENCE.COLUMN_NO, SCRIPT_REFERENCE.CELL, SCRIPT_REFERENCE.CONFIDENCE)
                .from(SCRIPT_REFERENCE)
                .join(SCRIPT_ANALYSIS).on(SCRIPT_ANALYSIS.ID.eq(SCRIPT_REFERENCE.ANALYSIS_ID))
                .leftJoin(DATASET).on(DATASET.ID.eq(SCRIPT_REFERENCE.DATASET_ID))
                .where(SCRIPT_ANALYSIS.SCRIPT_ID.eq(scriptId), SCRIPT_ANALYSIS.VALID_TO.isNull())
                .orderBy(SCRIPT_REFERENCE.CELL.nullsFirst(), SCRIPT_REFERENCE.LINE_NO, SCRIPT_REFERENCE.COLUMN_NO)
                .fetch(r -> new Views.ReferenceView(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6(),
                        r.value7(), r.value8(), r.value9(), r.value10()));
    }

    /** Scripts a person may mean by {@code key}: exact URI or name, a path, or a unique end of a name. */
    public List<ScriptView> findScripts(String key) {
        String asPath = pathUri(key);
        String suffix = key.startsWith("/") ? key : "/" + key;
        List<ScriptView> exact = scriptQuery(SCRIPT.URI.eq(key).or(SCRIPT.NAME.eq(key))
                .or(asPath == null ? DSL.falseCondition() : SCRIPT.URI.eq(asPath)), 0, 50);
        return !exact.isEmpty() ? exact : scriptQuery(SCRIPT.NAME.endsWith(suffix).or(SCRIPT.URI.endsWith(suffix)), 0, 50);
    }

    /** Recent runs, newest first. */
    public List<Views.RunSummary> runs(int limit) {
        return runs(DSL.trueCondition(), limit);
    }

    private List<Views.RunSummary> runs(Condition condition, int limit) {
        var reads = DSL.field(DSL.selectCount().from(RUN_IO).where(RUN_IO.RUN_ID.eq(RUN.ID), RUN_IO.DIRECTION.eq("read")));
        var writes = DSL.field(DSL.selectCount().from(RUN_IO).where(RUN_IO.RUN_ID.eq(RUN.ID), RUN_IO.DIRECTION.eq("write")));
        return db.select(RUN.ID, SCRIPT.NAME, RUN.SCRIPT_URI, RUN.STARTED_AT, RUN.ENDED_AT, RUN.EXIT_CODE, RUN.EXCEPTION,
                        RUN.USER_NAME, RUN.HOST, RUN.GIT_COMMIT, reads, writes)
                .from(RUN).leftJoin(SCRIPT).on(SCRIPT.ID.eq(RUN.SCRIPT_ID))
                .where(condition)
                .orderBy(RUN.STARTED_AT.desc()).limit(limit)
                .fetch(r -> new Views.RunSummary(r.value1(), r.value2() != null ? r.value2() : r.value3(),
                        instant(r.value4()), instant(r.value5()), r.value6(), r.value7(), r.value8(), r.value9(),
                        r.value10(), r.value11(), r.value12()));
    }

    /** Recent harvests, newest first. */
    public List<HarvestView> harvests(int limit) {
        return db.select(HARVEST.asterisk(), SOURCE.NAME).from(HARVEST).join(SOURCE).on(SOURCE.ID.eq(HARVEST.SOURCE_ID))
                .orderBy(HARVEST.ID.desc()).limit(limit)
                .fetch(r -> harvestView(r, false));
    }

    public Optional<HarvestView> harvest(long id) {
        return db.select(HARVEST.asterisk(), SOURCE.NAME).from(HARVEST).join(SOURCE).on(SOURCE.ID.eq(HARVEST.SOURCE_ID))
                .where(HARVEST.ID.eq(id))
                .fetchOptional(r -> harvestView(r, true));
    }

    private HarvestView harvestView(Record r, boolean withErrors) {
        long id = r.get(HARVEST.ID);
        List<HarvestErrorView> errors = !withErrors ? List.of() : db.selectFrom(HARVEST_ERROR)
                .where(HARVEST_ERROR.HARVEST_ID.eq(id)).orderBy(HARVEST_ERROR.ID).limit(1000)
                .fetch(e -> new HarvestErrorView(e.getUri(), e.getKind(), e.getMessage()));
        return new HarvestView(id, r.get(HARVEST.RUN_AS) != null ? r.get(HARVEST.RUN_AS) : r.get(SOURCE.NAME), instant(r.get(HARVEST.STARTED_AT)), instant(r.get(HARVEST.FINISHED_AT)),
                r.get(HARVEST.STATUS), r.get(HARVEST.FILES_SEEN), r.get(HARVEST.FILES_UNCHANGED), r.get(HARVEST.FILES_IGNORED), r.get(HARVEST.DATASETS_SEEN),
                r.get(HARVEST.SCRIPTS_SEEN), r.get(HARVEST.CHANGES), r.get(HARVEST.REMOVED), r.get(HARVEST.ERRORS), errors);
    }

    private static List<String> parseTags(String json) {
        try {
            return JSON.readValue(json, new TypeReference<List<String>>() { });
        } catch (IOException e) {
            throw new StoreException("A stored tag list is not valid JSON: " + json, e);
        }
    }
    /** The registered name of a source. */
    public String sourceName(long sourceId) {
        return db.select(SOURCE.NAME).from(SOURCE).where(SOURCE.ID.eq(sourceId)).fetchOne(SOURCE.NAME);
    }

    /** A dataset's current description note: who wrote it, and its tags. */
    public record CurrentNote(String description, List<String> tags, String author) {
    }

    /** The current notes of one source's datasets, by dataset URI. */
    public Map<String, CurrentNote> notesOfSource(long sourceId) {
        Map<String, CurrentNote> notes = new HashMap<>();
        db.select(DATASET.URI, DATASET_NOTE.DESCRIPTION, DATASET_NOTE.TAGS, DATASET_NOTE.AUTHOR)
                .from(DATASET_NOTE).join(DATASET).on(DATASET.ID.eq(DATASET_NOTE.DATASET_ID))
                .where(DATASET.SOURCE_ID.eq(sourceId), DATASET_NOTE.VALID_TO.isNull())
                .forEach(r -> notes.put(r.value1(), new CurrentNote(r.value2(), parseTags(r.value3()), r.value4())));
        return notes;
    }

    /** Current static edges without a script (such as those of database views) into one source's datasets. */
    public List<StaticEdge> scriptlessEdgesInto(long sourceId) {
        var source = DATASET.as("s");
        var target = DATASET.as("t");
        return db.select(source.URI, target.URI).from(LINEAGE_EDGE)
                .join(source).on(source.ID.eq(LINEAGE_EDGE.SOURCE_DATASET_ID))
                .join(target).on(target.ID.eq(LINEAGE_EDGE.TARGET_DATASET_ID))
                .where(target.SOURCE_ID.eq(sourceId), LINEAGE_EDGE.SCRIPT_ID.isNull(), LINEAGE_EDGE.EVIDENCE.eq("static"),
                        LINEAGE_EDGE.VALID_TO.isNull())
                .fetch(r -> new StaticEdge(r.value1(), r.value2(), null));
    }
}
