package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.access.Role;
import org.headwater.http.ApiServer;
import org.headwater.testing.TestTokens;
import org.headwater.store.Views.RunSummary;
import org.headwater.testing.External;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A real Python script, with real pandas and matplotlib, run under the connector against a real server. */
class PythonConnectorEndToEndTest {
    private static final Path PYTHON = Path.of("/usr/bin/python3");

    @TempDir
    Path temp;

    /** What one process printed and returned. */
    record Ran(int exit, String out, String err) {
    }

    private Ran python(Path dir, Map<String, String> env, String... args) throws IOException, InterruptedException {
        List<String> command = new java.util.ArrayList<>(List.of(PYTHON.toString()));
        command.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(command).directory(dir.toFile());
        pb.environment().put("PYTHONPATH", Workspaces.repoRoot().resolve("connectors/python").toString());
        pb.environment().put("HEADWATER_SPOOL", temp.resolve("spool.ndjson").toString());
        pb.environment().put("MPLBACKEND", "Agg");
        pb.environment().put("MPLCONFIGDIR", temp.resolve("mpl").toString());
        pb.environment().remove("HEADWATER_URL");
        pb.environment().putAll(env);
        Process p = pb.start();
        byte[] out = p.getInputStream().readAllBytes();
        byte[] err = p.getErrorStream().readAllBytes();
        if (!p.waitFor(180, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("python did not finish");
        }
        return new Ran(p.exitValue(), new String(out, StandardCharsets.UTF_8), new String(err, StandardCharsets.UTF_8));
    }

    private boolean pandasAvailable() throws IOException, InterruptedException {
        if (!Files.isExecutable(PYTHON)) {
            return false;
        }
        return python(temp, Map.of(), "-c", "import pandas, matplotlib").exit() == 0;
    }

    private static String sha256(Path file) throws Exception {
        return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(file)));
    }

    @Test
    void aRunIsRecordedWithItsExactIoAndItsFigureLeadsBackToIt() throws Exception {
        External.need(pandasAvailable(), "Debian's python3 with pandas and matplotlib (python3-pandas, python3-matplotlib)");
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("levels.csv"), "site,level_cm\nA,12\nB,15\nC,9\n");
        Files.writeString(lake.resolve("plot_levels.py"), String.join("\n",
                "import sys",
                "import pandas as pd",
                "import matplotlib.pyplot as plt",
                "frame = pd.read_csv('levels.csv')",
                "frame['level_m'] = frame['level_cm'] / 100",
                "frame.to_csv('levels_m.csv', index=False)",
                "plt.bar(frame['site'], frame['level_m'])",
                "plt.savefig('levels.png')",
                "plt.savefig('levels.pdf')",
                "print('done', len(frame))",
                ""));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            String url = server.url().substring(0, server.url().length() - 1);

            // The server is not told yet: the record goes to the spool, the script is unaffected.
            Ran offline = python(lake, Map.of("HEADWATER_URL", "http://127.0.0.1:9"), "-m", "headwater", "run", "plot_levels.py");
            assertThat(offline.exit()).isZero();
            assertThat(offline.out()).isEqualTo("done 3\n");
            assertThat(catalog.reader().runs(10)).isEmpty();
            // Then the server is reachable: flushing sends the spooled record, exactly once.
            assertThat(python(lake, Map.of("HEADWATER_URL", url, "HEADWATER_TOKEN", token), "-m", "headwater", "flush").exit()).isZero();
            assertThat(python(lake, Map.of("HEADWATER_URL", url, "HEADWATER_TOKEN", token), "-m", "headwater", "flush").exit()).isZero();
            List<RunSummary> runs = catalog.reader().runs(10);
            assertThat(runs).hasSize(1);
            assertThat(runs.get(0).exitCode()).isZero();
            assertThat(runs.get(0).reads()).isEqualTo(1);
            assertThat(runs.get(0).writes()).isEqualTo(3);
            // The stamped PDF still opens in a PDF library and carries the run id in its document
            // information dictionary (ISO 32000-1, 14.3.3).
            try (var pdf = org.apache.pdfbox.Loader.loadPDF(lake.resolve("levels.pdf").toFile())) {
                assertThat(pdf.getNumberOfPages()).isEqualTo(1);
                assertThat(pdf.getDocumentInformation().getCustomMetadataValue("HeadwaterRun")).isEqualTo(runs.get(0).id());
            }
            assertThat(runs.get(0).script()).isEqualTo("plot_levels.py");

            // The figure is copied to a report folder and renamed; whence still finds its run and inputs.
            Path copy = Files.createDirectories(temp.resolve("report")).resolve("figure-1.png");
            Files.copy(lake.resolve("levels.png"), copy);
            byte[] bytes = Files.readAllBytes(copy);
            Whence.Answer answer = new Whence(catalog.store()).of(copy.toString(), copy.toUri().toString(), sha256(copy),
                    StampReader.runId(bytes).orElse(null));
            assertThat(answer.stamp()).isEqualTo(runs.get(0).id());
            assertThat(answer.producers().get(0).matchedBy()).isEqualTo("stamp");
            assertThat(answer.producers().get(0).script()).isEqualTo("plot_levels.py");
            assertThat(answer.producers().get(0).run().id()).isEqualTo(runs.get(0).id());
            assertThat(answer.producers().get(0).inputs()).containsExactly(
                    new Whence.Input("levels.csv", sha256(lake.resolve("levels.csv"))));
        }
    }

    @Test
    void aScriptThatRaisesKeepsItsTracebackAndExitCodeAndItsRunIsRecordedAsFailed() throws Exception {
        External.need(pandasAvailable(), "Debian's python3 with pandas and matplotlib (python3-pandas, python3-matplotlib)");
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("broken.py"), "open('missing.csv').read()\n");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            String url = server.url().substring(0, server.url().length() - 1);
            Ran plain = python(lake, Map.of(), "broken.py");
            Ran captured = python(lake, Map.of("HEADWATER_URL", url, "HEADWATER_TOKEN", token), "-m", "headwater", "run", "broken.py");
            assertThat(captured.exit()).isEqualTo(plain.exit()).isEqualTo(1);
            assertThat(captured.err()).isEqualTo(plain.err());
            List<RunSummary> runs = catalog.reader().runs(10);
            assertThat(runs).hasSize(1);
            assertThat(runs.get(0).exitCode()).isEqualTo(1);
            assertThat(runs.get(0).exception()).isEqualTo("FileNotFoundError");
        }
    }
}
