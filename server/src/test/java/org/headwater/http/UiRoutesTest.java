package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The web UI's own read-only endpoints: the overview and figure bytes. */
class UiRoutesTest {
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    static Path temp;

    static Catalog catalog;
    static ApiServer server;

    @BeforeAll
    static void start() throws IOException {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
        server = ApiServer.start(catalog, "127.0.0.1", 0);
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

    static HttpResponse<byte[]> get(String path) throws IOException, InterruptedException {
        return HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + path)).build(), HttpResponse.BodyHandlers.ofByteArray());
    }

    static long id(String name) {
        return catalog.reader().findDatasets(name).stream().filter(d -> d.name().equals(name)).findFirst().orElseThrow().id();
    }

    @Test
    void aPngFigureIsServedAsItsOwnBytesInASandbox() throws Exception {
        Path file = Workspaces.demo().resolve("bulletin/figures/fig1_no3_trend.png");
        HttpResponse<byte[]> r = get("api/ui/figure/" + id("bulletin/figures/fig1_no3_trend.png"));
        assertThat(r.statusCode()).isEqualTo(200);
        assertThat(r.body()).isEqualTo(Files.readAllBytes(file));
        // expected: PNG signature, W3C PNG specification section 5.2
        assertThat(Arrays.copyOf(r.body(), 8)).containsExactly(0x89, 'P', 'N', 'G', 0x0D, 0x0A, 0x1A, 0x0A);
        assertThat(r.headers().firstValue("content-type")).hasValue("image/png");
        // expected: CSP Level 3 "sandbox" directive (W3C) keeps an SVG opened on its own from running script;
        // "nosniff" per the Fetch standard section 3.5
        assertThat(r.headers().firstValue("content-security-policy").orElse("")).contains("sandbox").contains("default-src 'none'");
        assertThat(r.headers().firstValue("x-content-type-options")).hasValue("nosniff");
    }

    @Test
    void anSvgFigureIsServedAsImageSvgXml() throws Exception {
        HttpResponse<byte[]> r = get("api/ui/figure/" + id("bulletin/figures/fig2_do_by_station.svg"));
        assertThat(r.statusCode()).isEqualTo(200);
        // expected: the media type registered for SVG (W3C SVG 1.1, appendix P)
        assertThat(r.headers().firstValue("content-type")).hasValue("image/svg+xml");
    }

    @Test
    void aDatasetThatIsNotAFigureIsRefused() throws Exception {
        HttpResponse<byte[]> r = get("api/ui/figure/" + id("derived/lab_merged.csv"));
        assertThat(r.statusCode()).isEqualTo(404);
        assertThat(new String(r.body())).contains("is not a present figure");
        assertThat(get("api/ui/figure/999999").statusCode()).isEqualTo(404);
        assertThat(get("api/ui/figure/abc").statusCode()).isEqualTo(400);
    }

    @Test
    void aFigureReachedThroughALinkOutOfTheHarvestedFolderIsRefused() throws Exception {
        Path elsewhere = temp.resolve("elsewhere");
        Files.createDirectories(elsewhere);
        Files.copy(Workspaces.demo().resolve("bulletin/figures/fig1_no3_trend.png"), elsewhere.resolve("moved.png"));
        try (Catalog second = TestCatalogs.fresh(temp.resolve("second"));
                ApiServer other = ApiServer.start(second, "127.0.0.1", 0)) {
            second.harvestFolder(elsewhere, false, HarvestProgress.NONE);
            long moved = second.reader().findDatasets("moved.png").get(0).id();
            String address = other.url() + "api/ui/figure/" + moved;
            assertThat(HTTP.send(HttpRequest.newBuilder(URI.create(address)).build(), HttpResponse.BodyHandlers.discarding())
                    .statusCode()).isEqualTo(200);
            // The file is swapped for a link leading out of the folder: its real path decides, so it is refused.
            Path outside = temp.resolve("secret.png");
            Files.copy(Workspaces.demo().resolve("bulletin/figures/fig1_no3_trend.png"), outside);
            Files.delete(elsewhere.resolve("moved.png"));
            Files.createSymbolicLink(elsewhere.resolve("moved.png"), outside);
            assertThat(HTTP.send(HttpRequest.newBuilder(URI.create(address)).build(), HttpResponse.BodyHandlers.discarding())
                    .statusCode()).isEqualTo(404);
        }
    }

    @Test
    void theOverviewCountsKindsAndNamesTheMostReadDatasets() throws Exception {
        HttpResponse<byte[]> r = get("api/ui/overview");
        assertThat(r.statusCode()).isEqualTo(200);
        JsonNode o = ApiJson.mapper().readTree(r.body());
        long figures;
        try (Stream<Path> files = Files.list(Workspaces.demo().resolve("bulletin/figures"))) {
            figures = files.count();
        }
        // expected: the demo folder holds that many figure files (counted here by listing it)
        assertThat(o.get("kinds").get("figure").asLong()).isEqualTo(figures);
        // expected: models/trend_model.R reads derived/lab_merged.csv and writes three files (lines 53, 66
        // and its write_csv): one static edge from the read to each write, so it is read three times; tie
        // with derived/station_monthly_summary.csv, which the same script reads, broken by name
        assertThat(o.get("most_used").get(0).get("name").asText()).isEqualTo("derived/lab_merged.csv");
        assertThat(o.get("most_used").get(0).get("uses").asInt()).isEqualTo(3);
        assertThat(o.get("most_used").get(1).get("name").asText()).isEqualTo("derived/station_monthly_summary.csv");
        assertThat(o.get("recent")).hasSize(6);
    }
}
