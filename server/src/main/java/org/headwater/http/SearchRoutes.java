package org.headwater.http;

import io.javalin.http.Context;
import java.util.List;
import org.headwater.search.SearchHit;

/** {@code /api/search}: words in, ranked datasets and scripts out. */
final class SearchRoutes {
    private final CatalogHolder catalog;

    SearchRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    /** The answer of a search. */
    record Result(String query, List<SearchHit> hits) {
    }

    void search(Context ctx) {
        String q = Params.optional(ctx, "q");
        if (q == null) {
            throw ApiError.badRequest("Parameter 'q' is required: the words to look for");
        }
        if (q.length() > 1000) {
            throw ApiError.badRequest("The query is longer than 1000 characters");
        }
        int limit = Params.intParam(ctx, "limit", 20, 1, 200);
        ctx.json(new Result(q, catalog.get().index().search(q, Params.optional(ctx, "kind"), limit)));
    }
}
