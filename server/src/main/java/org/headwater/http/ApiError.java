package org.headwater.http;

/**
 * A request the API refuses, with the status to answer, a stable {@code code} and a message for the
 * caller; answered as an RFC 9457 problem ({@link Problem}).
 */
public final class ApiError extends RuntimeException {
    private final int status;
    private final String code;
    private final long retryAfterSeconds;

    private ApiError(int status, String code, String message, long retryAfterSeconds) {
        super(message);
        this.status = status;
        this.code = code;
        this.retryAfterSeconds = retryAfterSeconds;
    }

    static ApiError of(int status, String code, String message) {
        return new ApiError(status, code, message, 0);
    }

    public static ApiError badRequest(String message) {
        return of(400, "bad_request", message);
    }

    public static ApiError unauthorized(String code, String message) {
        return of(401, code, message);
    }

    public static ApiError forbidden(String code, String message) {
        return of(403, code, message);
    }

    public static ApiError notFound(String message) {
        return of(404, "not_found", message);
    }

    /** The request contradicts what the catalog holds (a run id reused, an owner the owners file gives). */
    public static ApiError conflict(String message) {
        return of(409, "conflict", message);
    }

    public static ApiError unsupportedMediaType(String message) {
        return of(415, "unsupported_media_type", message);
    }

    public static ApiError tooManyRequests(long retryAfterSeconds) {
        return new ApiError(429, "rate_limited", "Too many requests; retry after " + retryAfterSeconds + " s",
                retryAfterSeconds);
    }

    public static ApiError unavailable(String message) {
        return of(503, "unavailable", message);
    }

    public int status() {
        return status;
    }

    public String code() {
        return code;
    }

    /** Seconds for a {@code Retry-After} header; 0 when none applies. */
    public long retryAfterSeconds() {
        return retryAfterSeconds;
    }
}
