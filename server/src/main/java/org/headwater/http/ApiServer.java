package org.headwater.http;

import com.fasterxml.jackson.databind.ObjectMapper;
import io.javalin.Javalin;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.atomic.AtomicReference;
import io.javalin.http.HttpStatus;
import io.javalin.http.staticfiles.Location;
import io.javalin.json.JavalinJackson;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.access.Roots;
import org.headwater.harvest.config.SourceSchedule;
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
    private final QueryLimit limit;
    private final AtomicReference<SourceSchedule> sources;
    private final HarvestStream harvestStream;

    private ApiServer(Javalin app, String host, QueryLimit limit,
            AtomicReference<SourceSchedule> sources,
            HarvestStream harvestStream) {
        this.app = app;
        this.host = host;
        this.limit = limit;
        this.sources = sources;
        this.harvestStream = harvestStream;
    }

    /** Lets {@code /api/sources} show and harvest the sources of {@code serve --config}. */
    public void offerSources(SourceSchedule schedule) {
        sources.set(schedule);
    }

    /** Starts serving {@code catalog} on {@code host:port} with default settings; port 0 picks a free port. */
    public static ApiServer start(Catalog catalog, String host, int port) {
        return start(CompletableFuture.completedFuture(catalog), host, port, ServerSettings.defaults());
    }

    /** Starts serving {@code catalog} with the given settings. */
    public static ApiServer start(Catalog catalog, String host, int port, ServerSettings settings) {
        return start(CompletableFuture.completedFuture(catalog), host, port, settings);
    }

    /**
     * Starts serving a catalog that may still be opening; until it is ready, {@code /api/health} answers
     * 503 with status {@code starting} and other endpoints answer 503.
     *
     * <p>Every route declares the role it needs where it is registered (the last argument); a read
     * without one needs {@link Role#READER}, a write without one is refused ({@link Access}).
     */
    public static ApiServer start(CompletableFuture<Catalog> opening, String host, int port, ServerSettings settings) {
        CatalogHolder catalog = new CatalogHolder(opening);
        ObjectMapper mapper = ApiJson.mapper();
        Roots roots = Roots.of(settings.roots());
        if (roots.unrestricted()) {
            LOG.warn("No --root given: run records may name any path on this machine");
        }
        var access = new Access(catalog, settings);
        var metrics = new Metrics();
        opening.thenAccept(metrics::bind);
        var limit = new QueryLimit(settings.queryTime());
        var datasets = new DatasetRoutes(catalog);
        var search = new SearchRoutes(catalog);
        var scripts = new ScriptRoutes(catalog);
        var harvests = new HarvestRoutes(catalog);
        var harvestStream = new HarvestStream(catalog, mapper);
        var runs = new RunRoutes(catalog, roots, access);
        var whence = new WhenceRoutes(catalog);
        var freshness = new FreshnessRoutes(catalog);
        var ui = new UiRoutes(catalog);
        var lineage = new LineageRoutes(catalog);
        var audit = new AuditRoutes(access);
        var sources = new AtomicReference<SourceSchedule>();
        var sourceRoutes = new SourceRoutes(sources);
        long startedAt = System.currentTimeMillis();
        Javalin app = Javalin.create(config -> {
            config.jsonMapper(new JavalinJackson(mapper, false));
            config.startup.showJavalinBanner = false;
            config.http.maxRequestSize = settings.maxBodyBytes();
            config.jetty.modifyServer(server -> server.setErrorHandler(new ProtocolErrors(mapper)));
            config.staticFiles.add(files -> {
                files.hostedPath = "/";
                files.directory = "/headwater-web";
                files.location = Location.CLASSPATH;
            });
            config.routes.before(SecurityHeaders::add);
            config.routes.before(metrics::start);
            config.routes.beforeMatched(access::check);
            config.routes.afterMatched(access::recordWrite);
            config.routes.after(metrics::stop);
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
            config.routes.get("/metrics", metrics::scrape);
            config.routes.get("/api/datasets", datasets::list);
            config.routes.get("/api/datasets/{id}", datasets::one);
            config.routes.get("/api/datasets/{id}/schema-history", datasets::schemaHistory);
            config.routes.get("/api/datasets/{id}/lineage", limit.bounded(datasets::lineage));
            config.routes.get("/api/scripts/{id}/reads", scripts::reads);
            config.routes.get("/api/scripts/{id}/runs", scripts::runs);
            config.routes.get("/api/datasets/{id}/runs", datasets::runs);
            config.routes.get("/api/datasets/{id}/copies", datasets::copies);
            config.routes.put("/api/datasets/{id}/note", datasets::putNote, Role.EDITOR);
            config.routes.get("/api/search", limit.bounded(search::search));
            config.routes.get("/api/scripts", scripts::list);
            config.routes.get("/api/scripts/{id}", scripts::one);
            config.routes.post("/api/runs", runs::post, Role.HARVESTER);
            config.routes.get("/api/runs", whence::runs);
            config.routes.get("/api/whence", limit.bounded(whence::whence));
            config.routes.get("/api/harvests", harvests::list);
            config.routes.get("/api/harvests/{id}", harvests::one);
            config.routes.get("/api/harvest-events", harvestStream::handle);
            config.routes.get("/api/freshness", freshness::all);
            config.routes.get("/api/freshness/history", freshness::history);
            config.routes.get("/api/datasets/{id}/freshness", freshness::one);
            config.routes.put("/api/datasets/{id}/freshness-policy", freshness::putPolicy, Role.EDITOR);
            config.routes.get("/api/ui/overview", ui::overview);
            config.routes.get("/api/ui/figure/{id}", ui::figure);
            config.routes.get("/api/ui/lineage/{id}", limit.bounded(ui::neighbourhood));
            config.routes.get("/api/datasets/{id}/upstream", limit.bounded(lineage::upstream));
            config.routes.get("/api/datasets/{id}/downstream", limit.bounded(lineage::downstream));
            config.routes.get("/api/impact", limit.bounded(lineage::impact));
            config.routes.put("/api/datasets/{id}/owners", lineage::putOwner, Role.EDITOR);
            config.routes.delete("/api/datasets/{id}/owners/{owner}", lineage::deleteOwner, Role.EDITOR);
            config.routes.get("/api/audit", audit::list, Role.ADMIN);
            config.routes.get("/api/sources", sourceRoutes::list);
            config.routes.post("/api/sources/{name}/harvest", sourceRoutes::harvest, Role.HARVESTER);
            Errors.register(config.routes);
        });
        app.start(host, port);
        return new ApiServer(app, host, limit, sources, harvestStream);
    }

    /** A registered endpoint with the role it declares (null: none declared). */
    public record Route(String method, String path, Role role) {
    }

    private static final java.util.Set<String> METHODS = java.util.Set.of("GET", "POST", "PUT", "PATCH", "DELETE");

    /** Every endpoint the server answers, for tests that check each write route's protection. */
    public java.util.List<Route> routes() {
        return app.unsafe.internalRouter.allHttpHandlers().stream()
                .map(parsed -> parsed.endpoint)
                .filter(e -> METHODS.contains(e.method.name()))
                .map(e -> {
                    var roles = e.metadata(io.javalin.security.Roles.class);
                    Role role = roles == null ? null : roles.getRoles().stream()
                            .filter(Role.class::isInstance).map(Role.class::cast).findFirst().orElse(null);
                    return new Route(e.method.name(), e.path, role);
                })
                .toList();
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
        harvestStream.close();
        app.stop();
        limit.close();
    }

    /** The answer of {@code /api/health}. */
    public record Health(String status, String version, int datasets, int scripts, long uptimeMillis) {
    }
}
