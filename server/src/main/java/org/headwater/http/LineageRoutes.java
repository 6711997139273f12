package org.headwater.http;

import com.fasterxml.jackson.databind.JsonNode;
import io.javalin.http.Context;
import java.time.Instant;
import org.headwater.Catalog;
import org.headwater.impact.ChangeKind;
import org.headwater.impact.ImpactAnalysis;
import org.headwater.impact.ImpactMarkdown;
import org.headwater.impact.ImpactReport;
import org.headwater.lineage.LineageGraph;
import org.headwater.lineage.Neighbours;
import org.headwater.lineage.Query;
import org.headwater.lineage.QueryWords;
import org.headwater.lineage.Target;
import org.headwater.lineage.TargetException;
import org.headwater.lineage.Targets;
import org.headwater.owners.ManualOwners;
import org.headwater.owners.OwnerList;
import org.headwater.store.LabelReader;
import org.headwater.store.OwnerReader;
import org.headwater.store.Views.DatasetView;

/**
 * Walks of the lineage graph ({@code /api/datasets/{id}/upstream|downstream}), impact reports
 * ({@code /api/impact}) and owners assigned by hand ({@code /api/datasets/{id}/owners}).
 */
final class LineageRoutes {
    private final CatalogHolder catalog;

    LineageRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    void upstream(Context ctx) {
        walk(ctx, true);
    }

    void downstream(Context ctx) {
        walk(ctx, false);
    }

    private void walk(Context ctx, boolean upstream) {
        Catalog open = catalog.get();
        LineageGraph graph = graph(ctx, open);
        LabelReader labels = new LabelReader(open.store());
        long id = Params.pathId(ctx, "id");
        Target target = target(() -> targets(open, graph).resolve(id, Params.optional(ctx, "column")));
        Query query;
        try {
            String minimum = Params.optional(ctx, "minConfidence");
            query = QueryWords.parse(Params.optional(ctx, "depth"), Params.optional(ctx, "evidence"),
                    minimum != null ? minimum : Params.optional(ctx, "min_confidence"), Params.optional(ctx, "kind"),
                    Params.optional(ctx, "source"), labels);
        } catch (IllegalArgumentException e) {
            throw ApiError.badRequest(e.getMessage());
        }
        ctx.json(Neighbours.of(graph, labels, target, upstream, query));
    }

    /** {@code GET /api/impact?target=&change=&format=}: the impact report as JSON, or as Markdown. */
    void impact(Context ctx) {
        Catalog open = catalog.get();
        String key = Params.optional(ctx, "target");
        if (key == null) {
            throw ApiError.badRequest("Parameter 'target' is required: a dataset id, URI or name, or name.column");
        }
        java.time.Instant asOf = Params.asOf(ctx);
        org.headwater.lineage.LineageGraph graph = asOf == null ? open.lineage()
                : org.headwater.lineage.LineageGraph.loadAsOf(open.store(), asOf);
        Target target = target(() -> targets(open, graph).resolve(key));
        String format = Params.optional(ctx, "format");
        if (format != null && !format.equals("json") && !format.equals("markdown")) {
            throw ApiError.badRequest("Parameter 'format' must be json or markdown, got '" + format + "'");
        }
        ImpactReport report;
        try {
            String change = Params.optional(ctx, "change");
            ChangeKind kind = change != null ? ChangeKind.of(change) : target.namesColumn() ? ChangeKind.DROP : ChangeKind.DELETE;
            report = new ImpactAnalysis(graph, new LabelReader(open.store()), new OwnerReader(open.store()))
                    .report(target, kind);
        } catch (IllegalArgumentException e) {
            throw ApiError.badRequest(e.getMessage());
        }
        if ("markdown".equals(format)) {
            ctx.contentType("text/markdown; charset=utf-8").result(ImpactMarkdown.render(report));
        } else {
            ctx.json(report);
        }
    }

    /** {@code PUT /api/datasets/{id}/owners} with {@code {"owner": "...", "kind": "person|team"}}. */
    void putOwner(Context ctx) {
        Catalog open = catalog.get();
        DatasetView dataset = dataset(ctx, open);
        JsonNode body;
        try {
            body = ApiJson.mapper().readTree(ctx.body());
        } catch (java.io.IOException e) {
            throw ApiError.badRequest("The body must be JSON: {\"owner\": \"…\", \"kind\": \"person\" or \"team\"}");
        }
        if (body == null || !body.isObject() || !body.hasNonNull("owner") || !body.get("owner").isTextual()) {
            throw ApiError.badRequest("The body must be a JSON object with a text 'owner' (and 'kind': person or team)");
        }
        String kind = body.hasNonNull("kind") ? body.get("kind").asText() : "person";
        try {
            new ManualOwners(open.ingestor(), new OwnerReader(open.store()))
                    .assign(dataset.id(), dataset.uri(), body.get("owner").asText(), kind, "api");
        } catch (IllegalArgumentException e) {
            throw ApiError.badRequest(e.getMessage());
        }
        owners(ctx, open, dataset);
    }

    /** {@code DELETE /api/datasets/{id}/owners/{owner}}. */
    void deleteOwner(Context ctx) {
        Catalog open = catalog.get();
        DatasetView dataset = dataset(ctx, open);
        try {
            new ManualOwners(open.ingestor(), new OwnerReader(open.store()))
                    .remove(dataset.id(), dataset.uri(), dataset.name(), ctx.pathParam("owner"), "api");
        } catch (ManualOwners.Refused e) {
            throw e.notFound() ? ApiError.notFound(e.getMessage()) : ApiError.conflict(e.getMessage());
        }
        owners(ctx, open, dataset);
    }

    private static void owners(Context ctx, Catalog open, DatasetView dataset) {
        ctx.json(new OwnerList(dataset.name(), OwnerList.of(new OwnerReader(open.store()),
                new Target(dataset.id(), dataset.name(), null, null))));
    }

    private static DatasetView dataset(Context ctx, Catalog open) {
        long id = Params.pathId(ctx, "id");
        return open.reader().dataset(id, null).orElseThrow(() -> ApiError.notFound("No dataset with id " + id));
    }

    private static Targets targets(Catalog open, LineageGraph graph) {
        return new Targets(open.reader(), new OwnerReader(open.store()), graph);
    }

    /** The graph as of {@code as_of} (or {@code asOf}) when given, else the live one. */
    private static LineageGraph graph(Context ctx, Catalog open) {
        Instant asOf = Params.asOf(ctx);
        String camel = Params.optional(ctx, "asOf");
        if (asOf == null && camel != null) {
            asOf = Params.parseTime(camel);
        }
        return asOf == null ? open.lineage() : LineageGraph.loadAsOf(open.store(), asOf);
    }

    private static Target target(java.util.function.Supplier<Target> resolve) {
        try {
            return resolve.get();
        } catch (TargetException e) {
            throw e.notFound() ? ApiError.notFound(e.getMessage()) : ApiError.badRequest(e.getMessage());
        }
    }
}
