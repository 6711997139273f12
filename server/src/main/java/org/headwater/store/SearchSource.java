package org.headwater.store;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_OWNER;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.OWNER;
import static org.headwater.store.schema.Tables.RUN_IO;
import static org.headwater.store.schema.Tables.SCHEMA_COLUMN;
import static org.headwater.store.schema.Tables.SCHEMA_VERSION;
import static org.headwater.store.schema.Tables.SCRIPT;
import static org.headwater.store.schema.Tables.SCRIPT_ANALYSIS;
import static org.headwater.store.schema.Tables.SCRIPT_REFERENCE;
import static org.headwater.store.schema.Tables.SCRIPT_STATE;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.IndexEntry;
import org.jooq.DSLContext;

/** What the search index reads from the store: documents, the ends of changed edges, use counts and the dataset graph. */
public final class SearchSource {
    private static final ObjectMapper JSON = new ObjectMapper();

    private final CatalogReader reader;
    private final DSLContext db;

    public SearchSource(CatalogReader reader) {
        this.reader = reader;
        this.db = reader.db();
    }

    public CatalogReader reader() {
        return reader;
    }

    /** A present dataset as the index sees it. */
    public record DatasetDoc(IndexEntry entry, List<ColumnView> columns, List<String> titles, List<String> readBy,
            List<String> writtenBy) {
    }

    /** A present script with the datasets its current analysis reads and writes. */
    public record ScriptDoc(IndexEntry entry, List<String> reads, List<String> writes) {
    }

    /** A person or team with the datasets they own now. */
    public record OwnerDoc(long id, String name, String kind, List<String> datasets) {
    }

    /** Documents for the present datasets among {@code ids}; absent ids are not returned. */
    public List<DatasetDoc> datasets(Collection<Long> ids) {
        if (ids.isEmpty()) {
            return List.of();
        }
        Set<Long> wanted = ids instanceof Set<Long> set ? set : new HashSet<>(ids);
        Map<Long, List<ColumnView>> columns = new HashMap<>();
        db.select(SCHEMA_VERSION.DATASET_ID, SCHEMA_COLUMN.ORDINAL, SCHEMA_COLUMN.NAME, SCHEMA_COLUMN.DATA_TYPE,
                        SCHEMA_COLUMN.NULLABLE)
                .from(SCHEMA_COLUMN).join(SCHEMA_VERSION).on(SCHEMA_COLUMN.SCHEMA_VERSION_ID.eq(SCHEMA_VERSION.ID))
                .where(among(SCHEMA_VERSION.DATASET_ID, wanted), SCHEMA_VERSION.VALID_TO.isNull())
                .orderBy(SCHEMA_VERSION.DATASET_ID, SCHEMA_COLUMN.ORDINAL)
                .forEach(r -> {
                    if (wanted.contains(r.value1())) {
                        columns.computeIfAbsent(r.value1(), k -> new ArrayList<>())
                                .add(new ColumnView(r.value2(), r.value3(), r.value4(), r.value5()));
                    }
                });
        Map<Long, List<String>> titles = new HashMap<>();
        db.select(DATASET_STATE.DATASET_ID, DATASET_STATE.DETAILS).from(DATASET_STATE)
                .where(among(DATASET_STATE.DATASET_ID, wanted), DATASET_STATE.VALID_TO.isNull(),
                        DATASET_STATE.DETAILS.isNotNull())
                .forEach(r -> {
                    if (wanted.contains(r.value1())) {
                        titles.put(r.value1(), List.copyOf(new java.util.LinkedHashSet<>(titles(r.value2()))));
                    }
                });
        Map<Long, List<String>> readBy = new HashMap<>();
        Map<Long, List<String>> writtenBy = new HashMap<>();
        db.selectDistinct(SCRIPT_REFERENCE.DATASET_ID, SCRIPT_REFERENCE.DIRECTION, SCRIPT.NAME)
                .from(SCRIPT_REFERENCE)
                .join(SCRIPT_ANALYSIS).on(SCRIPT_ANALYSIS.ID.eq(SCRIPT_REFERENCE.ANALYSIS_ID), SCRIPT_ANALYSIS.VALID_TO.isNull())
                .join(SCRIPT).on(SCRIPT.ID.eq(SCRIPT_ANALYSIS.SCRIPT_ID))
                .where(among(SCRIPT_REFERENCE.DATASET_ID, wanted))
                .orderBy(SCRIPT.NAME)
                .forEach(r -> {
                    if (wanted.contains(r.value1())) {
                        (r.value2().equals("read") ? readBy : writtenBy)
                                .computeIfAbsent(r.value1(), k -> new ArrayList<>()).add(r.value3());
                    }
                });
        List<DatasetDoc> docs = new ArrayList<>();
        // The column names are read once, above, for both the entries and the column documents.
        Map<Long, List<String>> names = new HashMap<>();
        columns.forEach((id, list) -> names.put(id, list.stream().map(ColumnView::name).toList()));
        for (IndexEntry entry : reader.datasetEntries(ids, names)) {
            long id = entry.id();
            docs.add(new DatasetDoc(entry, columns.getOrDefault(id, List.of()), titles.getOrDefault(id, List.of()),
                    readBy.getOrDefault(id, List.of()), writtenBy.getOrDefault(id, List.of())));
        }
        return docs;
    }

    /**
     * The ids as a condition on {@code field}: a range when they are dense, as the batches of a rebuild are, else
     * an IN list. H2 checks a long IN list against each row it reads, value by value, which made reading the
     * columns of a rebuild's batches about a fifth of its time; a range is one index scan. Callers drop the rows
     * of ids inside the range that were not asked for.
     */
    private static org.jooq.Condition among(org.jooq.Field<Long> field, Set<Long> ids) {
        long low = Long.MAX_VALUE;
        long high = Long.MIN_VALUE;
        for (long id : ids) {
            low = Math.min(low, id);
            high = Math.max(high, id);
        }
        // Dense: at most one id in two of the range missing (our threshold).
        return ids.size() > 16 && high - low < 2L * ids.size() ? field.between(low, high) : field.in(ids);
    }

    /** Documents for the present scripts among {@code ids}. */
    public List<ScriptDoc> scripts(Collection<Long> ids) {
        if (ids.isEmpty()) {
            return List.of();
        }
        Map<Long, Set<String>> reads = new HashMap<>();
        Map<Long, Set<String>> writes = new HashMap<>();
        db.selectDistinct(SCRIPT_ANALYSIS.SCRIPT_ID, SCRIPT_REFERENCE.DIRECTION, DATASET.NAME)
                .from(SCRIPT_REFERENCE)
                .join(SCRIPT_ANALYSIS).on(SCRIPT_ANALYSIS.ID.eq(SCRIPT_REFERENCE.ANALYSIS_ID), SCRIPT_ANALYSIS.VALID_TO.isNull())
                .join(DATASET).on(DATASET.ID.eq(SCRIPT_REFERENCE.DATASET_ID))
                .where(SCRIPT_ANALYSIS.SCRIPT_ID.in(ids))
                .orderBy(DATASET.NAME)
                .forEach(r -> (r.value2().equals("read") ? reads : writes)
                        .computeIfAbsent(r.value1(), k -> new java.util.LinkedHashSet<>()).add(r.value3()));
        List<ScriptDoc> docs = new ArrayList<>();
        for (IndexEntry entry : reader.scriptEntries(ids)) {
            docs.add(new ScriptDoc(entry, List.copyOf(reads.getOrDefault(entry.id(), Set.of())),
                    List.copyOf(writes.getOrDefault(entry.id(), Set.of()))));
        }
        return docs;
    }

    /** Every owner with at least one present dataset, and the names of those datasets. */
    public List<OwnerDoc> owners() {
        Map<Long, OwnerDoc> owners = new LinkedHashMap<>();
        db.select(OWNER.ID, OWNER.NAME, OWNER.KIND, DATASET.NAME)
                .from(DATASET_OWNER)
                .join(OWNER).on(OWNER.ID.eq(DATASET_OWNER.OWNER_ID))
                .join(DATASET).on(DATASET.ID.eq(DATASET_OWNER.DATASET_ID))
                .join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID), DATASET_STATE.VALID_TO.isNull())
                .where(DATASET_OWNER.VALID_TO.isNull())
                .orderBy(OWNER.ID, DATASET.NAME)
                .forEach(r -> owners.computeIfAbsent(r.value1(), k -> new OwnerDoc(k, r.value2(), r.value3(), new ArrayList<>()))
                        .datasets().add(r.value4()));
        return List.copyOf(owners.values());
    }

    /** The datasets at either end of these edges (in any version), whose read-by and written-by lists may have changed. */
    public Set<Long> edgeEnds(Collection<Long> edgeIds) {
        Set<Long> ends = new HashSet<>();
        if (edgeIds.isEmpty()) {
            return ends;
        }
        db.select(LINEAGE_EDGE.SOURCE_DATASET_ID, LINEAGE_EDGE.TARGET_DATASET_ID).from(LINEAGE_EDGE)
                .where(LINEAGE_EDGE.ID.in(edgeIds))
                .forEach(r -> {
                    ends.add(r.value1());
                    ends.add(r.value2());
                });
        return ends;
    }

    /** The datasets any analysis of these scripts (current or closed) refers to. */
    public Set<Long> referencedBy(Collection<Long> scriptIds) {
        if (scriptIds.isEmpty()) {
            return Set.of();
        }
        return new HashSet<>(db.selectDistinct(SCRIPT_REFERENCE.DATASET_ID).from(SCRIPT_REFERENCE)
                .join(SCRIPT_ANALYSIS).on(SCRIPT_ANALYSIS.ID.eq(SCRIPT_REFERENCE.ANALYSIS_ID))
                .where(SCRIPT_ANALYSIS.SCRIPT_ID.in(scriptIds), SCRIPT_REFERENCE.DATASET_ID.isNotNull())
                .fetch(SCRIPT_REFERENCE.DATASET_ID));
    }

    /**
     * How often each present dataset is used: distinct scripts whose current analysis reads it, plus reads in
     * reported runs.
     */
    public Map<Long, Integer> uses() {
        Map<Long, Integer> uses = new HashMap<>();
        db.select(SCRIPT_REFERENCE.DATASET_ID, org.jooq.impl.DSL.countDistinct(SCRIPT_ANALYSIS.SCRIPT_ID))
                .from(SCRIPT_REFERENCE)
                .join(SCRIPT_ANALYSIS).on(SCRIPT_ANALYSIS.ID.eq(SCRIPT_REFERENCE.ANALYSIS_ID), SCRIPT_ANALYSIS.VALID_TO.isNull())
                .where(SCRIPT_REFERENCE.DIRECTION.eq("read"), SCRIPT_REFERENCE.DATASET_ID.isNotNull())
                .groupBy(SCRIPT_REFERENCE.DATASET_ID)
                .forEach(r -> uses.merge(r.value1(), r.value2(), Integer::sum));
        db.select(RUN_IO.DATASET_ID, org.jooq.impl.DSL.count()).from(RUN_IO)
                .where(RUN_IO.DIRECTION.eq("read"))
                .groupBy(RUN_IO.DATASET_ID)
                .forEach(r -> uses.merge(r.value1(), r.value2(), Integer::sum));
        return uses;
    }

    /** Current dataset-to-dataset edges as (source, target) id pairs, one per pair however many scripts make it. */
    public List<long[]> datasetEdges() {
        return db.selectDistinct(LINEAGE_EDGE.SOURCE_DATASET_ID, LINEAGE_EDGE.TARGET_DATASET_ID).from(LINEAGE_EDGE)
                .where(LINEAGE_EDGE.VALID_TO.isNull())
                .fetch(r -> new long[] {r.value1(), r.value2()});
    }

    /** Ids of present scripts, for a rebuild. */
    public List<Long> presentScriptIds() {
        return db.select(SCRIPT_STATE.SCRIPT_ID).from(SCRIPT_STATE).where(SCRIPT_STATE.VALID_TO.isNull())
                .orderBy(SCRIPT_STATE.SCRIPT_ID).fetch(SCRIPT_STATE.SCRIPT_ID);
    }

    /** Every {@code title} a format reader put in a dataset's details (figures: the embedded titles). */
    static List<String> titles(String details) {
        List<String> out = new ArrayList<>();
        try {
            collectTitles(JSON.readTree(details), out);
        } catch (java.io.IOException | RuntimeException unreadable) {
            // Details are written by our own readers; a value that does not parse simply has no titles.
        }
        return out;
    }

    private static void collectTitles(JsonNode node, List<String> out) {
        if (node == null) {
            return;
        }
        if (node.isObject()) {
            node.fields().forEachRemaining(e -> {
                if (e.getKey().equals("title") && e.getValue().isTextual()) {
                    out.add(e.getValue().asText());
                } else {
                    collectTitles(e.getValue(), out);
                }
            });
        } else if (node.isArray()) {
            node.forEach(n -> collectTitles(n, out));
        }
    }
}
