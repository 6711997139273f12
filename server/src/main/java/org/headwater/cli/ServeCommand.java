package org.headwater.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.CountDownLatch;
import java.util.function.Function;
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
    @Mixin
    ListenOptions listen;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws InterruptedException {
        // The store opens while the HTTP server starts: the two are the bulk of start-up time.
        serveUntilStopped(CompletableFuture.supplyAsync(catalog::open), listen.host, listen.port, spec.commandLine().getOut(),
                server -> "Headwater is serving " + catalog.describe() + " at " + server.url(),
                () -> { });
        return Main.OK;
    }

    /**
     * Starts the HTTP server on a catalog that may still be opening, prints the greeting once both are
     * ready, and serves until the process is asked to stop. Then it closes the server, then the catalog,
     * then runs {@code afterClose}: one shutdown hook does all three, because the JVM runs separate hooks
     * in no set order.
     */
    static void serveUntilStopped(CompletableFuture<Catalog> opening, String host, int port, PrintWriter out,
            Function<ApiServer, String> greeting, Runnable afterClose) throws InterruptedException {
        ApiServer server;
        try {
            server = ApiServer.start(opening, host, port);
        } catch (RuntimeException e) {
            opening.whenComplete((c, failure) -> {
                if (c != null) {
                    c.close();
                }
                afterClose.run();
            });
            throw new Problems.UsageProblem("cannot listen on " + host + ":" + port + ": " + rootMessage(e)
                    + " (choose another with --port)");
        }
        Catalog catalog;
        try {
            catalog = opening.join();
        } catch (CompletionException e) {
            server.close();
            afterClose.run();
            throw e.getCause() instanceof RuntimeException r ? r : e;
        }
        out.println(greeting.apply(server));
        out.flush();
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
