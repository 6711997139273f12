package org.headwater.search;

/**
 * Tells the search which freshness state a dataset is in (the freshness checks fill this in); the search
 * counts hits per state as a facet.
 */
@FunctionalInterface
public interface FreshnessProvider {
    /** The provider used until one is set: every dataset is {@code unknown}. */
    FreshnessProvider UNKNOWN = datasetId -> "unknown";

    /** Every state a provider may give; the {@code fresh=} filter accepts these words only. */
    java.util.List<String> STATES = java.util.List.of("fresh", "due", "late", "stale", "unknown");

    /** The state of a dataset, a short word such as {@code fresh}, {@code late} or {@code unknown}; never null. */
    String stateOf(long datasetId);
}
