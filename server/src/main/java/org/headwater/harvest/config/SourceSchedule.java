package org.headwater.harvest.config;

import java.time.Duration;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.Consumer;
import org.headwater.harvest.HarvestProgress;

/**
 * Runs the sources that have an {@code every} schedule, for {@code serve --config}: each source first
 * after its interval, then again that long after the previous run ended. One thread runs them all, so
 * harvests never overlap and the server keeps its other core.
 */
public final class SourceSchedule implements AutoCloseable {
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
        int scheduled = 0;
        for (SourceSpec spec : config.sources()) {
            if (spec.every().isEmpty()) {
                continue;
            }
            long seconds = spec.every().map(Duration::toSeconds).orElseThrow();
            timer.scheduleWithFixedDelay(() -> {
                try {
                    report.accept(runner.run(spec, false, HarvestProgress.NONE));
                } catch (RuntimeException e) {
                    // A scheduled task that throws is never run again; a bad run must not end the schedule.
                    report.accept(new SourceRunner.Outcome(spec.name(), spec.kind(), "failed", null, null,
                            String.valueOf(e.getMessage())));
                }
            }, seconds, seconds, TimeUnit.SECONDS);
            scheduled++;
        }
        return scheduled;
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
