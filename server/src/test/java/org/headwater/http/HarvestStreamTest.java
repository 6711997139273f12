package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.InputStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.BlockingQueue;
import java.util.concurrent.LinkedBlockingQueue;
import java.util.concurrent.TimeUnit;
import okhttp3.OkHttpClient;
import okhttp3.Request;
import okhttp3.Response;
import okhttp3.sse.EventSource;
import okhttp3.sse.EventSourceListener;
import okhttp3.sse.EventSources;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestTokens;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;

/**
 * The live harvest status stream at the HTTP level, read by OkHttp's server-sent-events client (an
 * implementation of the WHATWG HTML "Server-sent events" parsing rules independent of ours) while a real
 * folder harvest runs through the ingestion path.
 */
class HarvestStreamTest {
    @TempDir
    Path temp;

    Catalog catalog;
    ApiServer server;
    final OkHttpClient okhttp = new OkHttpClient.Builder().readTimeout(0, TimeUnit.SECONDS).build();

    @AfterEach
    void close() {
        if (server != null) {
            server.close();
        }
        if (catalog != null) {
            catalog.close();
        }
        okhttp.dispatcher().executorService().shutdown();
        okhttp.connectionPool().evictAll();
    }

    record Received(String id, String type, JsonNode data) {
    }

    /** Opens the stream; every event lands in the queue, a failure as type "failure" with the status. */
    BlockingQueue<Received> listen(String token, List<EventSource> opened) {
        BlockingQueue<Received> events = new LinkedBlockingQueue<>();
        Request.Builder request = new Request.Builder().url(server.url() + "api/harvest-events");
        if (token != null) {
            request.header("Authorization", TestTokens.bearer(token));
        }
        opened.add(EventSources.createFactory(okhttp).newEventSource(request.build(), new EventSourceListener() {
            @Override
            public void onEvent(EventSource source, String id, String type, String data) {
                try {
                    events.add(new Received(id, type, ApiJson.mapper().readTree(data)));
                } catch (Exception e) {
                    events.add(new Received(id, "unparsable", null));
                }
            }

            @Override
            public void onFailure(EventSource source, Throwable t, Response response) {
                events.add(new Received(null, "failure",
                        ApiJson.mapper().getNodeFactory().numberNode(response == null ? -1 : response.code())));
            }
        }));
        return events;
    }

    static Received next(BlockingQueue<Received> events) throws InterruptedException {
        Received r = events.poll(30, TimeUnit.SECONDS);
        assertThat(r).as("an event within 30 s").isNotNull();
        return r;
    }

    /** A folder of 60 small CSV files and one symbolic link, which a harvest refuses to follow. */
    Path folder() throws Exception {
        return fieldNotes(temp.resolve("field-notes"), 60, temp.resolve("outside.csv"));
    }

    /** {@code files} small CSV files of invented field notes and a link to {@code outside} (a refused link). */
    static Path fieldNotes(Path dir, int files, Path outside) throws java.io.IOException {
        Files.createDirectories(dir);
        for (int i = 0; i < files; i++) {
            Files.writeString(dir.resolve("plot_" + (char) ('a' + i % 26) + (i / 26) + ".csv"),
                    "plot,depth_cm,reading\n" + i + ",12," + (i * 0.5) + "\n", StandardCharsets.UTF_8);
        }
        Files.writeString(outside, "x\n1\n");
        Files.createSymbolicLink(dir.resolve("elsewhere.csv"), outside);
        return dir;
    }

    @Test
    void theStreamTellsAHarvestsStartProgressErrorsAndOutcomeAsItRuns() throws Exception {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        server = ApiServer.start(catalog, "127.0.0.1", 0);
        Path dir = folder();
        List<EventSource> opened = new ArrayList<>();
        BlockingQueue<Received> events = listen(null, opened);
        Received hello = next(events);
        assertThat(hello.type()).isEqualTo("hello");
        assertThat(hello.data().get("running").asInt()).isZero();

        HarvestSummary summary = catalog.harvestFolder(dir, false, HarvestProgress.NONE);

        List<Received> got = new ArrayList<>();
        do {
            got.add(next(events));
        } while (!got.get(got.size() - 1).type().equals("finished"));
        opened.forEach(EventSource::cancel);

        List<String> types = got.stream().map(Received::type).toList();
        assertThat(types.get(0)).isEqualTo("started");
        assertThat(types).contains("progress", "problem");
        assertThat(types.indexOf("finished")).isEqualTo(types.size() - 1);
        for (Received r : got) {
            assertThat(r.data().get("harvest_id").asLong()).isEqualTo(summary.harvestId());
            assertThat(r.data().get("source").asText()).isEqualTo(summary.source());
        }
        // expected: event ids increase, so a reconnecting EventSource sends the last one it saw as
        // Last-Event-ID (WHATWG HTML, "Server-sent events", the last event ID buffer)
        long previous = Long.parseLong(hello.id());
        for (Received r : got) {
            assertThat(Long.parseLong(r.id())).isGreaterThan(previous);
            previous = Long.parseLong(r.id());
        }
        // progress counts never go back and never pass the files in the folder (counted by the JDK's walk;
        // the link is refused, not seen)
        long files;
        try (var walk = Files.walk(dir)) {
            files = walk.filter(p -> Files.isRegularFile(p, java.nio.file.LinkOption.NOFOLLOW_LINKS)).count();
        }
        assertThat(files).isEqualTo(60);
        int last = 0;
        for (Received r : got) {
            if (r.type().equals("progress")) {
                int seen = r.data().get("files_seen").asInt();
                assertThat(seen).isBetween(last, (int) files);
                last = seen;
            }
        }
        Received error = got.stream().filter(r -> r.type().equals("problem")).findFirst().orElseThrow();
        // expected: README "Paths": a harvest never follows a link; one leading out of the folder is listed
        // with kind symlink_escape
        assertThat(error.data().get("kind").asText()).isEqualTo("symlink_escape");
        assertThat(error.data().get("uri").asText()).isEqualTo(dir.resolve("elsewhere.csv").toUri().toString());
        Received finished = got.get(got.size() - 1);
        // the outcome is the harvest's own summary and the stored record the list endpoint answers
        JsonNode stored = ApiJson.mapper().readTree(get(server.url() + "api/harvests/" + summary.harvestId(), null).body());
        assertThat(finished.data().get("status").asText()).isEqualTo(summary.status()).isEqualTo(stored.get("status").asText());
        assertThat(finished.data().get("counts").get("files_seen").asInt()).isEqualTo(summary.filesSeen());
        assertThat(finished.data().get("counts").get("datasets").asInt()).isEqualTo(60);
        assertThat(finished.data().get("counts").get("errors").asInt()).isEqualTo(summary.errors());
        assertThat(stored.get("error_list").toString()).contains("symlink_escape");
    }

    @Test
    void aStreamOpenedDuringAHarvestStartsWithWhatIsRunning() throws Exception {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        server = ApiServer.start(catalog, "127.0.0.1", 0);
        // a harvest of this process, driven step by step through the journal as a harvester drives it
        long source = new org.headwater.ingest.Sources(catalog.store(), java.time.Clock.systemUTC())
                .ensure("by-hand", "folder", "file:///nowhere/");
        long harvest = catalog.journal().start(source);
        catalog.journal().seen(harvest, 7);
        List<EventSource> opened = new ArrayList<>();
        BlockingQueue<Received> events = listen(null, opened);
        Received hello = next(events);
        assertThat(hello.data().get("running").asInt()).isEqualTo(1);
        Received running = next(events);
        assertThat(running.type()).isEqualTo("progress");
        assertThat(running.data().get("harvest_id").asLong()).isEqualTo(harvest);
        assertThat(running.data().get("files_seen").asInt()).isEqualTo(7);
        catalog.journal().finish(harvest, "ok", new org.headwater.ingest.HarvestJournal.Counts(7, 0, 0, 7, 0, 7, 0, 0));
        Received finished = next(events);
        assertThat(finished.type()).isEqualTo("finished");
        assertThat(finished.data().get("status").asText()).isEqualTo("ok");
        opened.forEach(EventSource::cancel);
    }

    @Test
    void withoutAnonymousReadTheStreamNeedsAToken() throws Exception {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        server = ApiServer.start(catalog, "127.0.0.1", 0, ServerSettings.defaults().withAnonymousRead(false));
        HttpResponse<String> refused = get(server.url() + "api/harvest-events", null);
        // expected: RFC 6750 section 3: a request without a token gets 401 with WWW-Authenticate: Bearer
        assertThat(refused.statusCode()).isEqualTo(401);
        assertThat(refused.headers().firstValue("WWW-Authenticate")).hasValue("Bearer");
        assertThat(refused.headers().firstValue("Content-Type").orElse("")).startsWith("application/problem+json");

        List<EventSource> opened = new ArrayList<>();
        BlockingQueue<Received> events = listen(TestTokens.create(catalog, Role.READER), opened);
        assertThat(next(events).type()).isEqualTo("hello");
        opened.forEach(EventSource::cancel);
    }

    @Test
    @Timeout(120)
    void pastTheLimitOfOpenStreamsTheServerSays503AndThePagePolls() throws Exception {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        server = ApiServer.start(catalog, "127.0.0.1", 0);
        // Once in a CI run (10th session) one of the 32 requests never got its response and the build hung; the
        // cause was not found. The client now speaks HTTP/1.1, one connection per stream as a browser's
        // EventSource does, instead of first offering an h2c upgrade (the JDK client's default), and the request
        // timeout turns any such hang into a failure with a message.
        HttpClient http = HttpClient.newBuilder().version(HttpClient.Version.HTTP_1_1).build();
        List<InputStream> open = new ArrayList<>();
        try {
            for (int i = 0; i < HarvestStream.MAX_CLIENTS; i++) {
                HttpResponse<InputStream> r = http.send(stream(), HttpResponse.BodyHandlers.ofInputStream());
                assertThat(r.statusCode()).isEqualTo(200);
                // expected: WHATWG HTML, "Server-sent events": the stream is served as text/event-stream
                assertThat(r.headers().firstValue("Content-Type").orElse("")).startsWith("text/event-stream");
                open.add(r.body());
                readUntilHello(r.body());
            }
            HttpResponse<String> over = http.send(stream(), HttpResponse.BodyHandlers.ofString());
            assertThat(over.statusCode()).isEqualTo(503);
            assertThat(ApiJson.mapper().readTree(over.body()).get("code").asText()).isEqualTo("unavailable");
        } finally {
            for (InputStream in : open) {
                in.close();
            }
        }
    }

    HttpRequest stream() {
        return HttpRequest.newBuilder(URI.create(server.url() + "api/harvest-events")).header("Accept", "text/event-stream")
                .timeout(java.time.Duration.ofSeconds(30)).build();
    }

    static void readUntilHello(InputStream in) throws Exception {
        StringBuilder seen = new StringBuilder();
        while (!seen.toString().contains("event: hello")) {
            int c = in.read();
            assertThat(c).as("the stream ended before its hello").isNotEqualTo(-1);
            seen.append((char) c);
        }
    }

    /** A progress listener that waits after each file, as a slow disk would. */
    static HarvestProgress slow(long millisPerFile) {
        return new HarvestProgress() {
            private int before;

            @Override
            public void filesSeen(int count) {
                // Called once per batch of files: the pause grows with the files the batch holds, so the
                // harvest lasts about millisPerFile per file however fast the ingestion path applies them.
                long pause = millisPerFile * Math.max(0, count - before);
                before = count;
                try {
                    Thread.sleep(pause);
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                }
            }

            @Override
            public void finished() {
            }
        };
    }

    static HttpResponse<String> get(String url, String token) throws Exception {
        HttpRequest.Builder b = HttpRequest.newBuilder(URI.create(url));
        if (token != null) {
            b.header("Authorization", TestTokens.bearer(token));
        }
        return HttpClient.newHttpClient().send(b.build(), HttpResponse.BodyHandlers.ofString());
    }
}
