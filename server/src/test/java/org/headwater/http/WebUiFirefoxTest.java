package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.Set;
import java.util.TreeSet;
import javax.imageio.ImageIO;
import org.headwater.Catalog;
import org.headwater.testing.Firefox;
import org.headwater.testing.Firefox.Node;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The web UI's main flows in Debian's headless Firefox ESR, driven over WebDriver BiDi ({@link Firefox}),
 * against a really started server holding the demo catalog and the hostile folder of {@link WebUiTest}.
 * The same expectations as the Chromium flows; screenshots go to {@code server/target/screenshots/ff-*.png}.
 */
class WebUiFirefoxTest {
    @TempDir
    static Path temp;

    static Catalog catalog;
    static ApiServer server;
    static Firefox firefox;
    static String base;

    @BeforeAll
    static void start() throws IOException {
        firefox = Firefox.start();
        catalog = WebUiTest.hostileDemo(temp);
        server = ApiServer.start(catalog, "127.0.0.1", 0);
        base = server.url();
    }

    @AfterAll
    static void stop() throws IOException {
        if (firefox != null) {
            firefox.close();
        }
        if (server != null) {
            server.close();
        }
        if (catalog != null) {
            catalog.close();
        }
    }

    @BeforeEach
    void forgetEarlierErrors() {
        firefox.forgetErrors();
    }

    @Test
    void searchLeadsToADatasetItsLineageItsColumnsAFigureAndTheScriptThatDrawsIt() throws Exception {
        open("");
        firefox.click(firefox.waitFor("#q"));
        firefox.type("monthly summary");
        firefox.click(waitForText("#hits a.hit-name", "derived/station_monthly_summary.csv"));

        firefox.waitFor("#columns table");
        // expected: the header line of the demo file, split at commas (RFC 4180; it has no quoted fields)
        String header = Files.readAllLines(Workspaces.demo().resolve("derived/station_monthly_summary.csv")).get(0);
        assertThat(texts("#columns tbody tr td:nth-child(2)")).containsExactly(header.split(","));
        firefox.screenshot("ff-2-dataset");

        firefox.click(waitForText("a", "Lineage graph"));
        firefox.waitFor(".node.centre");
        firefox.waitFor(".node[aria-label='file stations/station_register.csv, expanded']");
        // expected: scripts/build_station_summary.py reads stations/station_register.csv and writes this file
        // (its docstring and read_csv call); models/trend_model.R line 53 draws fig1 from it (ggsave)
        double centreX = x(".node.centre");
        assertThat(nodeX("stations/station_register.csv")).isLessThan(centreX);
        assertThat(nodeX("bulletin/figures/fig1_no3_trend.png")).isGreaterThan(centreX);
        assertThat(firefox.nodes("path.edge.ev-static").size()).isGreaterThanOrEqualTo(4);
        // a box's name stops before its button, in this browser's fonts (common practice, no source)
        assertThat((List<?>) firefox.call(WebUiTest.LABEL_OVERLAPS)).isEmpty();
        firefox.screenshot("ff-3-lineage");

        firefox.click(firefox.waitFor("#show-columns"));
        firefox.waitFor("path.edge.column");
        // expected: build_station_summary.py line 39 merges register[["station_code", "station_name", ...]]
        // into the summary, so station_name is copied from the register
        assertThat(texts("path.edge.column > title")).contains("station_name \u2192 station_name (copied)");
        assertThat(location()).contains("columns=1");
        firefox.screenshot("ff-4-lineage-columns");

        // keyboard: from the centre, ArrowLeft reaches an upstream node, Enter shows it in the side panel
        firefox.call("document.querySelector('.node.centre').focus();");
        firefox.type("\uE012"); // WebDriver key code of ArrowLeft (W3C WebDriver, section 17.4.2 "Keyboard actions")
        assertThat((Double) firefox.call("return document.activeElement.getBoundingClientRect().x;")).isLessThan(x(".node.centre"));
        String focusedName = ((String) firefox.call("return document.activeElement.getAttribute('aria-label');"))
                .replaceFirst("^\\S+ ", "").replaceFirst(", (expanded|collapsed)$", "");
        firefox.type("\uE007"); // Enter (same table)
        firefox.waitUntil("the side panel to name " + focusedName, () -> focusedName.equals(
                firefox.call("const h = document.querySelector('#node-panel h2'); return h && h.textContent;")));

        long register = idOf("stations/station_register.csv");
        long figure = idOf("bulletin/figures/fig1_no3_trend.png");
        String lineageAddress = location().replaceFirst("\\?.*$", "");
        firefox.navigate(lineageAddress + "?from=" + register + "&to=" + figure);
        firefox.waitFor("path.edge.lit");
        assertThat(firefox.nodes("path.edge.lit")).hasSize(2);
        assertThat(text("#path-note")).startsWith("Path between stations/station_register.csv and bulletin/figures/fig1_no3_trend.png: 3 datasets.");
        firefox.screenshot("ff-5-lineage-path");

        firefox.navigate(lineageAddress);
        firefox.waitFor(".node[aria-label='file stations/station_register.csv, expanded']");
        firefox.click(node("bulletin/figures/fig1_no3_trend.png"));
        firefox.click(firefox.waitFor("#node-panel a.open"));
        firefox.waitFor("#preview img.figure");
        firefox.waitUntil("the figure to load", () -> ((Double) firefox.call("return document.querySelector('#preview img.figure').naturalWidth;")) > 0);
        // expected: the PNG's own width, read by the JDK's ImageIO
        int width = ImageIO.read(Workspaces.demo().resolve("bulletin/figures/fig1_no3_trend.png").toFile()).getWidth();
        assertThat(((Double) firefox.call("return document.querySelector('#preview img.figure').naturalWidth;")).intValue()).isEqualTo(width);
        firefox.screenshot("ff-6-figure");

        firefox.click(waitForText("a", "models/trend_model.R"));
        firefox.waitFor("#writes table");
        // expected: models/trend_model.R writes the figure with ggsave (line 53)
        assertThat(texts("#writes tbody tr td:first-child")).contains("bulletin/figures/fig1_no3_trend.png");
        assertThat(text("#writes")).contains("53");
        firefox.screenshot("ff-7-script");
        noErrors("flow");
    }

    @Test
    void aChosenFigureIsHashedInTheBrowserAndTracedToItsScript() throws Exception {
        Path copy = temp.resolve("from-a-report.png");
        Files.copy(Workspaces.demo().resolve("bulletin/figures/fig1_no3_trend.png"), copy);
        open("#/whence");
        firefox.setFiles(firefox.nodes("#whence-file").get(0), copy);
        firefox.waitFor("#whence-answer a.producer-script");
        // expected: models/trend_model.R line 53 writes this figure (ggsave); the hash is the JDK's SHA-256
        assertThat(text("#whence-answer a.producer-script")).isEqualTo("models/trend_model.R");
        assertThat(location()).endsWith("sha256=" + WebUiTest.sha256(Files.readAllBytes(copy)));
        firefox.waitFor("#whence-answer img.thumb");
        firefox.waitUntil("the thumbnail to load", () -> ((Double) firefox.call("return document.querySelector('#whence-answer img.thumb').naturalHeight;")) > 0);
        // expected: the PNG's own height, read by the JDK's ImageIO
        assertThat(((Double) firefox.call("return document.querySelector('#whence-answer img.thumb').naturalHeight;")).intValue())
                .isEqualTo(ImageIO.read(copy.toFile()).getHeight());
        firefox.screenshot("ff-8-whence");

        byte[] noise = new byte[4096];
        new Random(8).nextBytes(noise);
        Path unknown = temp.resolve("unknown.bin");
        Files.write(unknown, noise);
        open("#/whence");
        firefox.setFiles(firefox.nodes("#whence-file").get(0), unknown);
        firefox.waitFor("#whence-answer .verdict.unknown");
        assertThat(text("#whence-answer .verdict.unknown")).startsWith("Unknown:");
        noErrors("whence");
    }

    @Test
    void theImpactOfDroppingAColumnListsWhatTheServerFound() throws Exception {
        String target = "stations/station_register.csv.station_name";
        String query = "target=" + WebUiTest.enc(target) + "&change=drop";
        HttpResponse<String> api = HttpClient.newHttpClient().send(
                HttpRequest.newBuilder(URI.create(base + "api/impact?" + query)).build(), HttpResponse.BodyHandlers.ofString());
        Assumptions.assumeTrue(api.statusCode() == 200, "/api/impact answered " + api.statusCode());
        Set<String> fromApi = new TreeSet<>();
        ApiJson.mapper().readTree(api.body()).get("affected").forEach(a -> fromApi.add(a.get("name").asText()));
        open("#/impact?" + query);
        firefox.waitFor("#impact-report table.affected");
        Set<String> onPage = new TreeSet<>(texts("#impact-report table.affected tbody tr td:first-child"));
        // expected: the server's own impact answer, and build_station_summary.py copying station_name from
        // the register into the summary (lines 39 and 41 of the demo script)
        assertThat(onPage).isEqualTo(fromApi);
        assertThat(String.join("\n", onPage)).contains("derived/station_monthly_summary.csv");
        firefox.click(firefox.waitFor("#copy-markdown"));
        firefox.waitFor("pre.markdown");
        assertThat(text("pre.markdown")).contains("station_monthly_summary");
        firefox.screenshot("ff-9-impact");
        noErrors("impact");
    }

    @Test
    void hostileNamesColumnsAndDescriptionsStayText() throws Exception {
        long id = idOf(WebUiTest.HOSTILE_FILE);
        open("");
        firefox.click(firefox.waitFor("#q"));
        firefox.type("onerror");
        firefox.waitFor("#hits a.hit-name");
        assertInert();
        open("#/dataset/" + id);
        firefox.waitFor(".title-name");
        assertThat(text(".title-name")).isEqualTo(WebUiTest.HOSTILE_FILE);
        String flag = WebUiTest.FLAG;
        assertThat(texts("#columns tbody tr td:nth-child(2)")).containsExactly(
                "<script>" + flag + "=2</script>", "<img src=x onerror=" + flag + "=3>", "javascript:" + flag + "=4");
        assertThat(firefox.nodes("main img[src='x'], main script, main b")).isEmpty();
        assertThat(firefox.call("return [...document.querySelectorAll('a')].filter(a => a.href.startsWith('javascript:')).length;"))
                .isEqualTo(0.0);
        firefox.screenshot("ff-10-hostile-dataset");
        assertInert();
        open("#/lineage/" + id + "?columns=1");
        firefox.waitFor("path.edge.ev-static");
        assertInert();
        open("#/script?name=copy_it.py");
        firefox.waitFor("#reads table");
        assertInert();
        noErrors("hostile");
    }

    @Test
    void everyViewLoadsWithoutErrors() throws Exception {
        long figure = idOf("bulletin/figures/fig2_do_by_station.svg");
        String[][] views = {
                {"", "ff-12-start"}, {"#/dataset/" + figure, "ff-14-svg-figure"},
                {"#/lineage/" + idOf("derived/lab_merged.csv"), "ff-15-lineage"}, {"#/whence", "ff-16-whence"},
                {"#/impact", "ff-17-impact-form"}, {"#/freshness", "ff-18-freshness"}, {"#/harvests", "ff-20-harvests"},
                {"#/script/1", "ff-21-script"}, {"#/nowhere", "ff-22-unknown-address"}};
        for (String[] v : views) {
            open(v[0]);
            firefox.waitFor("main .panel");
            pause();
            firefox.screenshot(v[1]);
        }
        assertThat(text("main")).contains("This address names no page");

        // a phone-sized window: the pages reflow instead of scrolling sideways (common practice, no source)
        firefox.viewport(480, 900);
        try {
            for (String address : List.of("", "#/dataset/" + idOf("derived/station_monthly_summary.csv"), "#/lineage/" + figure, "#/whence")) {
                open(address);
                firefox.waitFor("main .panel");
                pause();
                assertThat((Double) firefox.call("return document.documentElement.scrollWidth - window.innerWidth;"))
                        .as("sideways overflow at " + address).isLessThanOrEqualTo(0.0);
            }
            firefox.screenshot("ff-23-narrow-whence");
        } finally {
            firefox.viewport(1400, 1000);
        }
        noErrors("views");
    }

    @Test
    void theHarvestsPageCountsUpWhileAHarvestRuns() throws Exception {
        Path notes = HarvestStreamTest.fieldNotes(temp.resolve("firefox-notes"), 600, temp.resolve("firefox-outside.csv"));
        open("#/harvests");
        firefox.waitUntil("the page to follow the stream", () -> text("#harvest-note").contains("as they happen"));
        var result = new java.util.concurrent.CompletableFuture<org.headwater.harvest.HarvestSummary>();
        Thread harvest = new Thread(() -> {
            try {
                // a slow disk: 5 ms per file, so the harvest lasts a few seconds whatever the machine; 600 files make
                // three batches of the default size, so the page has counts to show between start and end
                result.complete(catalog.harvestFolder(notes, false, HarvestStreamTest.slow(5)));
            } catch (Throwable t) {
                result.completeExceptionally(t);
            }
        });
        harvest.start();
        Set<Integer> counts = new TreeSet<>();
        while (!result.isDone()) {
            for (String c : texts(".harvest-live .live-count")) {
                counts.add(Integer.parseInt(c.replaceAll("[^0-9]", "")));
            }
            Thread.sleep(50);
        }
        var summary = result.get();
        // the page showed several counts while the harvest ran: it followed the stream, not one reload
        assertThat(counts.size()).as("counts seen while running: " + counts).isGreaterThanOrEqualTo(3);
        assertThat(counts).allMatch(n -> n <= 600);
        firefox.waitUntil("the live box to go", () -> firefox.nodes(".harvest-live").isEmpty());
        List<String> first = texts("#harvest-list tbody tr:first-child td");
        assertThat(first.get(0)).isEqualTo(summary.source());
        assertThat(first.get(3)).isEqualTo(summary.status());
        assertThat(first.get(4)).isEqualTo("600");
        firefox.screenshot("ff-24-harvests-after-live");
        noErrors("harvests");
    }

    // ---- helpers

    void open(String address) {
        // a fresh load each time, as the Chromium test does with driver.get: a hash-only change would not
        // reload the page
        firefox.navigate("about:blank");
        firefox.navigate(base + address);
        pause();
    }

    static void pause() {
        try {
            Thread.sleep(300);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** Waits for an element matching the selector whose whole text is {@code text}. */
    Node waitForText(String css, String text) {
        String find = "return [...document.querySelectorAll(arguments[0])].find(e => e.textContent === arguments[1]"
                + " && e.getClientRects().length > 0) || null;";
        firefox.waitUntil(css + " reading " + text, () -> firefox.call(find, css, text) != null);
        return (Node) firefox.call(find, css, text);
    }

    /** The box of a lineage node, found by its SVG title (titles have no layout box of their own). */
    Node node(String name) {
        String find = "const t = [...document.querySelectorAll('.node > title')].find(t => t.textContent === arguments[0]);"
                + " return t && t.parentNode.getClientRects().length > 0 ? t.parentNode : null;";
        firefox.waitUntil("the lineage node " + name, () -> firefox.call(find, name) != null);
        return (Node) firefox.call(find, name);
    }

    double nodeX(String name) {
        return (Double) firefox.call("return arguments[0].getBoundingClientRect().x;", node(name));
    }

    double x(String css) {
        return (Double) firefox.call("return document.querySelector(arguments[0]).getBoundingClientRect().x;", css);
    }

    String text(String css) {
        return (String) firefox.call("return document.querySelector(arguments[0]).innerText;", css);
    }

    List<String> texts(String css) {
        List<String> out = new ArrayList<>();
        for (Object o : (List<?>) firefox.call("return [...document.querySelectorAll(arguments[0])].map(e => e.textContent);", css)) {
            out.add((String) o);
        }
        return out;
    }

    String location() {
        return (String) firefox.call("return location.href;");
    }

    long idOf(String name) {
        return catalog.reader().findDatasets(name).stream().filter(d -> d.name().equals(name)).findFirst().orElseThrow().id();
    }

    void assertInert() {
        pause();
        assertThat(firefox.call("return typeof " + WebUiTest.FLAG + ";")).as("a payload ran").isEqualTo("undefined");
        assertThat(firefox.prompts()).as("a dialog opened").isEmpty();
    }

    /**
     * No script errors and no console errors, and no API request that failed, except 404s of endpoints
     * this server does not have (as in the Chromium test: they count again once the route exists).
     */
    void noErrors(String where) throws Exception {
        assertThat(firefox.errors()).as("errors in Firefox, " + where).isEmpty();
        List<String> failed = new ArrayList<>();
        for (String f : firefox.failedRequests()) {
            String url = f.substring(f.indexOf(' ') + 1);
            if (!(f.startsWith("404 ") && url.contains("/api/") && missingRoute(url))) {
                failed.add(f);
            }
        }
        assertThat(failed).as("failed requests in Firefox, " + where).isEmpty();
    }

    static boolean missingRoute(String url) throws Exception {
        HttpResponse<String> r = HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create(url)).build(),
                HttpResponse.BodyHandlers.ofString());
        return r.statusCode() == 404 && WebUiTest.routeMissing(r.body());
    }
}
