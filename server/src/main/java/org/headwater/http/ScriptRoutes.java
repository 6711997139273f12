package org.headwater.http;

import io.javalin.http.Context;

/** {@code /api/scripts}: the scripts the catalog holds. */
final class ScriptRoutes {
    private final CatalogHolder catalog;

    ScriptRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    void list(Context ctx) {
        ctx.json(catalog.get().reader().scripts(Params.intParam(ctx, "offset", 0, 0, Integer.MAX_VALUE),
                Params.intParam(ctx, "limit", 100, 1, 1000)));
    }

    void reads(Context ctx) {
        long id = Params.pathId(ctx, "id");
        catalog.get().reader().script(id).orElseThrow(() -> ApiError.notFound("No script with id " + id));
        ctx.json(catalog.get().reader().references(id));
    }

    void runs(Context ctx) {
        long id = Params.pathId(ctx, "id");
        catalog.get().reader().script(id).orElseThrow(() -> ApiError.notFound("No script with id " + id));
        ctx.json(catalog.get().reader().runsOfScript(id, Params.intParam(ctx, "limit", 50, 1, 1000)));
    }

    void one(Context ctx) {
        long id = Params.pathId(ctx, "id");
        ctx.json(catalog.get().reader().script(id).orElseThrow(() -> ApiError.notFound("No script with id " + id)));
    }
}
