package org.headwater.store;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_OWNER;
import static org.headwater.store.schema.Tables.DATASET_PARTITION;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.OWNER;
import static org.headwater.store.schema.Tables.SCRIPT;
import static org.headwater.store.schema.Tables.SCRIPT_STATE;

import com.fasterxml.jackson.core.type.TypeReference;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.headwater.store.Views.OwnerView;
import org.jooq.DSLContext;

/**
 * Whom to ask about a dataset or a script, and why: the owners assigned to it (by the owners file, by a
 * person, or by another source) and, as suggestions, the git authors of the scripts that write it.
 */
public final class OwnerReader {
    private static final ObjectMapper JSON = new ObjectMapper();

    private final DSLContext db;

    public OwnerReader(Store store) {
        this(store.dsl());
    }

    OwnerReader(DSLContext db) {
        this.db = db;
    }

    /** An ownership row as stored, with where it came from. */
    public record Assigned(long datasetId, String owner, String kind, String reason, String origin, boolean inherited) {
    }

    /** The owners assigned to a dataset, then the suggested ones (authors of the scripts that write it). */
    public List<OwnerView> ownersOf(long datasetId, Instant asOf) {
        List<OwnerView> owners = new ArrayList<>();
        Set<String> named = new LinkedHashSet<>();
        for (Assigned a : assigned(List.of(datasetId), asOf).getOrDefault(datasetId, List.of())) {
            owners.add(new OwnerView(a.owner(), a.kind(), a.reason(), a.origin(), a.inherited(), false));
            named.add(a.owner());
        }
        for (OwnerView s : suggestedFor(datasetId, asOf)) {
            if (named.add(s.name())) {
                owners.add(s);
            }
        }
        return owners;
    }

    /** The owners assigned to each of these datasets, by owner name. */
    public Map<Long, List<Assigned>> assigned(Collection<Long> datasetIds, Instant asOf) {
        Map<Long, List<Assigned>> byDataset = new HashMap<>();
        if (datasetIds.isEmpty()) {
            return byDataset;
        }
        db.select(DATASET_OWNER.DATASET_ID, OWNER.NAME, OWNER.KIND, DATASET_OWNER.REASON, DATASET_OWNER.ORIGIN,
                        DATASET_OWNER.INHERITED)
                .from(DATASET_OWNER).join(OWNER).on(OWNER.ID.eq(DATASET_OWNER.OWNER_ID))
                .where(DATASET_OWNER.DATASET_ID.in(datasetIds),
                        Validity.at(DATASET_OWNER.VALID_FROM, DATASET_OWNER.VALID_TO, asOf))
                .orderBy(OWNER.NAME)
                .forEach(r -> byDataset.computeIfAbsent(r.value1(), k -> new ArrayList<>())
                        .add(new Assigned(r.value1(), r.value2(), r.value3(), r.value4(), r.value5(), r.value6())));
        // Sorted here, not by the database: H2 and PostgreSQL collate names differently.
        byDataset.values().forEach(list -> list.sort(java.util.Comparator.comparing(Assigned::owner,
                String.CASE_INSENSITIVE_ORDER).thenComparing(Assigned::owner)));
        return byDataset;
    }

    /** The current owners of every dataset of one source, by dataset URI (for the owners file). */
    public Map<String, List<Assigned>> currentOfSource(long sourceId) {
        Map<String, List<Assigned>> byUri = new HashMap<>();
        db.select(DATASET.URI, DATASET_OWNER.DATASET_ID, OWNER.NAME, OWNER.KIND, DATASET_OWNER.REASON,
                        DATASET_OWNER.ORIGIN, DATASET_OWNER.INHERITED)
                .from(DATASET_OWNER).join(OWNER).on(OWNER.ID.eq(DATASET_OWNER.OWNER_ID))
                .join(DATASET).on(DATASET.ID.eq(DATASET_OWNER.DATASET_ID))
                .where(DATASET.SOURCE_ID.eq(sourceId), DATASET_OWNER.VALID_TO.isNull())
                .forEach(r -> byUri.computeIfAbsent(r.value1(), k -> new ArrayList<>())
                        .add(new Assigned(r.value2(), r.value3(), r.value4(), r.value5(), r.value6(), r.value7())));
        return byUri;
    }

    /** The datasets of one source present now, URI to workspace-relative name (what owners-file rules match). */
    public Map<String, String> presentOfSource(long sourceId) {
        Map<String, String> names = new HashMap<>();
        db.select(DATASET.URI, DATASET.NAME).from(DATASET)
                .where(DATASET.SOURCE_ID.eq(sourceId), DATASET.ID.in(
                        db.select(org.headwater.store.schema.Tables.DATASET_STATE.DATASET_ID)
                                .from(org.headwater.store.schema.Tables.DATASET_STATE)
                                .where(org.headwater.store.schema.Tables.DATASET_STATE.VALID_TO.isNull())))
                .forEach(r -> names.put(r.value1(), r.value2()));
        return names;
    }

    /**
     * Suggested owners of a dataset: everyone git names as having changed a script that writes it, most
     * recent first per script. They are suggestions, not owners: having edited a script is evidence of
     * knowing what it writes, not of answering for it.
     */
    public List<OwnerView> suggestedFor(long datasetId, Instant asOf) {
        Map<String, OwnerView> suggested = new LinkedHashMap<>();
        db.selectDistinct(SCRIPT.NAME, SCRIPT_STATE.GIT_AUTHORS, SCRIPT.ID)
                .from(LINEAGE_EDGE)
                .join(SCRIPT).on(SCRIPT.ID.eq(LINEAGE_EDGE.SCRIPT_ID))
                .join(SCRIPT_STATE).on(SCRIPT_STATE.SCRIPT_ID.eq(SCRIPT.ID),
                        Validity.at(SCRIPT_STATE.VALID_FROM, SCRIPT_STATE.VALID_TO, asOf))
                .where(LINEAGE_EDGE.TARGET_DATASET_ID.eq(datasetId),
                        Validity.at(LINEAGE_EDGE.VALID_FROM, LINEAGE_EDGE.VALID_TO, asOf))
                .orderBy(SCRIPT.NAME, SCRIPT.ID)
                .forEach(r -> {
                    for (String author : authors(r.value2())) {
                        suggested.putIfAbsent(author, new OwnerView(author, "person",
                                "changed " + r.value1() + ", which writes this dataset (git history)",
                                "git", false, true));
                    }
                });
        return List.copyOf(suggested.values());
    }

    /** The people git names for each script: everyone who changed it, most recent first. */
    public Map<Long, List<String>> scriptAuthors(Collection<Long> scriptIds) {
        Map<Long, List<String>> byScript = new HashMap<>();
        if (scriptIds.isEmpty()) {
            return byScript;
        }
        db.select(SCRIPT_STATE.SCRIPT_ID, SCRIPT_STATE.GIT_AUTHORS).from(SCRIPT_STATE)
                .where(SCRIPT_STATE.SCRIPT_ID.in(scriptIds), SCRIPT_STATE.VALID_TO.isNull())
                .forEach(r -> byScript.put(r.value1(), authors(r.value2())));
        return byScript;
    }

    /** The partitioned set a present partition belongs to, found by the partition's name or URI. */
    public Optional<Long> setOfPartition(String key) {
        return db.select(DATASET_PARTITION.DATASET_ID).from(DATASET_PARTITION)
                .where(DATASET_PARTITION.NAME.eq(key).or(DATASET_PARTITION.URI.eq(key)),
                        DATASET_PARTITION.VALID_TO.isNull())
                .limit(1).fetchOptional(DATASET_PARTITION.DATASET_ID);
    }

    private static List<String> authors(String json) {
        if (json == null || json.isBlank()) {
            return List.of();
        }
        try {
            return JSON.readValue(json, new TypeReference<List<String>>() { });
        } catch (IOException e) {
            throw new StoreException("A stored git author list is not valid JSON: " + json, e);
        }
    }
}
