package org.headwater.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.http.ApiServer;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code headwater demo}: harvests the invented demo workspace into a fresh temporary catalog and serves it. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Copy the demo workspace (an invented river-basin monitoring lab) to a temporary folder,",
                "harvest it into a fresh temporary catalog, and serve it. Everything is deleted at exit."})
final class DemoCommand implements Callable<Integer> {
    @Option(names = "--host", paramLabel = "ADDRESS", defaultValue = ApiServer.DEFAULT_HOST,
            description = "Address to listen on (default ${DEFAULT-VALUE}).")
    String host;

    @Option(names = "--port", paramLabel = "PORT", defaultValue = "" + ApiServer.DEFAULT_PORT,
            description = "Port to listen on (default ${DEFAULT-VALUE}; 0 picks a free one).")
    int port;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        Path temp = Files.createTempDirectory("headwater-demo-");
        Path workspace = DemoWorkspace.copyTo(temp.resolve("workspace"));
        Catalog catalog = Catalog.open(temp.resolve("catalog"));
        HarvestSummary summary;
        try {
            summary = catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        } catch (Exception e) {
            catalog.close();
            DemoWorkspace.deleteTree(temp);
            throw e;
        }
        ApiServer server;
        try {
            server = ApiServer.start(catalog, host, port);
        } catch (RuntimeException e) {
            catalog.close();
            throw new Problems.UsageProblem("cannot listen on " + host + ":" + port + ": " + ServeCommand.rootMessage(e)
                    + " (choose another with --port)");
        }
        var out = spec.commandLine().getOut();
        out.printf("Demo workspace %s: %d datasets, %d scripts%n", workspace, summary.datasets(), summary.scripts());
        out.println("Headwater demo is serving at " + server.url());
        out.println("Try " + server.url() + "api/search?q=nitrate  (stop with Ctrl-C)");
        out.flush();
        ServeCommand.awaitShutdown(server, catalog, () -> DemoWorkspace.deleteTree(temp));
        return Main.OK;
    }
}
