package org.headwater.harvest;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.TimeUnit;
import org.headwater.Catalog;
import org.headwater.store.Views.HarvestErrorView;
import org.headwater.testing.External;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Links, FIFOs, devices and unreadable files in a harvested folder: never read, each skipped with its reason. */
class HarvestPathSafetyTest {
    @TempDir
    Path temp;

    static boolean make(String... command) throws IOException, InterruptedException {
        Process p = new ProcessBuilder(command).redirectErrorStream(true).start();
        p.getInputStream().readAllBytes();
        return p.waitFor(10, TimeUnit.SECONDS) && p.exitValue() == 0;
    }

    /** The harvest's recorded reasons by file name. */
    static Map<String, HarvestErrorView> reasons(Catalog catalog, HarvestSummary summary) {
        Map<String, HarvestErrorView> byName = new TreeMap<>();
        for (HarvestErrorView e : catalog.reader().harvest(summary.harvestId()).orElseThrow().errorList()) {
            byName.put(e.uri().replaceAll("/$", "").replaceAll(".*/", ""), e);
        }
        return byName;
    }

    @Test
    void everyKindOfLinkIsSkippedWithWhereItLeads() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path outside = Files.createDirectories(temp.resolve("outside"));
        Files.writeString(outside.resolve("secret.csv"), "a\n1\n");
        Files.writeString(lake.resolve("real.csv"), "a\n1\n");
        Files.createSymbolicLink(lake.resolve("inside.csv"), lake.resolve("real.csv"));
        Files.createSymbolicLink(lake.resolve("escape.csv"), outside.resolve("secret.csv"));
        Files.createSymbolicLink(lake.resolve("escape_dir"), outside);
        Files.createSymbolicLink(lake.resolve("dotdot.csv"), Path.of("../outside/secret.csv"));
        Files.createSymbolicLink(lake.resolve("dangling.csv"), lake.resolve("missing.csv"));
        Files.createSymbolicLink(lake.resolve("loop_a"), lake.resolve("loop_b"));
        Files.createSymbolicLink(lake.resolve("loop_b"), lake.resolve("loop_a"));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            HarvestSummary summary = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(summary.datasets()).isEqualTo(1);
            assertThat(summary.status()).isEqualTo("ok");
            assertThat(summary.filesIgnored()).isEqualTo(7);
            Map<String, HarvestErrorView> reasons = reasons(catalog, summary);
            assertThat(reasons.get("inside.csv").kind()).isEqualTo("symlink");
            assertThat(reasons.get("inside.csv").message()).contains("to real.csv inside the root");
            assertThat(reasons.get("escape.csv").kind()).isEqualTo("symlink_escape");
            assertThat(reasons.get("escape_dir").kind()).isEqualTo("symlink_escape");
            assertThat(reasons.get("dotdot.csv").kind()).isEqualTo("symlink_escape");
            assertThat(reasons.get("dangling.csv").kind()).isEqualTo("symlink_dangling");
            // expected: Linux returns ELOOP, "Too many levels of symbolic links" (errno(3)), for a link cycle
            assertThat(reasons.get("loop_a").kind()).isEqualTo("symlink_loop");
            assertThat(reasons.get("loop_b").kind()).isEqualTo("symlink_loop");
            assertThat(catalog.reader().findDatasets("secret.csv")).isEmpty();
        }
    }

    @Test
    void aFifoIsSkippedWithoutBlockingTheHarvest() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("real.csv"), "a\n1\n");
        Path fifo = lake.resolve("pipe.csv");
        External.need(make("mkfifo", fifo.toString()), "mkfifo (GNU coreutils)");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            // Nobody ever writes to the pipe: a harvest that opened it would wait for ever.
            HarvestSummary summary = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(summary.datasets()).isEqualTo(1);
            assertThat(reasons(catalog, summary).get("pipe.csv").kind()).isEqualTo("fifo");
        }
    }

    @Test
    void aDeviceFileIsSkipped() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("real.csv"), "a\n1\n");
        Path device = lake.resolve("zero.csv");
        // Character device 1,5 is /dev/zero (Linux Documentation/admin-guide/devices.txt): endless if read.
        // Making a device node needs CAP_MKNOD; containers often lack it, and then this cannot be tested here.
        Assumptions.assumeTrue(make("mknod", device.toString(), "c", "1", "5"),
                "mknod is not permitted in this environment");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            HarvestSummary summary = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(summary.datasets()).isEqualTo(1);
            assertThat(reasons(catalog, summary).get("zero.csv").kind()).isEqualTo("device_file");
        }
    }

    @Test
    void anUnreadableFileIsRecordedAndTheRestIsHarvested() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("real.csv"), "a\n1\n");
        Path locked = lake.resolve("locked.csv");
        Files.writeString(locked, "a\n1\n");
        Files.setPosixFilePermissions(locked, PosixFilePermissions.fromString("---------"));
        boolean stillReadable;
        try (InputStream in = Files.newInputStream(locked)) {
            stillReadable = true;
        } catch (IOException e) {
            stillReadable = false;
        }
        // As root (uid 0, as in this project's containers) permission bits do not stop reads: the case cannot
        // be produced, and the test says so instead of passing without checking anything.
        Assumptions.assumeFalse(stillReadable, "running as root: chmod 000 does not make a file unreadable");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            HarvestSummary summary = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(summary.status()).isEqualTo("with_errors");
            assertThat(reasons(catalog, summary).get("locked.csv").kind()).isEqualTo("unreadable");
            assertThat(catalog.reader().findDatasets("real.csv")).hasSize(1);
        }
    }
}
