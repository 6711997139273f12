package org.headwater.http;

import io.javalin.http.Context;
import io.javalin.http.HttpStatus;

/**
 * The body of every error answer: an RFC 9457 problem detail ({@code application/problem+json}) with our
 * stable {@code code} as an extension member. The type is {@code about:blank}, so the title is the
 * status phrase (RFC 9457 section 4.2.1) and {@code code} tells problems of one status apart.
 */
public record Problem(String type, String title, int status, String detail, String instance, String code) {
    public static final String MEDIA_TYPE = "application/problem+json";

    static Problem of(int status, String code, String detail, String instance) {
        return new Problem("about:blank", HttpStatus.forStatus(status).getMessage(), status, detail, instance, code);
    }

    /** Answers {@code ctx} with this problem, status and content type set. */
    static void answer(Context ctx, int status, String code, String detail) {
        Problem problem = of(status, code, detail, ctx.path());
        ctx.status(status);
        ctx.json(problem);
        ctx.contentType(MEDIA_TYPE);
    }
}
