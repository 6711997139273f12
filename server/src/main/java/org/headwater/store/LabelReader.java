package org.headwater.store;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.SCRIPT;
import static org.headwater.store.schema.Tables.SOURCE;

import java.util.Collection;
import java.util.HashMap;
import java.util.Map;
import java.util.Optional;

/** Names of datasets, scripts and sources by id, fetched together, for answers that list many of them. */
public final class LabelReader {
    private final Store store;

    public LabelReader(Store store) {
        this.store = store;
    }

    /** A dataset's name, URI and kind word. */
    public record DatasetLabel(long id, String name, String uri, String kind) {
    }

    public Map<Long, DatasetLabel> datasets(Collection<Long> ids) {
        Map<Long, DatasetLabel> labels = new HashMap<>();
        if (!ids.isEmpty()) {
            store.dsl().select(DATASET.ID, DATASET.NAME, DATASET.URI, DATASET.KIND).from(DATASET)
                    .where(DATASET.ID.in(ids))
                    .forEach(r -> labels.put(r.value1(), new DatasetLabel(r.value1(), r.value2(), r.value3(), r.value4())));
        }
        return labels;
    }

    public Map<Long, String> scripts(Collection<Long> ids) {
        Map<Long, String> names = new HashMap<>();
        if (!ids.isEmpty()) {
            store.dsl().select(SCRIPT.ID, SCRIPT.NAME).from(SCRIPT).where(SCRIPT.ID.in(ids))
                    .forEach(r -> names.put(r.value1(), r.value2()));
        }
        return names;
    }

    /** The URI of each script, for reading its code. */
    public Map<Long, String> scriptUris(Collection<Long> ids) {
        Map<Long, String> uris = new HashMap<>();
        if (!ids.isEmpty()) {
            store.dsl().select(SCRIPT.ID, SCRIPT.URI).from(SCRIPT).where(SCRIPT.ID.in(ids))
                    .forEach(r -> uris.put(r.value1(), r.value2()));
        }
        return uris;
    }

    /** The id of the source with this name. */
    public Optional<Long> sourceId(String name) {
        return store.dsl().select(SOURCE.ID).from(SOURCE).where(SOURCE.NAME.eq(name)).fetchOptional(SOURCE.ID);
    }
}
