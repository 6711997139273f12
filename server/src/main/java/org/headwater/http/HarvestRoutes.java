package org.headwater.http;

import io.javalin.http.Context;

/** {@code /api/harvests}: recent harvests with their counts and errors. */
final class HarvestRoutes {
    private final CatalogHolder catalog;

    HarvestRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    void list(Context ctx) {
        ctx.json(catalog.get().reader().harvests(Params.intParam(ctx, "limit", 20, 1, 500)));
    }

    void one(Context ctx) {
        long id = Params.pathId(ctx, "id");
        ctx.json(catalog.get().reader().harvest(id).orElseThrow(() -> ApiError.notFound("No harvest with id " + id)));
    }
}
