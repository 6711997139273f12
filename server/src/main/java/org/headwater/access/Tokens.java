package org.headwater.access;

import static org.headwater.store.schema.Tables.API_TOKEN;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.security.SecureRandom;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.Base64;
import java.util.HexFormat;
import java.util.List;
import java.util.Optional;
import org.headwater.store.Store;
import org.jooq.Record;

/**
 * Creates, lists, revokes and checks API tokens. The secret is 256 random bits from {@link SecureRandom},
 * shown once; the store keeps only its SHA-256. A fast unsalted hash is adequate here because the secret
 * is not a password: with 2^256 possible secrets, no dictionary or brute-force search over the hashes is
 * feasible, so slow password hashes (which defend guessable inputs) would add cost and nothing else.
 */
public final class Tokens {
    /** Every secret starts with this, so that a leaked one is easy to recognise in logs and scanners. */
    static final String PREFIX = "hw_";
    private static final int SECRET_BYTES = 32;
    /** Last-use times are written at most this often per token, so that reads do not each cost a write. */
    private static final Duration LAST_USED_STEP = Duration.ofMinutes(1);

    private final Store store;
    private final Clock clock;
    private final SecureRandom random = new SecureRandom();

    public Tokens(Store store, Clock clock) {
        this.store = store;
        this.clock = clock;
    }

    /** A token as listed: never its secret. */
    public record Token(long id, String name, Role role, Instant createdAt, Instant expiresAt, Instant revokedAt,
            Instant lastUsedAt) {

        /** Whether the token may be used at {@code now}. */
        public boolean usableAt(Instant now) {
            return revokedAt == null && (expiresAt == null || now.isBefore(expiresAt));
        }
    }

    /** A new token with its secret, which exists only in this value. */
    public record Created(Token token, String secret) {
    }

    /** Creates a token; {@code validFor} null means it never expires. */
    public Created create(String name, Role role, Duration validFor) {
        byte[] bytes = new byte[SECRET_BYTES];
        random.nextBytes(bytes);
        String secret = PREFIX + Base64.getUrlEncoder().withoutPadding().encodeToString(bytes);
        Instant now = clock.instant();
        Instant expires = validFor == null ? null : now.plus(validFor);
        long id = store.dsl().insertInto(API_TOKEN)
                .set(API_TOKEN.NAME, name)
                .set(API_TOKEN.ROLE, role.word())
                .set(API_TOKEN.SECRET_SHA256, sha256(secret))
                .set(API_TOKEN.CREATED_AT, odt(now))
                .set(API_TOKEN.EXPIRES_AT, odt(expires))
                .returningResult(API_TOKEN.ID)
                .fetchOne(API_TOKEN.ID);
        return new Created(new Token(id, name, role, now, expires, null, null), secret);
    }

    /** Every token ever created, newest first, revoked and expired ones included. */
    public List<Token> list() {
        return store.dsl().selectFrom(API_TOKEN).orderBy(API_TOKEN.ID.desc()).fetch(Tokens::token);
    }

    /** Revokes a token; false when no token has that id or it was already revoked. */
    public boolean revoke(long id) {
        return store.dsl().update(API_TOKEN)
                .set(API_TOKEN.REVOKED_AT, odt(clock.instant()))
                .where(API_TOKEN.ID.eq(id).and(API_TOKEN.REVOKED_AT.isNull()))
                .execute() == 1;
    }

    /** The usable token whose secret this is; empty when unknown, revoked or expired. */
    public Optional<Token> verify(String secret) {
        if (secret == null || !secret.startsWith(PREFIX) || secret.length() > 200) {
            return Optional.empty();
        }
        Instant now = clock.instant();
        Optional<Token> found = store.dsl().selectFrom(API_TOKEN)
                .where(API_TOKEN.SECRET_SHA256.eq(sha256(secret)))
                .fetchOptional(Tokens::token)
                .filter(t -> t.usableAt(now));
        found.ifPresent(t -> {
            if (t.lastUsedAt() == null || t.lastUsedAt().plus(LAST_USED_STEP).isBefore(now)) {
                store.dsl().update(API_TOKEN).set(API_TOKEN.LAST_USED_AT, odt(now))
                        .where(API_TOKEN.ID.eq(t.id())).execute();
            }
        });
        return found;
    }

    static String sha256(String secret) {
        try {
            MessageDigest digest = MessageDigest.getInstance("SHA-256");
            return HexFormat.of().formatHex(digest.digest(secret.getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("Every Java runtime has SHA-256", e);
        }
    }

    private static Token token(Record r) {
        return new Token(r.get(API_TOKEN.ID), r.get(API_TOKEN.NAME), Role.of(r.get(API_TOKEN.ROLE)),
                instant(r.get(API_TOKEN.CREATED_AT)), instant(r.get(API_TOKEN.EXPIRES_AT)),
                instant(r.get(API_TOKEN.REVOKED_AT)), instant(r.get(API_TOKEN.LAST_USED_AT)));
    }

    static OffsetDateTime odt(Instant instant) {
        return instant == null ? null : OffsetDateTime.ofInstant(instant, ZoneOffset.UTC);
    }

    static Instant instant(OffsetDateTime time) {
        return time == null ? null : time.toInstant();
    }
}
