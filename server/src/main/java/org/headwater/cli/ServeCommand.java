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
import org.headwater.http.ServerSettings;
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

    @Option(names = "--check-every", paramLabel = "DURATION", defaultValue = "10m",
            description = "Run the freshness checks this often, the first time at start (default ${DEFAULT-VALUE};"
                    + " for example 90s, 30m, 1h; 'off' runs none).")
    String checkEvery;

    @Option(names = "--webhook", paramLabel = "URL",
            description = "POST the freshness state changes of each check run to this http(s) URL as JSON"
                    + " (retried up to 5 times with backoff).")
    java.net.URI webhook;

    @Option(names = "--config", paramLabel = "FILE",
            description = "A sources file: sources with an 'every' schedule are harvested while serving.")
    java.nio.file.Path config;
    @Option(names = "--no-anonymous-read", negatable = false,
            description = "Answer reads only with a token (of any role); by default anyone who can reach the server may read.")
    boolean noAnonymousRead;

    @Option(names = "--root", paramLabel = "DIR",
            description = "A folder that run records may name (repeatable). Without any, every path is accepted.")
    java.util.List<java.nio.file.Path> roots = new java.util.ArrayList<>();

    @Option(names = "--rate-limit", paramLabel = "N", defaultValue = "50",
            description = "Requests per second per token, or per address without one (bursts of 4 N; default ${DEFAULT-VALUE}).")
    double rateLimit;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        java.time.Duration period = checkPeriod();
        org.headwater.checks.Webhook hook = webhookOption();
        SourcesConfig sources = config == null ? null : readSources(config);
        PrintWriter out = spec.commandLine().getOut();
        for (java.nio.file.Path root : roots) {
            if (!java.nio.file.Files.isDirectory(root)) {
                throw new Problems.UsageProblem("--root " + root + " is not a folder");
            }
        }
        if (rateLimit <= 0) {
            throw new Problems.UsageProblem("--rate-limit must be more than 0");
        }
        ServerSettings settings = ServerSettings.defaults().withAnonymousRead(!noAnonymousRead).withRoots(roots)
                .withRate(rateLimit, 4 * rateLimit);
        // The store opens while the HTTP server starts: the two are the bulk of start-up time.
        serveUntilStopped(CompletableFuture.supplyAsync(catalog::open), listen.host, listen.port, settings, out,
                server -> "Headwater is serving " + catalog.describe() + " at " + server.url(),
                (server, open) -> {
                    AutoCloseable checks = period == null ? () -> { }
                            : org.headwater.checks.CheckSchedule.start(open::freshness, period, hook);
                    SourceSchedule harvests = startHarvests(open, sources, out);
                    if (sources != null) {
                        server.offerSources(harvests);
                    }
                    return () -> {
                        harvests.close();
                        checks.close();
                    };
                },
                () -> { });
        return Main.OK;
    }

    /** Starts the scheduled harvests of the sources file, if one was given. */
    private SourceSchedule startHarvests(Catalog open, SourcesConfig sources, PrintWriter out) {
        SourceSchedule schedule = new SourceSchedule();
        if (sources != null) {
            int n = schedule.start(sources, new SourceRunner(open, Databases.of(open), System::getenv), o -> {
                synchronized (out) {
                    out.println("harvest of " + o.source() + ": " + o.status()
                            + (o.message() == null ? "" : ": " + o.message()));
                    out.flush();
                }
            });
            out.println("Harvesting " + n + " scheduled source" + (n == 1 ? "" : "s") + " from " + config);
        }
        return schedule;
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

    private java.time.Duration checkPeriod() {
        if (checkEvery.trim().equalsIgnoreCase("off")) {
            return null;
        }
        try {
            return org.headwater.checks.Durations.parse(checkEvery);
        } catch (IllegalArgumentException e) {
            throw new Problems.UsageProblem("--check-every: " + e.getMessage());
        }
    }

    private org.headwater.checks.Webhook webhookOption() {
        if (webhook == null) {
            return null;
        }
        try {
            return new org.headwater.checks.Webhook(org.headwater.checks.Webhook.Settings.defaults(webhook));
        } catch (IllegalArgumentException e) {
            throw new Problems.UsageProblem("--webhook: " + e.getMessage());
        }
    }

    /**
     * Starts the HTTP server on a catalog that may still be opening, prints the greeting once both are
     * ready, and serves until the process is asked to stop. Then it closes the server, then the catalog,
     * then runs {@code afterClose}: one shutdown hook does all three, because the JVM runs separate hooks
     * in no set order.
     */
    static void serveUntilStopped(CompletableFuture<Catalog> opening, String host, int port, ServerSettings settings,
            PrintWriter out,
            Function<ApiServer, String> greeting, Runnable afterClose) throws InterruptedException {
        serveUntilStopped(opening, host, port, settings, out, greeting, (server, open) -> () -> { }, afterClose);
    }

    /**
     * As above, and starts {@code alongside} (the scheduled checks and harvests) once the catalog is open;
     * what it returns is closed before the server and the catalog.
     */
    static void serveUntilStopped(CompletableFuture<Catalog> opening, String host, int port, ServerSettings settings,
            PrintWriter out, Function<ApiServer, String> greeting,
            java.util.function.BiFunction<ApiServer, Catalog, AutoCloseable> alongside,
            Runnable afterClose)
            throws InterruptedException {
        ApiServer server;
        try {
            server = ApiServer.start(opening, host, port, settings);
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
        AutoCloseable companion = alongside.apply(server, catalog);
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            try {
                closeQuietly(companion);
                server.close();
                catalog.close();
            } finally {
                afterClose.run();
                stopped.countDown();
            }
        }, "headwater-shutdown"));
        stopped.await();
    }

    private static void closeQuietly(AutoCloseable closeable) {
        try {
            closeable.close();
        } catch (Exception e) {
            // Stopping anyway; the catalog and server still close.
        }
    }

    static String rootMessage(Throwable e) {
        Throwable t = e;
        while (t.getCause() != null) {
            t = t.getCause();
        }
        return t.getMessage();
    }
}
