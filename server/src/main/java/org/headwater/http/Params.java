package org.headwater.http;

import io.javalin.http.Context;
import java.time.Instant;
import org.headwater.model.Times;

/** Reads and checks query and path parameters; a bad value is a 400 that names the parameter. */
final class Params {
    private Params() {
    }

    static int intParam(Context ctx, String name, int fallback, int min, int max) {
        String raw = ctx.queryParam(name);
        if (raw == null || raw.isBlank()) {
            return fallback;
        }
        try {
            int value = Integer.parseInt(raw.trim());
            if (value < min || value > max) {
                throw ApiError.badRequest("Parameter '" + name + "' must be between " + min + " and " + max + ", got " + value);
            }
            return value;
        } catch (NumberFormatException e) {
            throw ApiError.badRequest("Parameter '" + name + "' must be a whole number, got '" + raw + "'");
        }
    }

    static long longValue(String name, String raw) {
        try {
            return Long.parseLong(raw);
        } catch (NumberFormatException e) {
            throw ApiError.badRequest("Parameter '" + name + "' must be a whole number, got '" + raw + "'");
        }
    }

    static long pathId(Context ctx, String name) {
        String raw = ctx.pathParam(name);
        try {
            return Long.parseLong(raw);
        } catch (NumberFormatException e) {
            throw ApiError.badRequest("'" + raw + "' is not an id; ids are whole numbers");
        }
    }

    /** {@code as_of} as an ISO instant ({@code 2026-03-01T12:00:00Z}) or a date (midnight UTC at its end). */
    static Instant asOf(Context ctx) {
        String raw = ctx.queryParam("as_of");
        return raw == null || raw.isBlank() ? null : parseTime(raw.trim());
    }

    /** A time parameter other than {@code as_of}, in the same forms. */
    static Instant asOfNamed(Context ctx, String name) {
        String raw = ctx.queryParam(name);
        return raw == null || raw.isBlank() ? null : parseTime(raw.trim());
    }

    static Instant parseTime(String raw) {
        try {
            return Times.parse(raw);
        } catch (IllegalArgumentException e) {
            throw ApiError.badRequest(e.getMessage());
        }
    }

    static String optional(Context ctx, String name) {
        String raw = ctx.queryParam(name);
        return raw == null || raw.isBlank() ? null : raw.trim();
    }
}
