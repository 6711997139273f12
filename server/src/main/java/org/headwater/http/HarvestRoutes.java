package org.headwater.http;

import io.javalin.http.Context;
import org.headwater.Catalog;

/** {@code /api/harvests}: recent harvests with their counts and errors. */
final class HarvestRoutes {
    private final Catalog catalog;

    HarvestRoutes(Catalog catalog) {
        this.catalog = catalog;
    }

    void list(Context ctx) {
        ctx.json(catalog.reader().harvests(Params.intParam(ctx, "limit", 20, 1, 500)));
    }

    void one(Context ctx) {
        long id = Params.pathId(ctx, "id");
        ctx.json(catalog.reader().harvest(id).orElseThrow(() -> ApiError.notFound("No harvest with id " + id)));
    }
}
