package org.headwater.http;

import io.javalin.http.Context;

/** {@code GET /api/audit}: the audit log, newest first; admins only (declared where the route is registered). */
final class AuditRoutes {
    private final Access access;

    AuditRoutes(Access access) {
        this.access = access;
    }

    void list(Context ctx) {
        ctx.json(access.audit().list(Params.asOfNamed(ctx, "since"), Params.optional(ctx, "action"),
                Params.intParam(ctx, "limit", 100, 1, 10_000)));
    }
}
