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
import java.time.Duration;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestTokens;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Body limits, rate limits, query time limits and conflicts, each answered as an RFC 9457 problem. */
class LimitsTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    static Path temp;

    static Catalog catalog;
    static String harvester;

    @BeforeAll
    static void open() {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        harvester = TestTokens.create(catalog, Role.HARVESTER);
    }

    @AfterAll
    static void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    static HttpResponse<String> post(ApiServer server, String path, String body) throws Exception {
        return HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + path))
                .header("Authorization", TestTokens.bearer(harvester)).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(body)).build(), HttpResponse.BodyHandlers.ofString());
    }

    static JsonNode problem(HttpResponse<String> response) throws Exception {
        // expected: RFC 9457 section 3, media type application/problem+json
        assertThat(response.headers().firstValue("content-type").orElse("")).startsWith("application/problem+json");
        JsonNode body = JSON.readTree(response.body());
        assertThat(body.get("status").asInt()).isEqualTo(response.statusCode());
        assertThat(response.body()).doesNotContain("Exception").doesNotContain("at org.");
        return body;
    }

    static String run(String id, String startedAt) {
        return "{\"run_id\": \"" + id + "\", \"script\": {\"path\": \"/lab/fit.py\"}, \"started_at\": \"" + startedAt + "\"}";
    }

    @Test
    void aBodyOverTheLimitGets413AndNothingIsStored() throws Exception {
        try (ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0, ServerSettings.defaults().withMaxBody(2048))) {
            String big = run("too-big", "2026-06-01T08:00:00Z").replace("}", ", \"exception\": \"" + "x".repeat(4096) + "\"}");
            HttpResponse<String> answer = post(server, "api/runs", big);
            // expected: RFC 9110 section 15.5.14, 413 Content Too Large
            assertThat(answer.statusCode()).isEqualTo(413);
            assertThat(problem(answer).get("code").asText()).isEqualTo("body_too_large");
            assertThat(catalog.reader().runs(100)).noneMatch(r -> r.id().equals("too-big"));
        }
    }

    @Test
    void aCallerOverItsRateGets429WithRetryAfter() throws Exception {
        try (ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0, ServerSettings.defaults().withRate(0.5, 3))) {
            int[] statuses = new int[4];
            HttpResponse<String> last = null;
            for (int i = 0; i < 4; i++) {
                last = HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + "api/datasets")).build(),
                        HttpResponse.BodyHandlers.ofString());
                statuses[i] = last.statusCode();
            }
            assertThat(statuses).containsExactly(200, 200, 200, 429);
            // expected: RFC 6585 section 4 (429 may carry Retry-After) and RFC 9110 section 10.2.3 (delay-seconds);
            // at 0.5 requests per second an empty bucket refills one request in 2 s
            assertThat(last.headers().firstValue("retry-after")).hasValue("2");
            assertThat(problem(last).get("code").asText()).isEqualTo("rate_limited");
            // Another caller (a token) has its own bucket.
            HttpResponse<String> other = HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + "api/datasets"))
                    .header("Authorization", TestTokens.bearer(harvester)).build(), HttpResponse.BodyHandlers.ofString());
            assertThat(other.statusCode()).isEqualTo(200);
        }
    }

    @Test
    void aQueryOverItsTimeGets503() throws Exception {
        try (QueryLimit limit = new QueryLimit(Duration.ofMillis(200))) {
            var app = io.javalin.Javalin.create(config -> {
                config.routes.get("/api/slow", limit.bounded(ctx -> {
                    Thread.sleep(3_000);
                    ctx.result("late");
                }));
                config.routes.get("/api/quick", limit.bounded(ctx -> ctx.result("quick")));
                Errors.register(config.routes);
            }).start("127.0.0.1", 0);
            try {
                String base = "http://127.0.0.1:" + app.port();
                HttpResponse<String> slow = HTTP.send(HttpRequest.newBuilder(URI.create(base + "/api/slow")).build(),
                        HttpResponse.BodyHandlers.ofString());
                assertThat(slow.statusCode()).isEqualTo(503);
                assertThat(problem(slow).get("code").asText()).isEqualTo("query_timeout");
                HttpResponse<String> quick = HTTP.send(HttpRequest.newBuilder(URI.create(base + "/api/quick")).build(),
                        HttpResponse.BodyHandlers.ofString());
                assertThat(quick.body()).isEqualTo("quick");
            } finally {
                app.stop();
            }
        }
    }

    @Test
    void theSameRunIdForAnotherRunIsAConflictAndAnIdenticalResendIsNot() throws Exception {
        try (ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            assertThat(post(server, "api/runs", run("conflicting", "2026-06-01T08:00:00Z")).statusCode()).isEqualTo(201);
            assertThat(post(server, "api/runs", run("conflicting", "2026-06-01T08:00:00Z")).statusCode()).isEqualTo(200);
            HttpResponse<String> other = post(server, "api/runs", run("conflicting", "2026-06-02T08:00:00Z"));
            // expected: RFC 9110 section 15.5.10, 409 Conflict with the state of the resource
            assertThat(other.statusCode()).isEqualTo(409);
            assertThat(problem(other).get("code").asText()).isEqualTo("conflict");
        }
    }

    @Test
    void malformedJsonIs400WithAMessage() throws Exception {
        try (ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            HttpResponse<String> bad = post(server, "api/runs", "{\"run_id\": ");
            assertThat(bad.statusCode()).isEqualTo(400);
            assertThat(problem(bad).get("code").asText()).isEqualTo("bad_request");
            assertThat(problem(bad).get("detail").asText()).isEqualTo("The run record is not valid JSON");
        }
    }

    @Test
    void aMalformedUriIsAProblemDocumentNotJettysHtmlPage() throws Exception {
        try (ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0);
                java.net.Socket socket = new java.net.Socket("127.0.0.1", server.port())) {
            // "%zz" is not a percent-encoding (RFC 3986 section 2.1: "%" HEXDIG HEXDIG), so Jetty refuses the
            // URI before any route sees it; java.net.URI would refuse it too, hence the raw socket.
            socket.getOutputStream().write(("GET /api/datasets/%zz HTTP/1.1\r\nHost: 127.0.0.1\r\n"
                    + "Connection: close\r\n\r\n").getBytes(java.nio.charset.StandardCharsets.US_ASCII));
            String answer = new String(socket.getInputStream().readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
            String head = answer.substring(0, answer.indexOf("\r\n\r\n")).toLowerCase(java.util.Locale.ROOT);
            JsonNode body = JSON.readTree(answer.substring(answer.indexOf("\r\n\r\n") + 4));
            assertThat(head).startsWith("http/1.1 400");
            // expected: RFC 9457 section 3, media type application/problem+json
            assertThat(head).contains("content-type: application/problem+json");
            assertThat(head).contains("x-content-type-options: nosniff");
            assertThat(body.get("status").asInt()).isEqualTo(400);
            assertThat(body.get("code").asText()).isEqualTo("bad_request");
            assertThat(body.get("detail").asText()).startsWith("The server could not read the request: ");
            assertThat(body.get("instance").isNull()).isTrue();
        }
    }
}
