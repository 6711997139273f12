package org.headwater.http;

import io.javalin.config.RoutesConfig;
import io.javalin.http.HttpResponseException;
import io.javalin.http.HttpStatus;
import java.util.Map;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/** Maps every failure to an RFC 9457 problem answer; a stack trace never reaches the caller. */
final class Errors {
    private static final Logger LOG = LoggerFactory.getLogger(Errors.class);

    /** Stable codes for the statuses Javalin and Jetty raise themselves. */
    private static final Map<Integer, String> CODES = Map.of(
            400, "bad_request", 404, "not_found", 405, "method_not_allowed", 408, "request_timeout",
            413, "body_too_large", 415, "unsupported_media_type", 429, "rate_limited", 503, "unavailable");

    private Errors() {
    }

    /** The stable code of a status the server raises without a route's own code. */
    static String codeFor(int status) {
        return CODES.getOrDefault(status, "http_" + status);
    }

    static void register(RoutesConfig routes) {
        routes.exception(ApiError.class, (e, ctx) -> {
            if (e.retryAfterSeconds() > 0) {
                ctx.header("Retry-After", Long.toString(e.retryAfterSeconds()));
            }
            Problem.answer(ctx, e.status(), e.code(), e.getMessage());
        });
        routes.exception(HttpResponseException.class, (e, ctx) -> {
            int status = e.getStatus();
            String detail = status == 413 ? "The request body is larger than this server accepts" : e.getMessage();
            Problem.answer(ctx, status, codeFor(status), detail);
        });
        routes.exception(Exception.class, (e, ctx) -> {
            // Never a stack trace to the caller; the log keeps it for whoever runs the server.
            LOG.error("Request {} {} failed", ctx.method(), ctx.path(), e);
            Problem.answer(ctx, HttpStatus.INTERNAL_SERVER_ERROR.getCode(), "internal",
                    "The server could not answer this request; see its log");
        });
        routes.error(404, ctx -> {
            if (Access.guarded(ctx.path()) && ctx.result() == null) {
                Problem.answer(ctx, 404, "not_found", "No such endpoint: " + ctx.method() + " " + ctx.path());
            }
        });
        routes.error(405, ctx -> {
            if (Access.guarded(ctx.path())) {
                Problem.answer(ctx, 405, "method_not_allowed", "This endpoint does not take " + ctx.method());
            }
        });
    }
}
