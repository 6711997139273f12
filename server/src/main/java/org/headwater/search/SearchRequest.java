package org.headwater.search;

/**
 * What to search for: the text in the query syntax ({@link QueryText}), an optional kind, the page (from 1)
 * and its size, and whether each hit should explain its rank.
 */
public record SearchRequest(String text, String kind, int page, int size, boolean explain) {
    public static final int MAX_SIZE = 200;
    /** Hits beyond this depth are never collected: pages stop there. */
    public static final int MAX_DEPTH = 2000;

    public SearchRequest {
        if (page < 1 || size < 1 || size > MAX_SIZE) {
            throw new IllegalArgumentException("page must be at least 1 and size between 1 and " + MAX_SIZE);
        }
        if ((long) page * size > MAX_DEPTH) {
            throw new IllegalArgumentException("Pages reach no deeper than hit " + MAX_DEPTH);
        }
    }

    /** The first {@code size} hits, without explanations. */
    public static SearchRequest of(String text, String kind, int size) {
        return new SearchRequest(text, kind, 1, size, false);
    }
}
