package org.headwater.http;

import io.javalin.http.Context;
import org.headwater.Catalog;

/** {@code /api/scripts}: the scripts the catalog holds. */
final class ScriptRoutes {
    private final Catalog catalog;

    ScriptRoutes(Catalog catalog) {
        this.catalog = catalog;
    }

    void list(Context ctx) {
        ctx.json(catalog.reader().scripts(Params.intParam(ctx, "offset", 0, 0, Integer.MAX_VALUE),
                Params.intParam(ctx, "limit", 100, 1, 1000)));
    }

    void one(Context ctx) {
        long id = Params.pathId(ctx, "id");
        ctx.json(catalog.reader().script(id).orElseThrow(() -> ApiError.notFound("No script with id " + id)));
    }
}
