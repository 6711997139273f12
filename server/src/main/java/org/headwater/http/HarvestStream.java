package org.headwater.http;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import io.javalin.http.Context;
import io.javalin.http.sse.SseClient;
import io.javalin.http.sse.SseHandler;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.Executors;
import java.util.concurrent.ScheduledExecutorService;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;
import org.headwater.Catalog;
import org.headwater.ingest.HarvestEvent;

/**
 * {@code GET /api/harvest-events}: the harvests of this server's process as they happen, as server-sent
 * events (WHATWG HTML, "Server-sent events"). Each event's name is its type ({@code started},
 * {@code progress}, {@code problem}, {@code finished}) and its data one JSON object; a new stream first gets
 * {@code hello} and the running harvests. Progress is sent at most every {@value #PROGRESS_MILLIS} ms per
 * harvest and at most {@value #ERRORS_PER_HARVEST} problem events per harvest (the counts go on), so a
 * harvest of many files cannot flood a browser. One thread writes to every stream: a harvest never waits
 * for a browser.
 */
final class HarvestStream implements AutoCloseable {
    /** Open streams at once; past it a 503, and the page polls instead. */
    static final int MAX_CLIENTS = 32;
    static final long PROGRESS_MILLIS = 250;
    static final int ERRORS_PER_HARVEST = 100;
    /** A comment line this often finds streams whose browser has gone. */
    static final long HEARTBEAT_SECONDS = 15;

    private final CatalogHolder catalog;
    private final ObjectMapper mapper;
    private final Set<SseClient> clients = ConcurrentHashMap.newKeySet();
    private final Map<Long, HarvestEvent> pendingProgress = new ConcurrentHashMap<>();
    private final Map<Long, Integer> errorsSent = new ConcurrentHashMap<>();
    private final AtomicLong sequence = new AtomicLong();
    private final ScheduledExecutorService sender = Executors.newSingleThreadScheduledExecutor(r -> {
        Thread t = new Thread(r, "headwater-harvest-events");
        t.setDaemon(true);
        return t;
    });
    private volatile AutoCloseable subscription;

    HarvestStream(CatalogHolder catalog, ObjectMapper mapper) {
        this.catalog = catalog;
        this.mapper = mapper;
        sender.scheduleWithFixedDelay(this::flushProgress, PROGRESS_MILLIS, PROGRESS_MILLIS, TimeUnit.MILLISECONDS);
        sender.scheduleWithFixedDelay(this::heartbeat, HEARTBEAT_SECONDS, HEARTBEAT_SECONDS, TimeUnit.SECONDS);
    }

    void handle(Context ctx) throws Exception {
        subscribe(catalog.get());
        if (clients.size() >= MAX_CLIENTS) {
            throw ApiError.unavailable("Too many open harvest status streams (" + MAX_CLIENTS + "); poll /api/harvests instead");
        }
        new SseHandler(this::connected).handle(ctx);
    }

    private synchronized void subscribe(Catalog open) {
        if (subscription == null) {
            subscription = open.journal().listen(this::heard);
        }
    }

    private void connected(SseClient client) {
        client.keepAlive();
        client.onClose(() -> clients.remove(client));
        sender.execute(() -> {
            List<HarvestEvent> running = catalog.get().journal().running();
            Map<String, Object> hello = new LinkedHashMap<>();
            hello.put("running", running.size());
            hello.put("progress_millis", PROGRESS_MILLIS);
            send(client, "hello", hello);
            for (HarvestEvent e : running) {
                send(client, e.type(), e);
            }
            if (!client.terminated()) {
                clients.add(client);
            }
        });
    }

    /** On the harvesting thread: progress is only noted, everything else is queued for the sender. */
    private void heard(HarvestEvent event) {
        switch (event.type()) {
            case HarvestEvent.PROGRESS -> pendingProgress.put(event.harvestId(), event);
            case HarvestEvent.PROBLEM -> sender.execute(() -> {
                int sent = errorsSent.merge(event.harvestId(), 1, Integer::sum);
                if (sent <= ERRORS_PER_HARVEST) {
                    broadcast(event.type(), event);
                }
            });
            case HarvestEvent.FINISHED -> sender.execute(() -> {
                // A harvest shorter than one progress period still tells its last count before its outcome.
                HarvestEvent last = pendingProgress.remove(event.harvestId());
                if (last != null) {
                    broadcast(last.type(), last);
                }
                errorsSent.remove(event.harvestId());
                broadcast(event.type(), event);
            });
            default -> sender.execute(() -> broadcast(event.type(), event));
        }
    }

    private void flushProgress() {
        for (Long id : List.copyOf(pendingProgress.keySet())) {
            HarvestEvent e = pendingProgress.remove(id);
            if (e != null) {
                broadcast(e.type(), e);
            }
        }
    }

    private void heartbeat() {
        for (SseClient c : clients) {
            if (c.terminated()) {
                clients.remove(c);
            } else {
                c.sendComment("still here");
            }
        }
    }

    private void broadcast(String name, Object data) {
        for (SseClient c : clients) {
            send(c, name, data);
        }
    }

    private void send(SseClient client, String name, Object data) {
        if (client.terminated()) {
            clients.remove(client);
            return;
        }
        try {
            client.sendEvent(name, mapper.writeValueAsString(data), String.valueOf(sequence.incrementAndGet()));
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("A harvest event could not be written as JSON", e);
        } catch (RuntimeException e) {
            clients.remove(client);
        }
    }

    /** Ends every stream (browsers reconnect to the next server) and stops listening. */
    @Override
    public void close() {
        sender.shutdownNow();
        for (SseClient c : clients) {
            try {
                c.close();
            } catch (RuntimeException e) {
                // already gone
            }
        }
        clients.clear();
        AutoCloseable s = subscription;
        if (s != null) {
            try {
                s.close();
            } catch (Exception e) {
                // the journal's handle does not throw
            }
        }
    }
}
