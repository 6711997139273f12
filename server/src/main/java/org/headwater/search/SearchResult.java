package org.headwater.search;

import java.util.List;
import java.util.Map;

/**
 * The answer to a search: one page of hits, the number of all matches, counts per facet value over all
 * matches, and a corrected query when some word of it is in no document.
 */
public record SearchResult(String query, long total, int page, int size, List<SearchHit> hits,
        Map<String, Map<String, Integer>> facets, String suggestion) {
}
