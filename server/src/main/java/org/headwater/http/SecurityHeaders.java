package org.headwater.http;

import io.javalin.http.Context;
import java.util.Map;

/** Headers sent with every answer, the web UI's pages included. */
final class SecurityHeaders {
    /** Header name to value; a table so that a review reads them in one place. */
    static final Map<String, String> HEADERS = Map.of(
            // The UI loads only its own scripts, styles and images; no plugins, no framing, no <base>.
            "Content-Security-Policy", "default-src 'self'; script-src 'self'; object-src 'none'; "
                    + "frame-ancestors 'none'; base-uri 'none'; form-action 'self'",
            "X-Content-Type-Options", "nosniff",
            "X-Frame-Options", "DENY",
            "Referrer-Policy", "no-referrer",
            "Cross-Origin-Opener-Policy", "same-origin",
            "Cross-Origin-Resource-Policy", "same-origin");

    private SecurityHeaders() {
    }

    static void add(Context ctx) {
        HEADERS.forEach(ctx::header);
    }
}
