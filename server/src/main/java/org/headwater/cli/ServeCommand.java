package org.headwater.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import java.util.concurrent.CountDownLatch;
import java.util.function.Function;
import org.headwater.Catalog;
import org.headwater.harvest.config.ConfigException;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourceSchedule;
import org.headwater.harvest.config.SourcesConfig;
import org.headwater.http.ApiServer;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code headwater serve}: the HTTP API and web UI for one catalog, until stopped. */
@Command(name = "serve", mixinStandardHelpOptions = true,
        description = {"Serve the catalog over HTTP: the JSON API under /api and the web UI at /.",
                "Listens on 127.0.0.1 only unless --host says otherwise. Stop with Ctrl-C.",
                "With --config, the sources that have a schedule are harvested while it serves."})
final class ServeCommand implements Callable<Integer> {
    @Mixin
    ListenOptions listen;

    @Mixin
    CatalogOptions catalog;

    @Option(names = "--config", paramLabel = "FILE",
            description = "A sources file: sources with an 'every' schedule are harvested while serving.")
    java.nio.file.Path config;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        SourcesConfig sources = config == null ? null : readSources(config);
        SourceSchedule schedule = new SourceSchedule();
        PrintWriter out = spec.commandLine().getOut();
        // The store opens while the HTTP server starts: the two are the bulk of start-up time.
        CompletableFuture<Catalog> opening = CompletableFuture.supplyAsync(catalog::open).thenApply(c -> {
            if (sources != null) {
                int n = schedule.start(sources, new SourceRunner(c, Databases.of(c), System::getenv), o -> {
                    synchronized (out) {
                        out.println("harvest of " + o.source() + ": " + o.status()
                                + (o.message() == null ? "" : ": " + o.message()));
                        out.flush();
                    }
                });
                out.println("Harvesting " + n + " scheduled source" + (n == 1 ? "" : "s") + " from " + config);
            }
            return c;
        });
        serveUntilStopped(opening, listen.host, listen.port, out,
                server -> "Headwater is serving " + catalog.dataDir.toAbsolutePath().normalize() + " at " + server.url(),
                schedule::close, () -> { });
        return Main.OK;
    }

    static SourcesConfig readSources(java.nio.file.Path file) throws java.io.IOException {
        try {
            return SourcesConfig.read(file);
        } catch (java.nio.file.NoSuchFileException e) {
            throw new Problems.UsageProblem("no such sources file: " + file);
        } catch (ConfigException e) {
            throw new Problems.UsageProblem(e.getMessage());
        }
    }

    static void serveUntilStopped(CompletableFuture<Catalog> opening, String host, int port, PrintWriter out,
            Function<ApiServer, String> greeting, Runnable afterClose) throws InterruptedException {
        serveUntilStopped(opening, host, port, out, greeting, () -> { }, afterClose);
    }

    /**
     * Starts the HTTP server on a catalog that may still be opening, prints the greeting once both are
     * ready, and serves until the process is asked to stop. Then it closes the server, then the catalog,
     * then runs {@code afterClose}: one shutdown hook does all three, because the JVM runs separate hooks
     * in no set order.
     */
    static void serveUntilStopped(CompletableFuture<Catalog> opening, String host, int port, PrintWriter out,
            Function<ApiServer, String> greeting, Runnable beforeClose, Runnable afterClose) throws InterruptedException {
        ApiServer server;
        try {
            server = ApiServer.start(opening, host, port);
        } catch (RuntimeException e) {
            opening.whenComplete((c, failure) -> {
                if (c != null) {
                    beforeClose.run();
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
            beforeClose.run();
            afterClose.run();
            throw e.getCause() instanceof RuntimeException r ? r : e;
        }
        out.println(greeting.apply(server));
        out.flush();
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            try {
                server.close();
                beforeClose.run();
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
