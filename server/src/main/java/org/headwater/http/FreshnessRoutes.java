package org.headwater.http;

import com.fasterxml.jackson.databind.JsonNode;
import io.javalin.http.Context;
import org.headwater.checks.Policy;
import org.headwater.store.Views.DatasetView;

/** {@code /api/freshness} and a dataset's freshness and policy: evaluated on request, recorded by the schedule. */
final class FreshnessRoutes {
    private final CatalogHolder catalog;

    FreshnessRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    void all(Context ctx) {
        java.time.Instant asOf = Params.asOf(ctx);
        ctx.json(asOf == null ? catalog.get().freshness().evaluate() : catalog.get().freshness().recordedAsOf(asOf));
    }

    void one(Context ctx) {
        DatasetView dataset = present(ctx);
        ctx.json(catalog.get().freshness().evaluate(dataset.id())
                .orElseThrow(() -> ApiError.notFound("Dataset " + dataset.id() + " is not present now")));
    }

    void history(Context ctx) {
        String raw = Params.optional(ctx, "datasetId");
        if (raw == null) {
            throw ApiError.badRequest("Name the dataset: /api/freshness/history?datasetId=ID");
        }
        long id = Params.longValue("datasetId", raw);
        ctx.json(catalog.get().freshness().history(id).orElseThrow(() -> ApiError.notFound("No dataset with id " + id)));
    }

    /** Body {@code {"policy": "max-age 36h", "author": "…"}}; a null policy removes the person's policy. */
    void putPolicy(Context ctx) {
        DatasetView dataset = present(ctx);
        JsonNode body;
        try {
            body = ApiJson.mapper().readTree(ctx.body());
        } catch (java.io.IOException e) {
            body = null;
        }
        if (body == null || !body.isObject() || !body.has("policy")) {
            throw ApiError.badRequest("The body must be a JSON object with 'policy': {\"policy\": \"max-age 36h\"},"
                    + " {\"policy\": \"schedule 0 6 * * 1-5 grace 2h\"} or {\"policy\": null} to remove it;"
                    + " 'author' is optional");
        }
        JsonNode text = body.get("policy");
        if (!text.isNull() && !text.isTextual()) {
            throw ApiError.badRequest("'policy' must be a string or null");
        }
        Policy policy;
        try {
            policy = text.isNull() || text.asText().isBlank() ? null : Policy.parse(text.asText());
        } catch (IllegalArgumentException e) {
            throw ApiError.badRequest("Not a freshness policy: " + e.getMessage());
        }
        String author = body.hasNonNull("author") && !body.get("author").asText().isBlank()
                ? body.get("author").asText().trim() : "api";
        catalog.get().policies().setByPerson(dataset.uri(), policy, author);
        ctx.json(catalog.get().freshness().evaluate(dataset.id()).orElseThrow());
    }

    private DatasetView present(Context ctx) {
        long id = Params.pathId(ctx, "id");
        DatasetView dataset = catalog.get().reader().dataset(id, null)
                .orElseThrow(() -> ApiError.notFound("No dataset with id " + id));
        if (!dataset.present()) {
            throw ApiError.notFound("Dataset " + id + " (" + dataset.name() + ") is no longer present");
        }
        return dataset;
    }
}
