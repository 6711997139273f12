package org.headwater.http;

import static org.headwater.store.schema.Tables.HARVEST;

import io.javalin.http.Context;
import io.micrometer.core.instrument.Counter;
import io.micrometer.core.instrument.Gauge;
import io.micrometer.core.instrument.Timer;
import io.micrometer.core.instrument.binder.jvm.ClassLoaderMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmGcMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmMemoryMetrics;
import io.micrometer.core.instrument.binder.jvm.JvmThreadMetrics;
import io.micrometer.core.instrument.binder.system.ProcessorMetrics;
import io.micrometer.core.instrument.binder.system.UptimeMetrics;
import io.micrometer.prometheusmetrics.PrometheusConfig;
import io.micrometer.prometheusmetrics.PrometheusMeterRegistry;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.ingest.HarvestJournal;

/**
 * The server's metrics, scraped at {@code GET /metrics} in the Prometheus text format: requests per
 * route (count and latency), ingestion batches and changes, harvests by status, index documents,
 * catalog sizes and the JVM's own meters.
 */
final class Metrics {
    static final String CONTENT_TYPE = "text/plain; version=0.0.4; charset=utf-8";
    private static final String STARTED = "headwater.metrics.started";

    private final PrometheusMeterRegistry registry = new PrometheusMeterRegistry(PrometheusConfig.DEFAULT);

    Metrics() {
        new JvmMemoryMetrics().bindTo(registry);
        new JvmGcMetrics().bindTo(registry);
        new JvmThreadMetrics().bindTo(registry);
        new ClassLoaderMetrics().bindTo(registry);
        new ProcessorMetrics().bindTo(registry);
        new UptimeMetrics().bindTo(registry);
    }

    /** Adds the catalog's meters once it is open. */
    void bind(Catalog catalog) {
        Counter batches = Counter.builder("headwater.ingest.batches").description("Batches committed by the ingestor")
                .register(registry);
        Counter changes = Counter.builder("headwater.ingest.changes").description("Catalog changes committed")
                .register(registry);
        catalog.ingestor().addListener(committed -> {
            batches.increment();
            changes.increment(committed.size());
        });
        Gauge.builder("headwater.index.documents", catalog.index(), i -> i.documentCount())
                .description("Documents in the search index").register(registry);
        Gauge.builder("headwater.catalog.datasets", catalog.reader(), r -> r.datasetCount()).register(registry);
        Gauge.builder("headwater.catalog.scripts", catalog.reader(), r -> r.scriptCount()).register(registry);
        for (String status : List.of(HarvestJournal.OK, HarvestJournal.WITH_ERRORS, HarvestJournal.FAILED,
                HarvestJournal.RUNNING)) {
            Gauge.builder("headwater.harvests", catalog, c -> c.store().dsl().fetchCount(HARVEST, HARVEST.STATUS.eq(status)))
                    .description("Harvests recorded in the store, by status").tag("status", status).register(registry);
        }
    }

    /** A {@code before} handler: notes when the request started. */
    void start(Context ctx) {
        ctx.attribute(STARTED, System.nanoTime());
    }

    /** An {@code after} handler: one timer per method, route template and status. */
    void stop(Context ctx) {
        Long started = ctx.attribute(STARTED);
        if (started == null) {
            return;
        }
        Timer.builder("headwater.http.requests")
                .tag("method", ctx.method().name())
                .tag("route", route(ctx))
                .tag("status", Integer.toString(ctx.statusCode()))
                .register(registry)
                .record(System.nanoTime() - started, java.util.concurrent.TimeUnit.NANOSECONDS);
    }

    /** The route template, not the path, so that ids do not each make a new series. */
    private static String route(Context ctx) {
        if (!Access.guarded(ctx.path())) {
            return "static";
        }
        try {
            var matched = ctx.endpoints().matchedHttpEndpoint();
            return matched == null ? "unmatched" : matched.path;
        } catch (RuntimeException e) {
            return "unmatched";
        }
    }

    void scrape(Context ctx) {
        ctx.contentType(CONTENT_TYPE).result(registry.scrape());
    }
}
