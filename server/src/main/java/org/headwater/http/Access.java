package org.headwater.http;

import io.javalin.http.Context;
import io.javalin.http.HandlerType;
import io.javalin.security.RouteRole;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import org.headwater.access.Audit;
import org.headwater.access.Role;
import org.headwater.access.Tokens;
import org.headwater.access.Tokens.Token;

/**
 * Checks every API request against the role its route declares where it is registered
 * ({@code config.routes.put(path, handler, Role.EDITOR)}). A read route without a role needs
 * {@link Role#READER}; a write route (any method but GET, HEAD, OPTIONS) without a role is refused,
 * so a new write endpoint is closed until someone declares who may call it.
 *
 * <p>Writes are CSRF-safe because a token only ever comes in an {@code Authorization: Bearer} header
 * (never a cookie, which a browser would attach to a forged cross-site request by itself) and because a
 * write body must be {@code application/json}: another site's page can send neither a custom header nor
 * that content type to us without a CORS preflight, and this server answers no preflight.
 */
final class Access {
    static final String TOKEN = "headwater.token";
    private static final String AUDITED = "headwater.audited";
    private static final Set<HandlerType> READS = Set.of(HandlerType.GET, HandlerType.HEAD, HandlerType.OPTIONS);
    /** Reads by a token are audited at most this often per token; every write is audited. */
    private static final long READ_AUDIT_STEP_MILLIS = 60_000;

    private final CatalogHolder catalog;
    private final ServerSettings settings;
    private final RateLimiter limiter;
    private final Map<Long, Long> lastReadAudit = new ConcurrentHashMap<>();

    private volatile Tokens tokens;
    private volatile Audit audit;

    Access(CatalogHolder catalog, ServerSettings settings) {
        this.catalog = catalog;
        this.settings = settings;
        this.limiter = new RateLimiter(settings.ratePerSecond(), settings.rateBurst());
    }

    /** Whether a path is guarded: the API and the metrics; the web UI's static files carry no catalog data. */
    static boolean guarded(String path) {
        return path.startsWith("/api/") || path.equals("/metrics");
    }

    /** A {@code beforeMatched} handler: authenticates, authorises, rate-limits and checks write bodies. */
    void check(Context ctx) {
        if (!guarded(ctx.path())) {
            return;
        }
        boolean read = READS.contains(ctx.method());
        Role required = required(ctx.routeRoles(), read);
        if (required == null) {
            refuse(ctx, null, ApiError.forbidden("no_role_declared",
                    "This endpoint declares no role, so it is closed to everyone"));
        }
        Token token = authenticate(ctx);
        if (token == null) {
            if (!(read && required == Role.READER && settings.anonymousRead())) {
                ctx.header("WWW-Authenticate", "Bearer");
                refuse(ctx, null, ApiError.unauthorized("token_required",
                        "This needs a token of role " + required.word() + " in 'Authorization: Bearer …'"));
            }
        } else if (!token.role().grants(required)) {
            refuse(ctx, token, ApiError.forbidden("role_insufficient",
                    "A " + token.role().word() + " token may not do this; it needs role " + required.word()));
        }
        ctx.attribute(TOKEN, token);
        long wait = limiter.take(token == null ? "address:" + ctx.ip() : "token:" + token.id(), System.nanoTime());
        if (wait > 0) {
            throw ApiError.tooManyRequests(wait);
        }
        if (!read) {
            String type = Optional.ofNullable(ctx.contentType()).orElse("");
            if (!type.toLowerCase(java.util.Locale.ROOT).startsWith("application/json")) {
                refuse(ctx, token, ApiError.unsupportedMediaType("Writes take 'Content-Type: application/json'"));
            }
        } else if (token != null) {
            long now = System.currentTimeMillis();
            Long last = lastReadAudit.get(token.id());
            if (last == null || now - last > READ_AUDIT_STEP_MILLIS) {
                lastReadAudit.put(token.id(), now);
                audit().record(token.id(), token.name(), "token.use", ctx.method() + " " + ctx.path(), null, ctx.ip(),
                        "reads by this token are logged once a minute");
            }
        }
    }

    /** An {@code afterMatched} handler: every write that got through is audited with its outcome. */
    void recordWrite(Context ctx) {
        if (!guarded(ctx.path()) || READS.contains(ctx.method()) || ctx.attribute(AUDITED) != null) {
            return;
        }
        Token token = ctx.attribute(TOKEN);
        audit().record(token == null ? null : token.id(), token == null ? "anonymous" : token.name(), "edit",
                ctx.method() + " " + ctx.path(), ctx.statusCode(), ctx.ip(), null);
    }

    private static Role required(Set<RouteRole> declared, boolean read) {
        for (RouteRole role : declared) {
            if (role instanceof Role r) {
                return r;
            }
        }
        return read ? Role.READER : null;
    }

    private Token authenticate(Context ctx) {
        String header = ctx.header("Authorization");
        if (header == null || header.isBlank()) {
            return null;
        }
        if (!header.regionMatches(true, 0, "Bearer ", 0, 7)) {
            ctx.header("WWW-Authenticate", "Bearer");
            refuse(ctx, null, ApiError.unauthorized("token_invalid", "Only 'Authorization: Bearer <token>' is accepted"));
        }
        Optional<Token> token = tokens().verify(header.substring(7).trim());
        if (token.isEmpty()) {
            ctx.header("WWW-Authenticate", "Bearer error=\"invalid_token\"");
            refuse(ctx, null, ApiError.unauthorized("token_invalid", "The token is unknown, revoked or expired"));
        }
        return token.get();
    }

    private void refuse(Context ctx, Token token, ApiError error) {
        ctx.attribute(AUDITED, Boolean.TRUE);
        audit().record(token == null ? null : token.id(), token == null ? "anonymous" : token.name(), "refused",
                ctx.method() + " " + ctx.path(), error.status(), ctx.ip(), error.code());
        throw error;
    }

    /** The catalog's tokens, once it is open (a 503 before). */
    Tokens tokens() {
        if (tokens == null) {
            tokens = new Tokens(catalog.get().store(), java.time.Clock.systemUTC());
        }
        return tokens;
    }

    Audit audit() {
        if (audit == null) {
            audit = new Audit(catalog.get().store(), java.time.Clock.systemUTC());
        }
        return audit;
    }
}
