package org.headwater.http;

import com.fasterxml.jackson.databind.ObjectMapper;
import io.javalin.Javalin;
import java.util.concurrent.CompletableFuture;
import io.javalin.http.HttpStatus;
import io.javalin.http.staticfiles.Location;
import io.javalin.json.JavalinJackson;
import org.headwater.Catalog;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/** The running HTTP server of one catalog. */
public final class ApiServer implements AutoCloseable {
    private static final Logger LOG = LoggerFactory.getLogger(ApiServer.class);

    /** Loopback only unless told otherwise: a catalog can describe personal data. */
    public static final String DEFAULT_HOST = "127.0.0.1";
    public static final int DEFAULT_PORT = 8470;

    private final Javalin app;
    private final String host;

    private ApiServer(Javalin app, String host) {
        this.app = app;
        this.host = host;
    }

    /** Starts serving {@code catalog} on {@code host:port}; port 0 picks a free port. */
    public static ApiServer start(Catalog catalog, String host, int port) {
        return start(CompletableFuture.completedFuture(catalog), host, port);
    }

    /**
     * Starts serving a catalog that may still be opening; until it is ready, {@code /api/health} answers
     * 503 with status {@code starting} and other endpoints answer 503.
     */
    public static ApiServer start(CompletableFuture<Catalog> opening, String host, int port) {
        CatalogHolder catalog = new CatalogHolder(opening);
        ObjectMapper mapper = ApiJson.mapper();
        var datasets = new DatasetRoutes(catalog);
        var search = new SearchRoutes(catalog);
        var scripts = new ScriptRoutes(catalog);
        var harvests = new HarvestRoutes(catalog);
        var runs = new RunRoutes(catalog);
        var whence = new WhenceRoutes(catalog);
        var freshness = new FreshnessRoutes(catalog);
        var ui = new UiRoutes(catalog);
        var lineage = new LineageRoutes(catalog);
        long startedAt = System.currentTimeMillis();
        Javalin app = Javalin.create(config -> {
            config.jsonMapper(new JavalinJackson(mapper, false));
            config.startup.showJavalinBanner = false;
            config.http.maxRequestSize = 1024 * 1024;
            config.staticFiles.add(files -> {
                files.hostedPath = "/";
                files.directory = "/headwater-web";
                files.location = Location.CLASSPATH;
            });
            config.routes.get("/api/health", ctx -> {
                if (!catalog.ready()) {
                    ctx.status(HttpStatus.SERVICE_UNAVAILABLE)
                            .json(new Health("starting", Version.current(), 0, 0, System.currentTimeMillis() - startedAt));
                    return;
                }
                var reader = catalog.get().reader();
                ctx.json(new Health("ok", Version.current(), reader.datasetCount(), reader.scriptCount(),
                        System.currentTimeMillis() - startedAt));
            });
            config.routes.get("/api/datasets", datasets::list);
            config.routes.get("/api/datasets/{id}", datasets::one);
            config.routes.get("/api/datasets/{id}/schema-history", datasets::schemaHistory);
            config.routes.get("/api/datasets/{id}/lineage", datasets::lineage);
            config.routes.get("/api/scripts/{id}/reads", scripts::reads);
            config.routes.get("/api/scripts/{id}/runs", scripts::runs);
            config.routes.get("/api/datasets/{id}/runs", datasets::runs);
            config.routes.get("/api/datasets/{id}/copies", datasets::copies);
            config.routes.put("/api/datasets/{id}/note", datasets::putNote);
            config.routes.get("/api/search", search::search);
            config.routes.get("/api/scripts", scripts::list);
            config.routes.get("/api/scripts/{id}", scripts::one);
            config.routes.post("/api/runs", runs::post);
            config.routes.get("/api/runs", whence::runs);
            config.routes.get("/api/whence", whence::whence);
            config.routes.get("/api/harvests", harvests::list);
            config.routes.get("/api/harvests/{id}", harvests::one);
            config.routes.get("/api/freshness", freshness::all);
            config.routes.get("/api/freshness/history", freshness::history);
            config.routes.get("/api/datasets/{id}/freshness", freshness::one);
            config.routes.put("/api/datasets/{id}/freshness-policy", freshness::putPolicy);
            config.routes.get("/api/ui/overview", ui::overview);
            config.routes.get("/api/ui/figure/{id}", ui::figure);
            config.routes.get("/api/datasets/{id}/upstream", lineage::upstream);
            config.routes.get("/api/datasets/{id}/downstream", lineage::downstream);
            config.routes.get("/api/impact", lineage::impact);
            config.routes.put("/api/datasets/{id}/owners", lineage::putOwner);
            config.routes.delete("/api/datasets/{id}/owners/{owner}", lineage::deleteOwner);
            config.routes.exception(ApiError.class, (e, ctx) ->
                    ctx.status(e.status()).json(new ApiError.Body(e.code(), e.getMessage())));
            config.routes.exception(Exception.class, (e, ctx) -> {
                // Never a stack trace to the caller; the log keeps it for whoever runs the server.
                LOG.error("Request {} {} failed", ctx.method(), ctx.path(), e);
                ctx.status(HttpStatus.INTERNAL_SERVER_ERROR)
                        .json(new ApiError.Body("internal", "The server could not answer this request; see its log"));
            });
            config.routes.error(404, ctx -> {
                if (ctx.path().startsWith("/api/") && ctx.result() == null) {
                    ctx.json(new ApiError.Body("not_found", "No such endpoint: " + ctx.method() + " " + ctx.path()));
                }
            });
        });
        app.start(host, port);
        return new ApiServer(app, host);
    }

    public int port() {
        return app.port();
    }

    /** The address people open in a browser. */
    public String url() {
        return "http://" + (host.contains(":") ? "[" + host + "]" : host) + ":" + port() + "/";
    }

    @Override
    public void close() {
        app.stop();
    }

    /** The answer of {@code /api/health}. */
    public record Health(String status, String version, int datasets, int scripts, long uptimeMillis) {
    }
}
