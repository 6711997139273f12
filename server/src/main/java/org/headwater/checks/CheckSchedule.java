package org.headwater.checks;

import com.fasterxml.jackson.annotation.JsonProperty;
import com.fasterxml.jackson.core.JsonProcessingException;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.function.Supplier;
import org.headwater.http.ApiJson;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Runs the freshness checks of a serving catalog on a fixed period (first at start) and posts the state
 * changes to a webhook. Nothing it meets stops the server: a failed run is logged and the next one comes.
 */
public final class CheckSchedule implements AutoCloseable {
    private static final Logger LOG = LoggerFactory.getLogger(CheckSchedule.class);
    /** How often {@code serve} checks unless told otherwise. */
    public static final Duration DEFAULT_PERIOD = Duration.ofMinutes(10);

    private final Supplier<FreshnessChecks> checks;
    private final Webhook webhook;
    private final ScheduledExecutorService timer;
    private final ExecutorService delivery;

    private CheckSchedule(Supplier<FreshnessChecks> checks, Webhook webhook) {
        this.checks = checks;
        this.webhook = webhook;
        this.timer = Executors.newSingleThreadScheduledExecutor(r -> daemon(r, "headwater-checks"));
        // Deliveries wait and retry on their own thread, so a slow receiver never delays a check; one thread
        // keeps them in order.
        this.delivery = Executors.newSingleThreadExecutor(r -> daemon(r, "headwater-webhook"));
    }

    /**
     * Starts checking every {@code period}, the first time now.
     *
     * @param webhook where to post state changes, or null for none
     */
    public static CheckSchedule start(Supplier<FreshnessChecks> checks, Duration period, Webhook webhook) {
        CheckSchedule schedule = new CheckSchedule(checks, webhook);
        schedule.timer.scheduleWithFixedDelay(schedule::runOnce, 0, period.toMillis(), TimeUnit.MILLISECONDS);
        return schedule;
    }

    /** The body of a webhook post: the changes one check run found. */
    public record Payload(@JsonProperty("event") String event, @JsonProperty("checkedAt") Instant checkedAt,
            @JsonProperty("changes") List<Transition> changes, @JsonProperty("counts") Map<String, Integer> counts) {
        public static final String EVENT = "freshness-changed";
    }

    /**
     * The changes worth a post: every change of a state known before, and a dataset's first state when it
     * fails (a first run over a new catalog would otherwise post every dataset's first "unknown").
     */
    static List<Transition> worthTelling(List<Transition> transitions) {
        return transitions.stream()
                .filter(t -> t.previousState() != null || t.check().freshnessState().fails())
                .toList();
    }

    void runOnce() {
        try {
            FreshnessChecks.Recorded recorded = checks.get().record();
            List<Transition> changes = worthTelling(recorded.transitions());
            LOG.info("Freshness checked: {} ({} changed)", recorded.report().counts(), recorded.transitions().size());
            if (webhook != null && !changes.isEmpty()) {
                String json = body(new Payload(Payload.EVENT, recorded.report().checkedAt(), changes,
                        recorded.report().counts()));
                delivery.execute(() -> webhook.send(json));
            }
        } catch (RuntimeException e) {
            LOG.error("Freshness check run failed; the next one runs as scheduled", e);
        }
    }

    static String body(Payload payload) {
        try {
            return ApiJson.mapper().writeValueAsString(payload);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("Webhook payload not representable as JSON", e);
        }
    }

    @Override
    public void close() {
        timer.shutdownNow();
        delivery.shutdownNow();
        try {
            timer.awaitTermination(5, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    private static Thread daemon(Runnable r, String name) {
        Thread t = new Thread(r, name);
        t.setDaemon(true);
        return t;
    }
}
