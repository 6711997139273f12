package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import java.util.List;
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

/** A real R script, run under the R connector (installed with R CMD INSTALL), against a real server. */
class RConnectorEndToEndTest {

    @TempDir
    Path temp;

    /** The harvester token the connector sends. */
    private static String token;

    private static int run(Path dir, Path library, String url, List<String> command) throws IOException, InterruptedException {
        ProcessBuilder pb = new ProcessBuilder(command).directory(dir.toFile()).redirectErrorStream(true)
                .redirectOutput(dir.resolve("r-output.txt").toFile());
        pb.environment().put("R_LIBS", library.toString());
        pb.environment().put("HOME", dir.toString());
        pb.environment().put("HEADWATER_SPOOL", dir.resolve("spool.ndjson").toString());
        if (url != null) {
            pb.environment().put("HEADWATER_URL", url);
            pb.environment().put("HEADWATER_TOKEN", token);
        }
        Process p = pb.start();
        if (!p.waitFor(180, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new AssertionError("R did not finish");
        }
        return p.exitValue();
    }

    private static boolean available(String program) {
        try {
            return new ProcessBuilder(program, "--version").start().waitFor(20, TimeUnit.SECONDS);
        } catch (IOException e) {
            return false;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return false;
        }
    }

    @Test
    void anRScriptsReadsWritesAndFigureAreRecordedAndTheCopiedFigureLeadsBackToTheRun() throws Exception {
        External.need(available("Rscript"), "R (r-base-core)");
        Path library = Files.createDirectories(temp.resolve("rlib"));
        Path lake = Files.createDirectories(temp.resolve("lake"));
        assertThat(run(temp, library, null, List.of("R", "CMD", "INSTALL", "-l", library.toString(),
                Workspaces.repoRoot().resolve("connectors/r").toString()))).isZero();
        Files.writeString(lake.resolve("levels.csv"), "site,level_cm\nA,12\nB,15\nC,9\n");
        Files.writeString(lake.resolve("plot_levels.R"), String.join("\n",
                "x <- read.csv('levels.csv')",
                "x$level_m <- x$level_cm / 100",
                "write.csv(x, 'levels_m.csv', row.names = FALSE)",
                "png('levels.png', width = 480, height = 320)",
                "barplot(x$level_m, names.arg = x$site)",
                "invisible(dev.off())",
                ""));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            token = TestTokens.create(catalog, Role.HARVESTER);
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            String url = server.url().substring(0, server.url().length() - 1);
            int exit = run(lake, library, url, List.of("Rscript", "-e", "headwater::run('plot_levels.R')"));
            assertThat(exit).as(Files.readString(lake.resolve("r-output.txt"), StandardCharsets.UTF_8)).isZero();

            List<RunSummary> runs = catalog.reader().runs(10);
            assertThat(runs).hasSize(1);
            assertThat(runs.get(0).script()).isEqualTo("plot_levels.R");
            assertThat(runs.get(0).reads()).isEqualTo(1);
            assertThat(runs.get(0).writes()).isEqualTo(2);

            Path copy = Files.createDirectories(temp.resolve("report")).resolve("fig-a.png");
            Files.copy(lake.resolve("levels.png"), copy);
            byte[] bytes = Files.readAllBytes(copy);
            // Still a valid PNG after stamping: the JDK's decoder reads it at its size.
            var image = javax.imageio.ImageIO.read(copy.toFile());
            assertThat(image.getWidth()).isEqualTo(480);
            assertThat(image.getHeight()).isEqualTo(320);
            Whence.Answer answer = new Whence(catalog.store()).of(copy.toString(), copy.toUri().toString(),
                    HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes)),
                    StampReader.runId(bytes).orElse(null));
            assertThat(answer.producers().get(0).matchedBy()).isEqualTo("stamp");
            assertThat(answer.producers().get(0).script()).isEqualTo("plot_levels.R");
            assertThat(answer.producers().get(0).inputs()).extracting(Whence.Input::dataset).containsExactly("levels.csv");
        }
    }
}
