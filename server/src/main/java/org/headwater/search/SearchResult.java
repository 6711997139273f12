package org.headwater.search;

import java.util.List;
import java.util.Map;

/**
 * The answer to a search: one page of hits, the number of all matches, counts per facet value over all
 * matches, and a corrected query when some word of it is in no document. The total and the counts are
 * {@code exact} up to {@link SearchIndex#COUNT_CAP} matches and estimated beyond.
 */
public record SearchResult(String query, long total, boolean exact, int page, int size, List<SearchHit> hits,
        Map<String, Map<String, Integer>> facets, String suggestion) {
}
