package org.headwater.http;

import io.javalin.http.Context;
import java.nio.file.InvalidPathException;
import java.nio.file.Path;
import java.util.regex.Pattern;
import org.headwater.lineage.Whence;

/** {@code /api/whence}: where a file or dataset came from; {@code /api/runs}: recent runs. */
final class WhenceRoutes {
    private static final Pattern SHA256 = Pattern.compile("[0-9a-f]{64}");

    private final CatalogHolder catalog;

    WhenceRoutes(CatalogHolder catalog) {
        this.catalog = catalog;
    }

    /**
     * By {@code sha256} (the browser hashes a dropped file locally and sends only the hash), by
     * {@code path} on the server's machine, by {@code stamp}, or by {@code dataset} id.
     */
    void whence(Context ctx) {
        Whence whence = new Whence(catalog.get().store());
        String dataset = Params.optional(ctx, "dataset");
        if (dataset != null) {
            long id = Params.longValue("dataset", dataset);
            if (catalog.get().reader().dataset(id, null).isEmpty()) {
                throw ApiError.notFound("No dataset with id " + id);
            }
            ctx.json(whence.ofDataset(id));
            return;
        }
        String sha = Params.optional(ctx, "sha256");
        if (sha != null && !SHA256.matcher(sha.toLowerCase()).matches()) {
            throw ApiError.badRequest("'sha256' must be 64 hexadecimal digits");
        }
        String path = Params.optional(ctx, "path");
        String stamp = Params.optional(ctx, "stamp");
        if (sha == null && path == null && stamp == null) {
            throw ApiError.badRequest("Give one of 'sha256', 'path', 'stamp' or 'dataset'");
        }
        String uri = null;
        if (path != null) {
            try {
                uri = Path.of(path).toAbsolutePath().normalize().toUri().toString();
            } catch (InvalidPathException e) {
                throw ApiError.badRequest("Not a path: '" + path + "'");
            }
        }
        String target = path != null ? path : sha != null ? sha : stamp;
        ctx.json(whence.of(target, uri, sha == null ? null : sha.toLowerCase(), stamp));
    }

    void runs(Context ctx) {
        ctx.json(catalog.get().reader().runs(Params.intParam(ctx, "limit", 50, 1, 1000)));
    }
}
