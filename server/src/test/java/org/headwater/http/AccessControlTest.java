package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.access.Tokens;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestTokens;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Tokens, roles, CSRF rules, security headers and the audit log, through a really started server. */
class AccessControlTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    static Path temp;

    static Catalog catalog;
    static ApiServer server;
    static long datasetId;
    static String reader;
    static String editor;
    static String harvester;
    static String admin;

    @BeforeAll
    static void start() throws Exception {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
        server = ApiServer.start(catalog, "127.0.0.1", 0);
        reader = TestTokens.create(catalog, Role.READER);
        editor = TestTokens.create(catalog, Role.EDITOR);
        harvester = TestTokens.create(catalog, Role.HARVESTER);
        admin = TestTokens.create(catalog, Role.ADMIN);
        datasetId = catalog.reader().findDatasets("stations/station_register.csv").get(0).id();
    }

    @AfterAll
    static void stop() {
        if (server != null) {
            server.close();
        }
        if (catalog != null) {
            catalog.close();
        }
    }

    record Answer(int status, JsonNode body, HttpResponse<String> raw) {
    }

    static Answer send(String method, String path, String token, String contentType, String body) throws Exception {
        HttpRequest.Builder request = HttpRequest.newBuilder(URI.create(server.url() + path.substring(1)))
                .method(method, body == null ? HttpRequest.BodyPublishers.noBody() : HttpRequest.BodyPublishers.ofString(body));
        if (token != null) {
            request.header("Authorization", TestTokens.bearer(token));
        }
        if (contentType != null) {
            request.header("Content-Type", contentType);
        }
        HttpResponse<String> response = HTTP.send(request.build(), HttpResponse.BodyHandlers.ofString());
        String type = response.headers().firstValue("content-type").orElse("");
        boolean json = type.startsWith("application/json") || type.startsWith(Problem.MEDIA_TYPE);
        return new Answer(response.statusCode(), json ? JSON.readTree(response.body()) : null, response);
    }

    /** Every write route the server registers, with a concrete path and a body its handler accepts. */
    static List<ApiServer.Route> writeRoutes() {
        return server.routes().stream().filter(r -> !r.method().equals("GET")).toList();
    }

    static String concrete(String template) {
        return template.replaceAll("\\{[^}]+}", Long.toString(datasetId));
    }

    static String runRecord(String runId) {
        Path script = Workspaces.demo().resolve("scripts/clean_readings.py").toAbsolutePath();
        return "{\"run_id\": \"" + runId + "\", \"script\": {\"path\": \"" + script + "\"},"
                + " \"started_at\": \"2026-06-01T08:00:00Z\", \"io\": []}";
    }

    @Test
    void everyWriteRouteDeclaresARoleAboveReader() {
        assertThat(writeRoutes()).isNotEmpty();
        assertThat(writeRoutes()).allSatisfy(r -> assertThat(r.role()).as(r.method() + " " + r.path())
                .isNotNull().isNotEqualTo(Role.READER));
    }

    @Test
    void everyWriteRouteRefusesCallersWithoutATokenOrWithTheWrongRole() throws Exception {
        for (ApiServer.Route route : writeRoutes()) {
            String path = concrete(route.path());
            Answer none = send(route.method(), path, null, "application/json", "{}");
            assertThat(none.status()).as(route.toString()).isEqualTo(401);
            // expected: RFC 6750 section 3, a 401 for a bearer-protected resource carries WWW-Authenticate: Bearer
            assertThat(none.raw().headers().firstValue("www-authenticate").orElse("")).startsWith("Bearer");
            assertThat(none.body().get("code").asText()).isEqualTo("token_required");

            Answer wrong = send(route.method(), path, reader, "application/json", "{}");
            assertThat(wrong.status()).as(route.toString()).isEqualTo(403);
            assertThat(wrong.body().get("code").asText()).isEqualTo("role_insufficient");

            Answer forged = send(route.method(), path, "hw_" + "A".repeat(43), "application/json", "{}");
            assertThat(forged.status()).as(route.toString()).isEqualTo(401);
            assertThat(forged.body().get("code").asText()).isEqualTo("token_invalid");
        }
    }

    @Test
    void theFittingRoleAndAdminMayWrite() throws Exception {
        String note = "{\"description\": \"Stations of the upper reach\", \"tags\": [\"reference\"]}";
        assertThat(send("PUT", "/api/datasets/" + datasetId + "/note", editor, "application/json", note).status())
                .isEqualTo(200);
        assertThat(send("PUT", "/api/datasets/" + datasetId + "/note", admin, "application/json", note).status())
                .isEqualTo(200);
        assertThat(send("PUT", "/api/datasets/" + datasetId + "/note", harvester, "application/json", note).status())
                .isEqualTo(403);
        assertThat(send("POST", "/api/runs", harvester, "application/json", runRecord("access-run-1")).status())
                .isEqualTo(201);
        assertThat(send("POST", "/api/runs", editor, "application/json", runRecord("access-run-2")).status())
                .isEqualTo(403);
    }

    @Test
    void writesInTheContentTypesAFormCanSendAreRefused() throws Exception {
        // expected: the Fetch standard's CORS-safelisted Content-Type values, which a cross-site form or
        // fetch may send without a preflight: application/x-www-form-urlencoded, multipart/form-data, text/plain
        for (String type : List.of("application/x-www-form-urlencoded", "multipart/form-data; boundary=x", "text/plain")) {
            Answer answer = send("PUT", "/api/datasets/" + datasetId + "/note", editor, type, "{\"description\": \"x\"}");
            assertThat(answer.status()).as(type).isEqualTo(415);
            assertThat(answer.body().get("code").asText()).isEqualTo("unsupported_media_type");
        }
    }

    @Test
    void aTokenInACookieIsNotATokenAtAll() throws Exception {
        HttpRequest request = HttpRequest.newBuilder(URI.create(server.url() + "api/datasets/" + datasetId + "/note"))
                .header("Cookie", "token=" + editor).header("Content-Type", "application/json")
                .PUT(HttpRequest.BodyPublishers.ofString("{\"description\": \"x\"}")).build();
        assertThat(HTTP.send(request, HttpResponse.BodyHandlers.ofString()).statusCode()).isEqualTo(401);
    }

    @Test
    void revokedAndExpiredTokensStopWorking() throws Exception {
        Tokens tokens = new Tokens(catalog.store(), Clock.systemUTC());
        Tokens.Created revoked = tokens.create("to revoke", Role.EDITOR, null);
        String note = "{\"description\": \"revocation check\"}";
        assertThat(send("PUT", "/api/datasets/" + datasetId + "/note", revoked.secret(), "application/json", note).status())
                .isEqualTo(200);
        assertThat(tokens.revoke(revoked.token().id())).isTrue();
        assertThat(send("PUT", "/api/datasets/" + datasetId + "/note", revoked.secret(), "application/json", note).status())
                .isEqualTo(401);
        Tokens.Created expired = tokens.create("expired", Role.EDITOR, Duration.ZERO);
        assertThat(send("PUT", "/api/datasets/" + datasetId + "/note", expired.secret(), "application/json", note).status())
                .isEqualTo(401);
    }

    @Test
    void everyAnswerCarriesTheSecurityHeaders() throws Exception {
        for (String path : List.of("/", "/api/health", "/api/datasets/999999", "/api/nothing")) {
            HttpResponse<String> response = send("GET", path, null, null, null).raw();
            // expected: OWASP Secure Headers Project recommendations; CSP directives from CSP Level 3
            assertThat(response.headers().firstValue("content-security-policy").orElse(""))
                    .as(path).contains("default-src 'self'", "script-src 'self'", "object-src 'none'",
                            "frame-ancestors 'none'", "base-uri 'none'");
            assertThat(response.headers().firstValue("x-content-type-options")).as(path).hasValue("nosniff");
            assertThat(response.headers().firstValue("x-frame-options")).as(path).hasValue("DENY");
            assertThat(response.headers().firstValue("referrer-policy")).as(path).hasValue("no-referrer");
        }
    }

    @Test
    void theAuditLogRecordsEditsAndRefusalsAndOnlyAdminsReadIt() throws Exception {
        send("PUT", "/api/datasets/" + datasetId + "/note", editor, "application/json", "{\"description\": \"audited\"}");
        send("PUT", "/api/datasets/" + datasetId + "/note", null, "application/json", "{\"description\": \"refused\"}");
        assertThat(send("GET", "/api/audit", editor, null, null).status()).isEqualTo(403);
        assertThat(send("GET", "/api/audit", null, null, null).status()).isEqualTo(401);
        Answer log = send("GET", "/api/audit?limit=1000", admin, null, null);
        assertThat(log.status()).isEqualTo(200);
        String target = "PUT /api/datasets/" + datasetId + "/note";
        assertThat(log.body()).anySatisfy(e -> {
            assertThat(e.get("action").asText()).isEqualTo("edit");
            assertThat(e.get("target").asText()).isEqualTo(target);
            assertThat(e.get("status").asInt()).isEqualTo(200);
            assertThat(e.get("actor").asText()).isEqualTo("test editor");
        });
        assertThat(log.body()).anySatisfy(e -> {
            assertThat(e.get("action").asText()).isEqualTo("refused");
            assertThat(e.get("status").asInt()).isEqualTo(401);
        });
        // A secret never reaches the log or an answer.
        for (String secret : List.of(reader, editor, harvester, admin)) {
            assertThat(log.raw().body()).doesNotContain(secret);
        }
    }

    @Test
    void withoutAnonymousReadEveryReadNeedsAToken() throws Exception {
        try (ApiServer closed = ApiServer.start(catalog, "127.0.0.1", 0, ServerSettings.defaults().withAnonymousRead(false))) {
            HttpClient http = HttpClient.newHttpClient();
            for (String path : List.of("api/datasets", "api/search?q=nitrate", "metrics", "api/health")) {
                HttpResponse<String> anonymous = http.send(HttpRequest.newBuilder(URI.create(closed.url() + path)).build(),
                        HttpResponse.BodyHandlers.ofString());
                assertThat(anonymous.statusCode()).as(path).isEqualTo(401);
                HttpResponse<String> withToken = http.send(HttpRequest.newBuilder(URI.create(closed.url() + path))
                        .header("Authorization", TestTokens.bearer(reader)).build(), HttpResponse.BodyHandlers.ofString());
                assertThat(withToken.statusCode()).as(path).isEqualTo(200);
            }
            // The web UI's files hold no catalog data and stay reachable, so that a user can enter a token.
            assertThat(http.send(HttpRequest.newBuilder(URI.create(closed.url())).build(),
                    HttpResponse.BodyHandlers.ofString()).statusCode()).isEqualTo(200);
        }
    }

    @Test
    void theStoreKeepsOnlyTheHashOfASecret() throws Exception {
        Tokens.Created created = new Tokens(catalog.store(), Clock.systemUTC()).create("hash check", Role.READER, null);
        // 32 random bytes in unpadded base64url are 43 characters (RFC 4648 section 5), after the "hw_" prefix.
        assertThat(created.secret()).startsWith("hw_").hasSize(3 + 43);
        var stored = catalog.store().dsl().fetch("select * from api_token where id = " + created.token().id());
        assertThat(stored.formatCSV()).doesNotContain(created.secret())
                .contains(org.headwater.testing.Sha256.hex(created.secret()));
    }

    @Test
    void aWriteRouteThatDeclaresNoRoleIsRefusedToEveryone() throws Exception {
        // A second server on the same catalog with one extra route registered the careless way.
        var access = new Access(new CatalogHolder(java.util.concurrent.CompletableFuture.completedFuture(catalog)),
                ServerSettings.defaults());
        var app = io.javalin.Javalin.create(config -> {
            config.routes.beforeMatched(access::check);
            config.routes.post("/api/careless", ctx -> ctx.result("done"));
            Errors.register(config.routes);
        }).start("127.0.0.1", 0);
        try {
            for (String token : List.of(reader, editor, harvester, admin)) {
                HttpResponse<String> answer = HTTP.send(HttpRequest.newBuilder(
                        URI.create("http://127.0.0.1:" + app.port() + "/api/careless"))
                        .header("Authorization", TestTokens.bearer(token)).header("Content-Type", "application/json")
                        .POST(HttpRequest.BodyPublishers.ofString("{}")).build(), HttpResponse.BodyHandlers.ofString());
                assertThat(answer.statusCode()).isEqualTo(403);
                assertThat(JSON.readTree(answer.body()).get("code").asText()).isEqualTo("no_role_declared");
            }
        } finally {
            app.stop();
        }
    }
}
