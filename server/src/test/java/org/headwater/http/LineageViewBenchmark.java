package org.headwater.http;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.testing.Browser;
import org.headwater.testing.TestCatalogs;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.chrome.ChromeDriver;

/**
 * The real lineage page on a 500-dataset neighbourhood, in headless Chromium: a generated workspace of
 * 10 layers of 50 CSV files and 450 Python scripts (each reads two files of one layer and writes one of
 * the next) goes through a real harvest and script analysis, so every box and link comes through the
 * ingestion path. Times, median of {@value #REPEATS}: navigation to the settled drawing of all 500 boxes,
 * collapsing and opening the centre, switching to column level and back. In the same run: the naive
 * way the page used to load (one lineage request per box), and the floor of drawing the same number of
 * boxes at fixed places without layout.
 *
 * <pre>java -cp $CP org.headwater.http.LineageViewBenchmark</pre>
 */
public final class LineageViewBenchmark {
    private static final int LAYERS = 10;
    private static final int PER_LAYER = 50;
    private static final int REPEATS = 5;

    private LineageViewBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        if (!Browser.available()) {
            System.err.println("chromium and chromedriver are needed (apt-get install chromium chromium-driver)");
            System.exit(2);
        }
        Path temp = Files.createTempDirectory("headwater-lineagebench-");
        Path workspace = workspace(temp.resolve("relay-basin"));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            long t = System.nanoTime();
            HarvestSummary summary = catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
            System.out.printf("harvest of the generated workspace: %d files, %d datasets, %d scripts, %.1f s%n",
                    summary.filesSeen(), summary.datasets(), summary.scripts(), (System.nanoTime() - t) / 1e9);
            String centreName = name(5 * PER_LAYER + 25);
            long centre = catalog.reader().findDatasets(centreName).stream().filter(d -> d.name().equals(centreName))
                    .findFirst().orElseThrow().id();
            // the naive alternative sends 500 requests at once: a rate limit high enough not to refuse them
            ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0, ServerSettings.defaults().withRate(100_000, 400_000));
            try (Browser browser = Browser.start()) {
                ChromeDriver driver = browser.driver();
                JavascriptExecutor js = driver;
                driver.manage().timeouts().scriptTimeout(Duration.ofSeconds(120));
                String address = server.url() + "#/lineage/" + centre + "?depth=20";
                double[] render = new double[REPEATS];
                double[] collapse = new double[REPEATS];
                double[] open = new double[REPEATS];
                double[] columns = new double[REPEATS];
                double[] back = new double[REPEATS];
                String status = "";
                for (int r = 0; r < REPEATS; r++) {
                    driver.get("about:blank");
                    driver.get(address);
                    render[r] = ((Number) js.executeAsyncScript(SETTLED)).doubleValue();
                    status = (String) js.executeScript("return document.getElementById('graph-status').textContent;");
                    String toggle = "[data-toggle='" + centre + "']";
                    collapse[r] = ((Number) js.executeAsyncScript(AFTER, toggle)).doubleValue();
                    open[r] = ((Number) js.executeAsyncScript(AFTER, toggle)).doubleValue();
                    columns[r] = ((Number) js.executeAsyncScript(AFTER, "#show-columns")).doubleValue();
                    back[r] = ((Number) js.executeAsyncScript(AFTER, "#show-columns")).doubleValue();
                }
                System.out.println("drawn: " + status);
                report("navigation to the settled drawing of the 500-box view", render);
                report("collapse the centre (500 boxes to 1)", collapse);
                report("open it again (1 to 500)", open);
                report("switch to column level", columns);
                report("switch back to datasets", back);

                List<Number> ids = catalog.reader().datasets(null, 0, 1000, null).stream().map(d -> (Number) d.id()).toList();
                double[] naive = new double[REPEATS];
                double[] batch = new double[REPEATS];
                for (int r = 0; r < REPEATS; r++) {
                    naive[r] = ((Number) js.executeAsyncScript(FETCH_EACH, ids)).doubleValue();
                    batch[r] = ((Number) js.executeAsyncScript(FETCH_ONE, centre)).doubleValue();
                }
                report("naive: one /api/datasets/{id}/lineage request per box, all 500 at once", naive);
                report("the view's one /api/ui/lineage/{id}?depth=20 request", batch);
                driver.manage().timeouts().scriptTimeout(Duration.ofSeconds(120));
                double[] floor = new double[REPEATS];
                for (int r = 0; r < REPEATS; r++) {
                    floor[r] = ((Number) js.executeAsyncScript(FLOOR, LAYERS * PER_LAYER)).doubleValue();
                }
                report("floor: 500 plain boxes and 900 curves inserted at fixed places, no layout", floor);
            } finally {
                server.close();
            }
        }
    }

    private static void report(String what, double[] ms) {
        double[] sorted = ms.clone();
        Arrays.sort(sorted);
        System.out.printf("%s: median %.0f ms (min %.0f, max %.0f)%n", what, sorted[sorted.length / 2], sorted[0],
                sorted[sorted.length - 1]);
    }

    /** 10 layers of 50 CSV files; each file past the first layer written by its own script from two of the layer before. */
    static Path workspace(Path dir) throws Exception {
        Random random = new Random(20261202);
        for (int layer = 0; layer < LAYERS; layer++) {
            Files.createDirectories(dir.resolve(name(layer * PER_LAYER)).getParent());
        }
        Files.createDirectories(dir.resolve("steps"));
        for (int layer = 0; layer < LAYERS; layer++) {
            for (int k = 0; k < PER_LAYER; k++) {
                int id = layer * PER_LAYER + k;
                Files.writeString(dir.resolve(name(id)), "key,taken_on,value_a,value_b,remark\n1,2026-01-0" + (1 + k % 9)
                        + "," + k + "," + layer + ",plain\n", StandardCharsets.UTF_8);
                if (layer == 0) {
                    continue;
                }
                // the box at the same place in the layer before, so no box is left unread, and one drawn at random
                int first = id - PER_LAYER;
                int second = (layer - 1) * PER_LAYER + random.nextInt(PER_LAYER);
                Files.writeString(dir.resolve("steps/make_" + letters(id) + ".py"), """
                        import pandas as pd

                        left = pd.read_csv("%s")
                        right = pd.read_csv("%s")
                        joined = left.merge(right[["key", "value_b"]], on="key", suffixes=("", "_other"))
                        joined[["key", "taken_on", "value_a", "value_b", "remark"]].to_csv("%s", index=False)
                        """.formatted(name(first), name(second), name(id)), StandardCharsets.UTF_8);
            }
        }
        return dir;
    }

    /** Letters only, so that no two names share a partition pattern (a trailing number would make sets). */
    static String name(int id) {
        return "stage_" + (char) ('a' + id / PER_LAYER) + "/gauge_" + letters(id) + ".csv";
    }

    private static String letters(int id) {
        return "" + (char) ('a' + id / 676) + (char) ('a' + id / 26 % 26) + (char) ('a' + id % 26);
    }

    /** Waits until the status line reports the drawing and a frame has been painted; ms since navigation start. */
    private static final String SETTLED = """
            const done = arguments[arguments.length - 1];
            const check = () => {
              const s = document.getElementById('graph-status');
              if (s && / datasets, \\d+ links/.test(s.textContent)) {
                requestAnimationFrame(() => setTimeout(() => done(performance.now()), 0));
              } else setTimeout(check, 5);
            };
            check();
            """;

    /** Clicks the element and times until the graph is redrawn and painted. */
    private static final String AFTER = """
            const [selector, done] = arguments;
            const svg = document.querySelector('svg.graph');
            const t = performance.now();
            const seen = new MutationObserver(() => {
              seen.disconnect();
              requestAnimationFrame(() => setTimeout(() => done(performance.now() - t), 0));
            });
            seen.observe(svg, {childList: true});
            document.querySelector(selector).dispatchEvent(new MouseEvent('click', {bubbles: true}));
            """;

    private static final String FETCH_EACH = """
            const [ids, done] = arguments;
            const t = performance.now();
            Promise.all(ids.map(id => fetch('/api/datasets/' + id + '/lineage').then(r => r.json())))
              .then(() => done(performance.now() - t));
            """;

    private static final String FETCH_ONE = """
            const [centre, done] = arguments;
            const t = performance.now();
            fetch('/api/ui/lineage/' + centre + '?depth=20').then(r => r.json()).then(() => done(performance.now() - t));
            """;

    /** The same number of plain boxes and links appended at fixed places: what drawing costs without layout. */
    private static final String FLOOR = """
            const [n, done] = arguments;
            const ns = 'http://www.w3.org/2000/svg';
            const svg = document.createElementNS(ns, 'svg');
            svg.setAttribute('width', 4000); svg.setAttribute('height', 3000);
            document.body.append(svg);
            requestAnimationFrame(() => setTimeout(() => {
              const t = performance.now();
              const frag = document.createDocumentFragment();
              for (let i = 0; i < n; i++) {
                const g = document.createElementNS(ns, 'g');
                g.setAttribute('transform', 'translate(' + (i % 10) * 340 + ',' + Math.floor(i / 10) * 50 + ')');
                const rect = document.createElementNS(ns, 'rect');
                rect.setAttribute('width', 230); rect.setAttribute('height', 34);
                const text = document.createElementNS(ns, 'text');
                text.textContent = 'layer' + (i % 10) + '/table_' + i + '.csv';
                g.append(rect, text);
                frag.append(g);
              }
              for (let i = 0; i < 900; i++) {
                const p = document.createElementNS(ns, 'path');
                p.setAttribute('d', 'M' + (i % 9) * 340 + ',' + (i % 50) * 50 + ' C100,100 200,200 ' + ((i % 9) + 1) * 340 + ',' + ((i * 7) % 50) * 50);
                frag.append(p);
              }
              svg.append(frag);
              svg.getBBox();
              requestAnimationFrame(() => setTimeout(() => { const ms = performance.now() - t; svg.remove(); done(ms); }, 0));
            }, 0));
            """;
}
