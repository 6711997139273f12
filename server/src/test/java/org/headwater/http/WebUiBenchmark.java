package org.headwater.http;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.Browser;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.openqa.selenium.JavascriptExecutor;

/**
 * Page weight of the first load and render time of a 500-node lineage graph, in headless Chromium against
 * a server holding the demo catalog. Prints, beside each figure, its floor measured in the same run: the
 * bytes of the asset files as they lie on disk, and the time the browser needs to insert the same 500
 * boxes and their curves at fixed places with no layout work.
 */
public final class WebUiBenchmark {
    private static final int NODES = 500;
    private static final int REPEATS = 7;

    private WebUiBenchmark() {
    }

    public static void main(String[] args) throws Exception {
        if (!Browser.available()) {
            System.err.println("chromium and chromedriver are needed (apt-get install chromium chromium-driver)");
            System.exit(2);
        }
        Path temp = Files.createTempDirectory("headwater-webbench-");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0);
            try (Browser browser = Browser.start()) {
                var driver = browser.driver();
                driver.get(server.url());
                Thread.sleep(1500); // the start page's overview and version answers
                @SuppressWarnings("unchecked")
                Map<String, Object> weight = (Map<String, Object>) ((JavascriptExecutor) driver).executeScript("""
                        const nav = performance.getEntriesByType('navigation')[0];
                        const res = performance.getEntriesByType('resource');
                        const api = res.filter(r => new URL(r.name).pathname.startsWith('/api/'));
                        const assets = res.filter(r => !new URL(r.name).pathname.startsWith('/api/'));
                        const sum = (list, f) => list.reduce((s, r) => s + r[f], 0);
                        return {page: nav.transferSize, assets: sum(assets, 'transferSize'), api: sum(api, 'transferSize'),
                                decoded: nav.decodedBodySize + sum(assets, 'decodedBodySize'), files: assets.length + 1};
                        """);
                long page = ((Number) weight.get("page")).longValue();
                long assets = ((Number) weight.get("assets")).longValue();
                long api = ((Number) weight.get("api")).longValue();
                System.out.printf("first load: %d requests for the page and its assets, %,d bytes transferred (+ %,d bytes of API answers); target under 300 KB%n",
                        ((Number) weight.get("files")).intValue(), page + assets, api);
                System.out.printf("the same asset files uncompressed on disk: %,d bytes (decoded in the browser: %,d); the server compresses them%n",
                        assetBytesOnDisk(), ((Number) weight.get("decoded")).longValue());

                for (boolean columns : List.of(false, true)) {
                    @SuppressWarnings("unchecked")
                    List<List<Number>> runs = (List<List<Number>>) ((JavascriptExecutor) driver).executeAsyncScript(RENDER, NODES, REPEATS, columns);
                    double[] layout = runs.stream().mapToDouble(r -> r.get(0).doubleValue()).sorted().toArray();
                    double[] floor = runs.stream().mapToDouble(r -> r.get(1).doubleValue()).sorted().toArray();
                    System.out.printf("%d-node lineage graph%s: layout + draw + first paint median %.0f ms (min %.0f, max %.0f); target under 1 s%n",
                            NODES, columns ? " with columns (5 per node)" : "", layout[REPEATS / 2], layout[0], layout[REPEATS - 1]);
                    System.out.printf("  floor, the same boxes and curves inserted at fixed places, no layout: median %.0f ms%n", floor[REPEATS / 2]);
                }
            } finally {
                server.close();
            }
        }
    }

    private static long assetBytesOnDisk() throws Exception {
        Path dir = Workspaces.repoRoot().resolve("web/src/main/resources/headwater-web");
        try (Stream<Path> files = Files.list(dir)) {
            return files.mapToLong(p -> p.toFile().length()).sum();
        }
    }

    /**
     * Builds a layered DAG (10 layers of 50 datasets, each reading two of the layer before) and times
     * hwGraph.layout + hwGraph.draw until the frame after it is painted; then the floor.
     */
    private static final String RENDER = """
            const [n, repeats, columns, done] = arguments;
            const perLayer = n / 10;
            const nodes = [], edges = [];
            let seed = 7;
            const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
            for (let i = 0; i < n; i++) nodes.push({id: i, name: 'zone' + (i % perLayer) + '/step' + Math.floor(i / perLayer) + '/table_' + i + '.csv',
                kind: 'file', expandable: true, expanded: true, columns: columns ? ['key', 'when', 'value_a', 'value_b', 'note'] : null});
            for (let i = perLayer; i < n; i++) for (let k = 0; k < 2; k++) {
                const from = (Math.floor(i / perLayer) - 1) * perLayer + Math.floor(rand() * perLayer);
                edges.push({key: i * 2 + k, from, to: i, evidence: k ? 'static' : 'runtime', confidence: 0.9});
            }
            const columnEdges = columns ? edges.map(e => ({from: e.from, fromColumn: 'value_a', to: e.to, toColumn: 'value_b', derived: true})) : [];
            const graph = {center: n / 2 + 3, nodes, edges, columnEdges, columnLevel: columns, highlight: {nodes: new Set(), edges: new Set()},
                byId: new Map(nodes.map(x => [x.id, x]))};
            const box = document.createElement('div');
            document.body.append(box);
            const frame = () => new Promise(r => requestAnimationFrame(() => setTimeout(r, 0)));
            const results = [];
            (async () => {
              for (let r = 0; r < repeats; r++) {
                const svg = document.createElementNS('http://www.w3.org/2000/svg', 'svg');
                box.replaceChildren(svg);
                await frame();
                let t = performance.now();
                const placed = hwGraph.layout(graph);
                hwGraph.draw(svg, graph, placed, hw.kindSigns);
                svg.getBBox();
                await frame();
                const full = performance.now() - t;
                const plain = document.createElementNS('http://www.w3.org/2000/svg', 'svg');
                plain.setAttribute('width', placed.width); plain.setAttribute('height', placed.height);
                box.replaceChildren(plain);
                await frame();
                t = performance.now();
                const ns = 'http://www.w3.org/2000/svg';
                const frag = document.createDocumentFragment();
                for (const e of edges) {
                  const p = document.createElementNS(ns, 'path');
                  const a = placed.pos.get(e.from), b = placed.pos.get(e.to);
                  p.setAttribute('d', 'M' + (a.x + a.w) + ',' + a.y + ' C' + (a.x + 200) + ',' + a.y + ' ' + (b.x - 50) + ',' + b.y + ' ' + b.x + ',' + b.y);
                  p.setAttribute('class', 'edge ev-' + e.evidence);
                  frag.append(p);
                }
                for (const x of nodes) {
                  const g = document.createElementNS(ns, 'g');
                  const a = placed.pos.get(x.id);
                  g.setAttribute('transform', 'translate(' + a.x + ',' + a.y + ')');
                  const rect = document.createElementNS(ns, 'rect');
                  rect.setAttribute('width', a.w); rect.setAttribute('height', a.h);
                  const text = document.createElementNS(ns, 'text');
                  text.textContent = x.name;
                  g.append(rect, text);
                  frag.append(g);
                }
                plain.append(frag);
                plain.getBBox();
                await frame();
                results.push([full, performance.now() - t]);
              }
              box.remove();
              done(results);
            })();
            """;
}
