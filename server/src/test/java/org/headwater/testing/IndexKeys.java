package org.headwater.testing;

import java.util.ArrayList;
import java.util.List;
import org.headwater.Catalog;

/**
 * The search documents a catalog should hold: one per present dataset, current column, present script and
 * owner of a present dataset, as the store's own tables list them.
 */
public final class IndexKeys {
    private IndexKeys() {
    }

    /** What the store says should be indexed, read with plain SQL, independently of the index's own reader. */
    public static List<String> expected(Catalog catalog) {
        var db = catalog.store().dsl();
        List<String> keys = new ArrayList<>();
        db.fetch("select dataset_id from dataset_state where valid_to is null")
                .forEach(r -> keys.add("dataset:" + r.get(0)));
        db.fetch("select v.dataset_id, c.ordinal from schema_column c join schema_version v on v.id = c.schema_version_id"
                        + " join dataset_state s on s.dataset_id = v.dataset_id and s.valid_to is null where v.valid_to is null")
                .forEach(r -> keys.add("column:" + r.get(0) + ":" + r.get(1)));
        db.fetch("select script_id from script_state where valid_to is null").forEach(r -> keys.add("script:" + r.get(0)));
        db.fetch("select distinct o.owner_id from dataset_owner o join dataset_state s on s.dataset_id = o.dataset_id"
                        + " and s.valid_to is null where o.valid_to is null")
                .forEach(r -> keys.add("owner:" + r.get(0)));
        keys.sort(null);
        return keys;
    }
}
