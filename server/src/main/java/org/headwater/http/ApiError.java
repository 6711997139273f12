package org.headwater.http;

/** A request the API refuses, with the status to answer and a message for the caller. */
public final class ApiError extends RuntimeException {
    private final int status;
    private final String code;

    private ApiError(int status, String code, String message) {
        super(message);
        this.status = status;
        this.code = code;
    }

    public static ApiError badRequest(String message) {
        return new ApiError(400, "bad_request", message);
    }

    public static ApiError notFound(String message) {
        return new ApiError(404, "not_found", message);
    }

    /** The request contradicts a rule the catalog keeps (an owner given by the owners file, removed by hand). */
    public static ApiError conflict(String message) {
        return new ApiError(409, "conflict", message);
    }

    public static ApiError unavailable(String message) {
        return new ApiError(503, "unavailable", message);
    }

    public int status() {
        return status;
    }

    public String code() {
        return code;
    }

    /** The JSON body of an error answer. */
    public record Body(String error, String message) {
    }
}
