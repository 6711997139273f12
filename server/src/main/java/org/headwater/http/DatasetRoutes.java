package org.headwater.http;

import com.fasterxml.jackson.databind.JsonNode;
import io.javalin.http.Context;
import java.util.List;
import java.util.Set;
import org.headwater.ingest.Observation;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.store.Views.DatasetView;

/** {@code /api/datasets}: lists, single datasets with their columns, schema history, and notes. */
final class DatasetRoutes {
    private final CatalogHolder catalog;

    DatasetRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    /** A page of datasets. */
    record Page(int total, int offset, int limit, List<DatasetSummary> items) {
    }

    void list(Context ctx) {
        String match = Params.optional(ctx, "match");
        if (match != null) {
            List<DatasetSummary> found = catalog.get().reader().findDatasets(match);
            ctx.json(new Page(found.size(), 0, found.size(), found));
            return;
        }
        String kind = Params.optional(ctx, "kind");
        int offset = Params.intParam(ctx, "offset", 0, 0, Integer.MAX_VALUE);
        int limit = Params.intParam(ctx, "limit", 100, 1, 1000);
        var asOf = Params.asOf(ctx);
        ctx.json(new Page(catalog.get().reader().datasetTotal(kind, asOf), offset, limit,
                catalog.get().reader().datasets(kind, offset, limit, asOf)));
    }

    void one(Context ctx) {
        ctx.json(find(ctx));
    }

    void schemaHistory(Context ctx) {
        DatasetView dataset = find(ctx);
        ctx.json(catalog.get().reader().schemaHistory(dataset.id()));
    }

    void runs(Context ctx) {
        ctx.json(catalog.get().reader().runsOfDataset(find(ctx).id(), Params.intParam(ctx, "limit", 50, 1, 1000)));
    }

    void lineage(Context ctx) {
        ctx.json(org.headwater.lineage.LineageReport.of(catalog.get().reader(), find(ctx)));
    }

    /** Other datasets with the same content (copies, renamed files), the first seen first. */
    void copies(Context ctx) {
        DatasetView dataset = find(ctx);
        ctx.json(catalog.get().reader().copiesOf(dataset.id(), Params.asOf(ctx)));
    }

    /** Replaces the description and tags; the author is recorded with the change. */
    void putNote(Context ctx) {
        DatasetView dataset = find(ctx);
        JsonNode body;
        try {
            body = ApiJson.mapper().readTree(ctx.body());
        } catch (java.io.IOException e) {
            throw ApiError.badRequest("The body must be JSON: {\"description\": \"…\", \"tags\": [\"…\"], \"author\": \"…\"}");
        }
        if (body == null || !body.isObject()) {
            throw ApiError.badRequest("The body must be a JSON object");
        }
        String description = body.hasNonNull("description") ? body.get("description").asText() : null;
        Set<String> tags = new java.util.TreeSet<>();
        if (body.has("tags")) {
            if (!body.get("tags").isArray()) {
                throw ApiError.badRequest("'tags' must be an array of strings");
            }
            body.get("tags").forEach(t -> tags.add(t.asText().trim()));
        }
        String author = body.hasNonNull("author") ? body.get("author").asText() : "api";
        catalog.get().ingestor().apply("api", List.of(new Observation.NoteSet(dataset.uri(), description, tags, author)));
        ctx.json(catalog.get().reader().dataset(dataset.id(), null).orElseThrow());
    }

    private DatasetView find(Context ctx) {
        long id = Params.pathId(ctx, "id");
        return catalog.get().reader().dataset(id, Params.asOf(ctx))
                .orElseThrow(() -> ApiError.notFound("No dataset with id " + id));
    }
}
