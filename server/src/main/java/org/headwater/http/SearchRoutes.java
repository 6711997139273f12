package org.headwater.http;

import io.javalin.http.Context;
import org.headwater.search.FreshnessProvider;
import org.headwater.search.QuerySyntaxException;
import org.headwater.search.SearchRequest;

/**
 * {@code /api/search?q=&kind=&fresh=&page=&size=&explain=}: words in the query syntax in; one page of ranked hits,
 * the total, facet counts and a "did you mean" suggestion out. {@code limit} is kept as another name for size.
 */
final class SearchRoutes {
    private final CatalogHolder catalog;

    SearchRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    void search(Context ctx) {
        String q = Params.optional(ctx, "q");
        if (q == null) {
            throw ApiError.badRequest("Parameter 'q' is required: the words to look for");
        }
        if (q.length() > 1000) {
            throw ApiError.badRequest("The query is longer than 1000 characters");
        }
        int size = Params.intParam(ctx, "size", Params.intParam(ctx, "limit", 20, 1, SearchRequest.MAX_SIZE), 1,
                SearchRequest.MAX_SIZE);
        int page = Params.intParam(ctx, "page", 1, 1, SearchRequest.MAX_DEPTH);
        if ((long) page * size > SearchRequest.MAX_DEPTH) {
            throw ApiError.badRequest("Pages reach no deeper than hit " + SearchRequest.MAX_DEPTH + ": page × size is "
                    + (long) page * size);
        }
        String fresh = Params.optional(ctx, "fresh");
        if (fresh != null) {
            // The same as writing fresh=STATE in q; a comma means either.
            for (String state : fresh.split(",", -1)) {
                String word = state.strip().toLowerCase(java.util.Locale.ROOT);
                if (!FreshnessProvider.STATES.contains(word)) {
                    throw ApiError.badRequest("Parameter 'fresh' takes freshness states separated by commas: "
                            + String.join(", ", FreshnessProvider.STATES) + " (not '" + state.strip() + "')");
                }
                q = q + " fresh=" + word;
            }
        }
        String explain = Params.optional(ctx, "explain");
        if (explain != null && !explain.equals("true") && !explain.equals("false")) {
            throw ApiError.badRequest("Parameter 'explain' must be true or false");
        }
        try {
            ctx.json(catalog.get().index().search(new SearchRequest(q, Params.optional(ctx, "kind"), page, size,
                    "true".equals(explain))));
        } catch (QuerySyntaxException e) {
            throw ApiError.badRequest(e.getMessage());
        }
    }
}
