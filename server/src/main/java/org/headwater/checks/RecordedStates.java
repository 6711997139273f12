package org.headwater.checks;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.headwater.ingest.Change;
import org.headwater.ingest.ChangeListener;
import org.headwater.search.FreshnessProvider;
import org.headwater.store.Store;

/**
 * The search's freshness facet: the state each dataset was in at its last recorded check. Read from the
 * store once, and again only after a batch that recorded a check or changed a policy, so a search never
 * evaluates policies itself.
 */
public final class RecordedStates implements FreshnessProvider, ChangeListener {
    private final FreshnessRecords records;
    private volatile Map<Long, String> states;

    public RecordedStates(Store store) {
        this.records = new FreshnessRecords(store);
    }

    @Override
    public String stateOf(long datasetId) {
        Map<Long, String> known = states;
        if (known == null) {
            Map<Long, String> loaded = new HashMap<>();
            records.currentChecks().forEach((id, check) -> loaded.put(id, check.state()));
            states = known = loaded;
        }
        return known.getOrDefault(datasetId, FreshnessState.UNKNOWN.word());
    }

    @Override
    public void committed(List<Change> changes) {
        if (changes.stream().anyMatch(c -> Change.FRESHNESS.equals(c.entity()))) {
            states = null;
        }
    }
}
