package org.headwater.http;

import io.javalin.http.Context;
import io.javalin.http.Handler;
import java.time.Duration;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.Future;
import java.util.concurrent.RejectedExecutionException;
import java.util.concurrent.ThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;

/**
 * Runs the handlers of expensive queries (search, lineage, whence) on a small bounded pool with a time
 * limit: past it, or when the pool and its queue are full, the caller gets a 503 with a message instead
 * of waiting. The worker is not interrupted (an interrupt would close the search index's file channels);
 * it finishes on its own and its late answer is dropped, because the response is then already sent.
 */
final class QueryLimit implements AutoCloseable {
    private final Duration limit;
    private final ThreadPoolExecutor pool;

    QueryLimit(Duration limit) {
        this.limit = limit;
        int threads = Math.max(2, Runtime.getRuntime().availableProcessors() * 2);
        this.pool = new ThreadPoolExecutor(threads, threads, 30, TimeUnit.SECONDS, new ArrayBlockingQueue<>(256), r -> {
            Thread t = new Thread(r, "headwater-query");
            t.setDaemon(true);
            return t;
        });
    }

    /** The handler, bounded in time. */
    Handler bounded(Handler handler) {
        return ctx -> run(ctx, handler);
    }

    private void run(Context ctx, Handler handler) throws Exception {
        Future<?> future;
        try {
            future = pool.submit(() -> {
                handler.handle(ctx);
                return null;
            });
        } catch (RejectedExecutionException e) {
            throw ApiError.unavailable("The server is busy with other queries; try again in a moment");
        }
        try {
            future.get(limit.toMillis(), TimeUnit.MILLISECONDS);
        } catch (TimeoutException e) {
            future.cancel(false);
            throw ApiError.of(503, "query_timeout", "The query took longer than " + limit.toMillis()
                    + " ms and was stopped; narrow it (a smaller limit, fewer words)");
        } catch (ExecutionException e) {
            if (e.getCause() instanceof Exception cause) {
                throw cause;
            }
            throw e;
        }
    }

    @Override
    public void close() {
        pool.shutdown();
    }
}
