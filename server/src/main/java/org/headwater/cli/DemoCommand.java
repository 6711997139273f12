package org.headwater.cli;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.atomic.AtomicReference;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code headwater demo}: harvests the invented demo workspace into a fresh temporary catalog and serves it. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Copy the demo workspace (an invented river-basin monitoring lab) to a temporary folder,",
                "harvest it into a fresh temporary catalog, and serve it. Temporary folders are deleted at exit."})
final class DemoCommand implements Callable<Integer> {
    @Mixin
    ListenOptions listen;

    @Option(names = "--data-dir", paramLabel = "DIR",
            description = "Keep the demo catalog in DIR instead of a temporary folder (it is then not deleted).")
    Path dataDir;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        Path temp = Files.createTempDirectory("headwater-demo-");
        Path workspace = temp.resolve("workspace").resolve("quillwater-lab");
        AtomicReference<HarvestSummary> summary = new AtomicReference<>();
        CompletableFuture<Catalog> opening = CompletableFuture.supplyAsync(() -> {
            Catalog catalog = Catalog.open(dataDir != null ? dataDir : temp.resolve("catalog"));
            try {
                DemoWorkspace.copyTo(workspace.getParent());
                // The demo's data is invented: value sampling on, so its pages show column ranges.
                summary.set(catalog.harvestFolder(workspace, false, true, HarvestProgress.NONE));
                return catalog;
            } catch (IOException e) {
                catalog.close();
                throw new UncheckedIOException(e);
            }
        });
        // The demo's run records may name only its own workspace.
        var settings = org.headwater.http.ServerSettings.defaults().withRoots(java.util.List.of(temp));
        ServeCommand.serveUntilStopped(opening, listen.host, listen.port, settings, spec.commandLine().getOut(), server ->
                String.format("Demo workspace %s: %d datasets, %d scripts%n"
                                + "Headwater demo is serving at %s%nTry %sapi/search?q=nitrate  (stop with Ctrl-C)",
                        workspace, summary.get().datasets(), summary.get().scripts(), server.url(), server.url()),
                () -> DemoWorkspace.deleteTree(temp));
        return Main.OK;
    }
}
