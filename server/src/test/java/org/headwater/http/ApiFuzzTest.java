package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Random;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.Mutations;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestTokens;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;

/**
 * Random JSON, mutated valid bodies and random query values for every endpoint the server registers
 * (so endpoints added later are fuzzed too): never a 500, every refusal an RFC 9457 problem.
 */
class ApiFuzzTest {
    private static final HttpClient HTTP = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
    private static final List<String> PARAMS = List.of("q", "kind", "limit", "offset", "as_of", "match", "sha256",
            "path", "stamp", "dataset", "since", "action");
    private static final String VALID_RUN = "{\"run_id\": \"fuzz-0\", \"client\": \"fuzz\", \"script\": {\"path\": \"/lab/a.py\","
            + " \"sha256\": null}, \"args\": [\"--x\"], \"started_at\": \"2026-06-01T08:00:00Z\", \"exit_code\": 0,"
            + " \"io\": [{\"path\": \"/lab/in.csv\", \"direction\": \"read\", \"bytes\": 10, \"frame\": {\"columns\": [\"a\"],"
            + " \"dtypes\": [\"int64\"], \"rows\": 3}}]}";
    private static final String VALID_NOTE = "{\"description\": \"Field notes\", \"tags\": [\"a\", \"b\"], \"author\": \"x\"}";

    private static Path temp;
    private static Catalog catalog;
    private static ApiServer server;
    private static String admin;
    private static List<ApiServer.Route> routes;

    @BeforeAll
    static void start() throws IOException {
        temp = Files.createTempDirectory("headwater-api-fuzz");
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
        // A high rate so that the fuzzer reaches the handlers instead of the rate limiter.
        server = ApiServer.start(catalog, "127.0.0.1", 0, ServerSettings.defaults().withRate(100_000, 100_000));
        admin = TestTokens.create(catalog, Role.ADMIN);
        routes = server.routes();
    }

    @AfterAll
    static void stop() {
        // Either may be missing when start() was skipped (no PostgreSQL test server for the second run).
        if (server != null) {
            server.close();
        }
        if (catalog != null) {
            catalog.close();
        }
    }

    /** Random JSON of bounded depth: every JSON type, odd numbers and strings included. */
    static String randomJson(Random r, int depth) {
        int pick = depth > 3 ? r.nextInt(6) : r.nextInt(8);
        return switch (pick) {
            case 0 -> "null";
            case 1 -> r.nextBoolean() ? "true" : "false";
            case 2 -> List.of("0", "-1", "1e308", "-0.0", "12345678901234567890", "3.14").get(r.nextInt(6));
            case 3 -> quoted(List.of("", "x", "/etc/passwd", "../../a", "2026-13-45", "\u0000", "é\u2028", "a".repeat(300))
                    .get(r.nextInt(8)));
            case 4 -> Integer.toString(r.nextInt());
            case 5 -> quoted(Long.toHexString(r.nextLong()));
            case 6 -> {
                StringBuilder b = new StringBuilder("[");
                for (int i = r.nextInt(4); i > 0; i--) {
                    b.append(randomJson(r, depth + 1)).append(i > 1 ? "," : "");
                }
                yield b.append(']').toString();
            }
            default -> {
                List<String> keys = List.of("run_id", "script", "path", "io", "direction", "started_at", "tags",
                        "description", "frame", "columns", "args", "exit_code", "author", "x");
                StringBuilder b = new StringBuilder("{");
                for (int i = r.nextInt(5); i > 0; i--) {
                    b.append(quoted(keys.get(r.nextInt(keys.size())))).append(':').append(randomJson(r, depth + 1))
                            .append(i > 1 ? "," : "");
                }
                yield b.append('}').toString();
            }
        };
    }

    static String quoted(String s) {
        StringBuilder b = new StringBuilder("\"");
        for (char c : s.toCharArray()) {
            if (c == '"' || c == '\\') {
                b.append('\\').append(c);
            } else if (c < 0x20) {
                b.append(String.format("\\u%04x", (int) c));
            } else {
                b.append(c);
            }
        }
        return b.append('"').toString();
    }

    static String body(Random r, long noise) {
        return switch (r.nextInt(3)) {
            case 0 -> randomJson(r, 0);
            case 1 -> new String(Mutations.mutate(VALID_RUN.getBytes(StandardCharsets.UTF_8), noise), StandardCharsets.UTF_8);
            default -> new String(Mutations.mutate(VALID_NOTE.getBytes(StandardCharsets.UTF_8), noise), StandardCharsets.UTF_8);
        };
    }

    static String path(ApiServer.Route route, Random r) {
        String id = List.of("1", "2", "5", "0", "-1", "99999999999", "abc", "1e3", "%00").get(r.nextInt(9));
        StringBuilder path = new StringBuilder(route.path().replaceAll("\\{[^}]+}", id));
        String sep = "?";
        for (int i = r.nextInt(4); i > 0; i--) {
            String value = List.of("", "nitrate", "-5", "0", "1000000", "2026-02-30", "yesterday", "*", "\"", "a b",
                    "file:///etc/passwd", "((((", "x".repeat(2000)).get(r.nextInt(13));
            path.append(sep).append(PARAMS.get(r.nextInt(PARAMS.size()))).append('=')
                    .append(URLEncoder.encode(value, StandardCharsets.UTF_8));
            sep = "&";
        }
        return path.toString();
    }

    @TestFactory
    java.util.stream.Stream<DynamicTest> noRequestToAnyEndpointGetsA500() {
        return org.headwater.testing.Fuzz.cases("request", 400, 5_000_000L, random ->
                request(org.headwater.testing.Fuzz.pick(random, routes), random.nextLong()));
    }

    private static void request(ApiServer.Route route, long noise) throws Exception {
        Random r = new Random(noise);
        String path = path(route, r);
        HttpRequest.Builder request = HttpRequest.newBuilder(URI.create(server.url() + path.substring(1)))
                .timeout(Duration.ofSeconds(20)).header("Authorization", TestTokens.bearer(admin));
        if (route.method().equals("GET")) {
            request.GET();
        } else {
            request.header("Content-Type", "application/json")
                    .method(route.method(), HttpRequest.BodyPublishers.ofString(body(r, noise)));
        }
        HttpResponse<String> answer;
        try {
            answer = HTTP.send(request.build(), HttpResponse.BodyHandlers.ofString());
        } catch (IOException first) {
            // The client may reuse a kept-alive connection the server has just closed (after a refused request
            // the server may close it, RFC 9112 section 9.6); a second try on a new connection must be answered.
            try {
                answer = HTTP.send(request.build(), HttpResponse.BodyHandlers.ofString());
            } catch (IOException e) {
                throw new AssertionError(route.method() + " " + path + " got no answer: " + e.getMessage(), e);
            }
        }
        assertThat(answer.statusCode()).as(route.method() + " " + path).isLessThan(500);
        if (answer.statusCode() >= 400 && answer.headers().firstValue("content-type").orElse("").startsWith("text/html")) {
            // Jetty refuses some URIs (an encoded NUL, RFC 3986 section 7.3) before routing, with its own 400 page;
            // known gap: that page is not a problem document.
            assertThat(answer.statusCode()).as(path).isEqualTo(400);
        } else if (answer.statusCode() >= 400) {
            // expected: RFC 9457 section 3, every error answer is a problem document
            assertThat(answer.headers().firstValue("content-type").orElse("")).as(path).startsWith(Problem.MEDIA_TYPE);
        }
    }
}
