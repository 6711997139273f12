package org.headwater.harvest.config;

import java.time.Duration;
import java.util.List;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;
import org.headwater.harvest.HarvestProgress;

/**
 * Runs the sources that have an {@code every} schedule, for {@code serve --config}: each source first
 * after its interval, then again that long after the previous run ended; and any source on request
 * ({@link #request}). One thread runs them all, so harvests never overlap and the server keeps its
 * other core.
 */
public final class SourceSchedule implements AutoCloseable {
    /** What became of a request to harvest a source now. */
    public enum Request { QUEUED, ALREADY_QUEUED, NO_SUCH_SOURCE }

    private final Set<String> requested = ConcurrentHashMap.newKeySet();
    private volatile SourcesConfig config;
    private volatile SourceRunner runner;
    private volatile Consumer<SourceRunner.Outcome> report;

    private final ScheduledExecutorService timer = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "headwater-schedule");
        t.setDaemon(true);
        return t;
    });

    /**
     * Schedules every source of the file that has a schedule.
     *
     * @param report hears each outcome (the server prints one line per harvest)
     * @return how many sources were scheduled
     */
    public int start(SourcesConfig config, SourceRunner runner, Consumer<SourceRunner.Outcome> report) {
        this.config = config;
        this.runner = runner;
        this.report = report;
        int scheduled = 0;
        for (SourceSpec spec : config.sources()) {
            if (spec.every().isEmpty()) {
                continue;
            }
            long seconds = spec.every().map(Duration::toSeconds).orElseThrow();
            timer.scheduleWithFixedDelay(() -> harvest(spec, false), seconds, seconds, TimeUnit.SECONDS);
            scheduled++;
        }
        return scheduled;
    }

    /** The sources of the file, scheduled or not; empty before {@link #start}. */
    public List<SourceSpec> sources() {
        return config == null ? List.of() : config.sources();
    }

    /** Whether a requested harvest of the source is waiting or running. */
    public boolean requested(String source) {
        return requested.contains(source);
    }

    /**
     * Queues one harvest of the named source behind whatever runs now. A source already waiting is not
     * queued twice: a caller who asks again (or a retrying client) gets the harvest already on its way.
     */
    public Request request(String source, boolean full) {
        SourceSpec spec = config == null ? null : config.source(source).orElse(null);
        if (spec == null) {
            return Request.NO_SUCH_SOURCE;
        }
        if (!requested.add(source)) {
            return Request.ALREADY_QUEUED;
        }
        timer.execute(() -> {
            try {
                harvest(spec, full);
            } finally {
                requested.remove(source);
            }
        });
        return Request.QUEUED;
    }

    /** Runs one harvest and reports it; never throws, since a scheduled task that throws never runs again. */
    private void harvest(SourceSpec spec, boolean full) {
        try {
            report.accept(runner.run(spec, full, HarvestProgress.NONE));
        } catch (RuntimeException e) {
            report.accept(new SourceRunner.Outcome(spec.name(), spec.kind(), "failed", null, null,
                    String.valueOf(e.getMessage())));
        }
    }

    /** Stops scheduling and waits (up to 30 s) for a running harvest to end its transaction. */
    @Override
    public void close() {
        timer.shutdownNow();
        try {
            timer.awaitTermination(30, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
