package org.headwater.http;

import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.RUN_IO;
import static org.headwater.store.schema.Tables.SOURCE;

import io.javalin.http.Context;
import java.io.IOException;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.store.Views.DatasetView;
import org.jooq.impl.DSL;

/**
 * Small read-only answers only the web UI needs: the newcomer's overview of the catalog, and the bytes of
 * a figure for its preview.
 */
final class UiRoutes {
    /** Figure formats the preview shows, with the media type they are served as. */
    private static final Map<String, String> FIGURE_TYPES = Map.of(
            "png", "image/png", "jpeg", "image/jpeg", "jpg", "image/jpeg", "gif", "image/gif",
            "svg", "image/svg+xml", "pdf", "application/pdf");
    private static final long MAX_FIGURE_BYTES = 32L * 1024 * 1024;
    private static final int OVERVIEW_SCAN = 5000;

    private final CatalogHolder catalog;

    UiRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    /** A dataset in the overview, with how often other things use it. */
    record Listed(long id, String name, String kind, String format, java.time.Instant modifiedAt, int uses) {
    }

    /** What a newcomer sees before typing: what kinds of things there are, the most used, the latest changed. */
    record Overview(int datasets, int scripts, Map<String, Integer> kinds, List<Listed> mostUsed, List<Listed> recent) {
    }

    void overview(Context ctx) {
        var reader = catalog.get().reader();
        List<DatasetSummary> all = reader.datasets(null, 0, OVERVIEW_SCAN, null).stream()
                .filter(DatasetSummary::present).toList();
        Map<Long, Integer> uses = uses();
        Map<String, Integer> kinds = new TreeMap<>();
        all.forEach(d -> kinds.merge(d.kind(), 1, Integer::sum));
        Comparator<DatasetSummary> byName = Comparator.comparing(DatasetSummary::name);
        List<Listed> mostUsed = all.stream().filter(d -> uses.getOrDefault(d.id(), 0) > 0)
                .sorted(Comparator.<DatasetSummary>comparingInt(d -> -uses.getOrDefault(d.id(), 0)).thenComparing(byName))
                .limit(6).map(d -> listed(d, uses)).toList();
        List<Listed> recent = all.stream().filter(d -> d.modifiedAt() != null)
                .sorted(Comparator.comparing(DatasetSummary::modifiedAt).reversed().thenComparing(byName))
                .limit(6).map(d -> listed(d, uses)).toList();
        ctx.json(new Overview(reader.datasetCount(), reader.scriptCount(), kinds, mostUsed, recent));
    }

    /** Uses of a dataset: current lineage edges that read it plus run reads of it. */
    private Map<Long, Integer> uses() {
        var db = catalog.get().store().dsl();
        Map<Long, Integer> uses = new HashMap<>();
        db.select(LINEAGE_EDGE.SOURCE_DATASET_ID, DSL.count()).from(LINEAGE_EDGE).where(LINEAGE_EDGE.VALID_TO.isNull())
                .groupBy(LINEAGE_EDGE.SOURCE_DATASET_ID)
                .forEach(r -> uses.merge(r.value1(), r.value2(), Integer::sum));
        db.select(RUN_IO.DATASET_ID, DSL.count()).from(RUN_IO).where(RUN_IO.DIRECTION.eq("read"))
                .groupBy(RUN_IO.DATASET_ID)
                .forEach(r -> uses.merge(r.value1(), r.value2(), Integer::sum));
        return uses;
    }

    private static Listed listed(DatasetSummary d, Map<Long, Integer> uses) {
        return new Listed(d.id(), d.name(), d.kind(), d.format(), d.modifiedAt(), uses.getOrDefault(d.id(), 0));
    }

    /**
     * The bytes of a figure dataset, for its preview. Only figures, only files inside a folder the catalog
     * harvests, and only as they are now: anything else is a 404, so this cannot be used to read other files
     * of the server's machine. The answer is sandboxed so that an SVG opened on its own runs no script.
     */
    /** Datasets the lineage view reads in one answer; past it the answer says {@code truncated}. */
    static final int NEIGHBOURHOOD_LIMIT = 1000;

    /**
     * The lineage view's starting picture in one answer: every dataset within {@code depth} links of the
     * centre, either way, with the same report {@code /api/datasets/{id}/lineage} gives, nearest first.
     * One request instead of one per box, so a 500-box view neither waits on 500 round trips nor runs
     * into the rate limit.
     */
    record Neighbourhood(long centre, int depth, boolean truncated, List<Box> datasets, Map<Long, String> kinds) {
    }

    /** One dataset of the neighbourhood: how far from the centre, and its lineage report. */
    record Box(long id, String kind, int distance, org.headwater.lineage.LineageReport.Report report) {
    }

    void neighbourhood(Context ctx) {
        long centre = Params.pathId(ctx, "id");
        int depth = Params.intParam(ctx, "depth", 2, 0, 50);
        var reader = catalog.get().reader();
        java.time.Instant asOf = Params.asOf(ctx);
        Map<Long, List<String>> recentRuns = new HashMap<>();
        DatasetView start = reader.lineageView(centre, asOf, recentRuns)
                .orElseThrow(() -> ApiError.notFound("No dataset with id " + centre));
        List<Box> boxes = new java.util.ArrayList<>();
        java.util.Set<Long> beyond = new java.util.HashSet<>();
        Map<Long, Integer> distance = new HashMap<>(Map.of(centre, 0));
        java.util.ArrayDeque<DatasetView> queue = new java.util.ArrayDeque<>(List.of(start));
        boolean truncated = false;
        while (!queue.isEmpty()) {
            DatasetView d = queue.poll();
            int at = distance.get(d.id());
            boxes.add(new Box(d.id(), d.kind(), at, org.headwater.lineage.LineageReport.of(reader, d)));
            int next = at + 1;
            if (next > depth) {
                d.upstream().forEach(e -> beyond.add(e.datasetId()));
                d.downstream().forEach(e -> beyond.add(e.datasetId()));
                continue;
            }
            for (var e : java.util.stream.Stream.concat(d.upstream().stream(), d.downstream().stream()).toList()) {
                if (distance.containsKey(e.datasetId())) {
                    continue;
                }
                if (distance.size() >= NEIGHBOURHOOD_LIMIT) {
                    truncated = true;
                    break;
                }
                distance.put(e.datasetId(), next);
                reader.lineageView(e.datasetId(), asOf, recentRuns).ifPresent(queue::add);
            }
        }
        // the kinds of the boxes one step past the edge, shown (with their sign) when one is opened
        beyond.removeAll(distance.keySet());
        Map<Long, String> kinds = new TreeMap<>();
        if (!beyond.isEmpty()) {
            catalog.get().store().dsl().select(org.headwater.store.schema.Tables.DATASET.ID, org.headwater.store.schema.Tables.DATASET.KIND)
                    .from(org.headwater.store.schema.Tables.DATASET).where(org.headwater.store.schema.Tables.DATASET.ID.in(beyond))
                    .forEach(r -> kinds.put(r.value1(), r.value2()));
        }
        boxes.forEach(b -> kinds.put(b.id(), b.kind()));
        ctx.json(new Neighbourhood(centre, depth, truncated, boxes, kinds));
    }

    void figure(Context ctx) throws IOException {
        long id = Params.pathId(ctx, "id");
        DatasetView d = catalog.get().reader().dataset(id, null)
                .orElseThrow(() -> ApiError.notFound("No dataset with id " + id));
        String type = d.format() == null ? null : FIGURE_TYPES.get(d.format());
        if (!"figure".equals(d.kind()) || type == null || !d.present()) {
            throw ApiError.notFound("Dataset " + id + " is not a present figure");
        }
        Path file = localFile(d.uri());
        if (file == null || !underHarvestedRoot(file) || !Files.isRegularFile(file)) {
            throw ApiError.notFound("The file of dataset " + id + " is not inside a harvested folder");
        }
        if (Files.size(file) > MAX_FIGURE_BYTES) {
            throw ApiError.notFound("The figure of dataset " + id + " is larger than the preview serves");
        }
        ctx.header("Content-Security-Policy", "default-src 'none'; img-src 'self' data:; style-src 'unsafe-inline'; sandbox");
        ctx.header("X-Content-Type-Options", "nosniff");
        ctx.header("Cache-Control", "no-store");
        ctx.contentType(type).result(Files.readAllBytes(file));
    }

    private static Path localFile(String uri) {
        try {
            URI parsed = URI.create(uri);
            return "file".equals(parsed.getScheme()) ? Path.of(parsed).toRealPath() : null;
        } catch (IllegalArgumentException | IOException | java.nio.file.FileSystemNotFoundException e) {
            return null;
        }
    }

    private boolean underHarvestedRoot(Path file) {
        for (String root : catalog.get().store().dsl().select(SOURCE.ROOT_URI).from(SOURCE).fetch(SOURCE.ROOT_URI)) {
            Path folder = localFile(root);
            if (folder != null && file.startsWith(folder)) {
                return true;
            }
        }
        return false;
    }
}
