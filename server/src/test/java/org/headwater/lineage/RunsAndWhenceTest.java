package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.access.Role;
import org.headwater.http.ApiServer;
import org.headwater.testing.TestTokens;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Run records through a really started server, and whence answers built from them. */
class RunsAndWhenceTest {
    private static final HttpClient HTTP = HttpClient.newHttpClient();
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;

    static String sha256(byte[] bytes) throws Exception {
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
    }

    static HttpResponse<String> post(ApiServer server, String token, String body) throws Exception {
        return HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + "api/runs"))
                .header("content-type", "application/json").header("authorization", TestTokens.bearer(token)).POST(HttpRequest.BodyPublishers.ofString(body)).build(),
                HttpResponse.BodyHandlers.ofString());
    }

    static JsonNode get(ApiServer server, String path) throws Exception {
        return JSON.readTree(HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + path)).build(),
                HttpResponse.BodyHandlers.ofString()).body());
    }

    @Test
    void aRunIsStoredOnceAndACopiedFigureLeadsBackToItsRunScriptAndInputs() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path input = lake.resolve("levels.csv");
        Files.writeString(input, "site,level\nA,1\n");
        Path script = lake.resolve("plot.py");
        Files.writeString(script, "# plots levels\n");
        Path figure = lake.resolve("levels.png");
        byte[] png = {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n', 0, 0, 0, 0, 'I', 'E', 'N', 'D', 1, 2, 3, 4};
        Files.write(figure, png);
        String record = """
                {"run_id": "7d1f0c2e-1111-4222-8333-944455556666", "client": "headwater-python/0.1.0",
                 "script": {"path": "%s", "sha256": "%s", "git_commit": null, "language": "python"},
                 "args": ["--site", "A"], "user": "analyst", "host": "lab-pc", "cwd": "%s",
                 "started_at": "2026-11-30T09:00:00.000Z", "ended_at": "2026-11-30T09:00:02.500Z",
                 "exit_code": 0, "exception": null,
                 "io": [{"path": "%s", "direction": "read", "bytes": 15, "sha256": "%s", "via": "pandas.read_csv",
                         "frame": {"columns": ["site", "level"], "dtypes": ["object", "int64"], "rows": 1}},
                        {"path": "%s", "direction": "write", "bytes": %d, "sha256": "%s", "via": "matplotlib.savefig"}]}
                """.formatted(script, sha256(Files.readAllBytes(script)), lake, input, sha256(Files.readAllBytes(input)),
                figure, png.length, sha256(png));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(post(server, token, record).statusCode()).isEqualTo(201);
            assertThat(post(server, token, record).statusCode()).isEqualTo(200); // the same run again: stored once
            assertThat(catalog.reader().runs(10)).hasSize(1);

            // The figure is copied elsewhere and renamed: found by its content.
            Path copy = Files.createDirectories(temp.resolve("report")).resolve("figure-3.png");
            Files.copy(figure, copy);
            Whence.Answer answer = new Whence(catalog.store()).of(copy.toString(), copy.toUri().toString(),
                    sha256(Files.readAllBytes(copy)), null);
            assertThat(answer.producers()).hasSize(1);
            Whence.Producer producer = answer.producers().get(0);
            assertThat(producer.script()).isEqualTo("plot.py");
            assertThat(producer.matchedBy()).isEqualTo("content");
            assertThat(producer.run().id()).isEqualTo("7d1f0c2e-1111-4222-8333-944455556666");
            assertThat(producer.run().user()).isEqualTo("analyst");
            assertThat(producer.run().args()).isEqualTo("[\"--site\",\"A\"]");
            assertThat(producer.inputs()).containsExactly(new Whence.Input("levels.csv", sha256(Files.readAllBytes(input))));

            // The same answer through the API, asked by hash only (what the browser sends).
            JsonNode api = get(server, "api/whence?sha256=" + sha256(png));
            assertThat(api.get("producers").get(0).get("run").get("id").asText()).isEqualTo("7d1f0c2e-1111-4222-8333-944455556666");
            // And the runtime edge from the input to the figure exists.
            long figureId = catalog.reader().findDatasets("levels.png").get(0).id();
            assertThat(catalog.reader().dataset(figureId, null).orElseThrow().upstream())
                    .extracting(e -> e.datasetName() + " " + e.evidence()).containsExactly("levels.csv runtime");
        }
    }

    @Test
    void malformedRunRecordsGetA400WithAMessage() throws Exception {
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            assertThat(post(server, token, "not json").statusCode()).isEqualTo(400);
            HttpResponse<String> noId = post(server, token, "{\"script\": {\"path\": \"/x.py\"}, \"started_at\": \"2026-01-01T00:00:00Z\"}");
            assertThat(noId.statusCode()).isEqualTo(400);
            assertThat(noId.body()).contains("'run_id' is required");
            HttpResponse<String> relative = post(server, token, "{\"run_id\": \"r1\", \"script\": {\"path\": \"x.py\"},"
                    + " \"started_at\": \"2026-01-01T00:00:00Z\"}");
            assertThat(relative.statusCode()).isEqualTo(400);
            assertThat(relative.body()).contains("must be absolute");
            HttpResponse<String> badTime = post(server, token, "{\"run_id\": \"r1\", \"script\": {\"path\": \"/x.py\"},"
                    + " \"started_at\": \"yesterday\"}");
            assertThat(badTime.statusCode()).isEqualTo(400);
            assertThat(catalog.reader().runs(10)).isEmpty();
        }
    }

    @Test
    void aStampedRunIdIsReadFromPngSvgAndPdf() {
        // PNG tEXt layout per ISO/IEC 15948 11.3.4.3: length, "tEXt", keyword, NUL, text, CRC (CRC not checked here).
        byte[] keyword = "headwater:run\0abc-123".getBytes(java.nio.charset.StandardCharsets.ISO_8859_1);
        java.nio.ByteBuffer png = java.nio.ByteBuffer.allocate(8 + 12 + keyword.length + 12);
        png.put(new byte[] {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'});
        png.putInt(keyword.length).put("tEXt".getBytes()).put(keyword).putInt(0);
        png.putInt(0).put("IEND".getBytes()).putInt(0);
        assertThat(StampReader.runId(png.array())).contains("abc-123");
        String svg = "<svg xmlns=\"http://www.w3.org/2000/svg\"><metadata><headwater:run xmlns:headwater=\"urn:headwater:run\">"
                + "r-9</headwater:run></metadata></svg>";
        assertThat(StampReader.runId(svg.getBytes())).contains("r-9");
        String pdf = "%PDF-1.4\n1 0 obj << /Title (x) /HeadwaterRun (old) >> endobj\n7 0 obj << /HeadwaterRun (new-run) >> endobj\n";
        assertThat(StampReader.runId(pdf.getBytes())).contains("new-run");
    }

    @Test
    void edgesFoundInCodeAreConfirmedByRunsOrFlaggedWhenRecentRunsNeverDidThem() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path input = lake.resolve("levels.csv");
        Files.writeString(input, "site,level\nA,1\n");
        Path script = lake.resolve("plot.py");
        Files.writeString(script, String.join("\n", "import pandas as pd", "import matplotlib.pyplot as plt",
                "frame = pd.read_csv('levels.csv')", "plt.savefig('levels.png')", "frame.to_csv('summary.csv')", ""));
        Path figure = lake.resolve("levels.png");
        Files.write(figure, new byte[] {1, 2, 3});
        String record = """
                {"run_id": "run-1", "script": {"path": "%s", "sha256": "%s"}, "started_at": "2026-11-30T09:00:00Z",
                 "exit_code": 0, "io": [{"path": "%s", "direction": "read", "sha256": "%s"},
                                        {"path": "%s", "direction": "write", "sha256": "%s"}]}
                """.formatted(script, sha256(Files.readAllBytes(script)), input, sha256(Files.readAllBytes(input)),
                figure, sha256(Files.readAllBytes(figure)));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            long png = catalog.reader().findDatasets("levels.png").get(0).id();
            long summary = catalog.reader().findDatasets("summary.csv").get(0).id();
            // Before any run: found in the code only.
            assertThat(catalog.reader().dataset(summary, null).orElseThrow().upstream())
                    .extracting(e -> e.corroboration()).containsExactly("static only");
            assertThat(post(server, token, record).statusCode()).isEqualTo(201);

            // The run read levels.csv and wrote levels.png: both edges into the figure agree, the static one's
            // confidence combines with the run's (1 - (1 - 1.0)(1 - 1.0) = 1.0). It never wrote summary.csv.
            assertThat(catalog.reader().dataset(png, null).orElseThrow().upstream())
                    .extracting(e -> e.evidence() + " " + e.corroboration() + " " + e.combinedConfidence())
                    .containsExactlyInAnyOrder("static static and runtime 1.0", "runtime static and runtime 1.0");
            assertThat(catalog.reader().dataset(summary, null).orElseThrow().upstream())
                    .extracting(e -> e.corroboration()).containsExactly("static, not seen in recent runs");
            long scriptId = catalog.reader().findScripts("plot.py").get(0).id();
            assertThat(catalog.reader().runsOfScript(scriptId, 10)).extracting(r -> r.id()).containsExactly("run-1");
            long levels = catalog.reader().findDatasets("levels.csv").get(0).id();
            assertThat(get(server, "api/datasets/" + levels + "/runs").get(0).get("id").asText()).isEqualTo("run-1");
        }
    }
}
