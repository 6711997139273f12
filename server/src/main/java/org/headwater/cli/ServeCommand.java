package org.headwater.cli;

import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import org.headwater.Catalog;
import org.headwater.http.ApiServer;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code headwater serve}: the HTTP API and web UI for one catalog, until stopped. */
@Command(name = "serve", mixinStandardHelpOptions = true,
        description = {"Serve the catalog over HTTP: the JSON API under /api and the web UI at /.",
                "Listens on 127.0.0.1 only unless --host says otherwise. Stop with Ctrl-C."})
final class ServeCommand implements Callable<Integer> {
    @Option(names = "--host", paramLabel = "ADDRESS", defaultValue = ApiServer.DEFAULT_HOST,
            description = "Address to listen on (default ${DEFAULT-VALUE}).")
    String host;

    @Option(names = "--port", paramLabel = "PORT", defaultValue = "" + ApiServer.DEFAULT_PORT,
            description = "Port to listen on (default ${DEFAULT-VALUE}; 0 picks a free one).")
    int port;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws InterruptedException {
        Catalog open = catalog.open();
        ApiServer server;
        try {
            server = ApiServer.start(open, host, port);
        } catch (RuntimeException e) {
            open.close();
            throw new Problems.UsageProblem("cannot listen on " + host + ":" + port + ": " + rootMessage(e));
        }
        var out = spec.commandLine().getOut();
        out.println("Headwater is serving " + open.dataDir() + " at " + server.url());
        out.flush();
        awaitShutdown(server, open, () -> { });
        return Main.OK;
    }

    /**
     * Blocks until the process is asked to stop, then closes the server, then the catalog, then runs
     * {@code afterClose}; one hook does all three because the JVM runs separate hooks in no set order.
     */
    static void awaitShutdown(ApiServer server, Catalog catalog, Runnable afterClose) throws InterruptedException {
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            try {
                server.close();
                catalog.close();
            } finally {
                afterClose.run();
                stopped.countDown();
            }
        }, "headwater-shutdown"));
        stopped.await();
    }

    static String rootMessage(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null) {
            t = t.getCause();
        }
        return t.getMessage();
    }
}
