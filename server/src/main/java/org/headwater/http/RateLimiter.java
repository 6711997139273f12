package org.headwater.http;

import java.util.concurrent.ConcurrentHashMap;

/**
 * Token buckets, one per caller (a token id, or an address for anonymous callers): each holds up to
 * {@code burst} requests and refills at {@code perSecond}. Hand-written because it is this small and
 * needs nothing a library adds (no distribution, no persistence).
 */
final class RateLimiter {
    /** Buckets idle this long are full again anyway, so they are dropped to bound memory. */
    private static final long IDLE_NANOS = 10L * 60 * 1_000_000_000L;
    private static final int SWEEP_AT = 10_000;

    private final double perSecond;
    private final double burst;
    private final ConcurrentHashMap<String, Bucket> buckets = new ConcurrentHashMap<>();

    RateLimiter(double perSecond, double burst) {
        this.perSecond = perSecond;
        this.burst = burst;
    }

    private static final class Bucket {
        double tokens;
        long updated;

        Bucket(double tokens, long updated) {
            this.tokens = tokens;
            this.updated = updated;
        }
    }

    /** Takes one request from the caller's bucket; 0 when allowed, else the seconds to wait. */
    long take(String caller, long nowNanos) {
        if (buckets.size() > SWEEP_AT) {
            buckets.values().removeIf(b -> nowNanos - b.updated > IDLE_NANOS);
        }
        Bucket bucket = buckets.computeIfAbsent(caller, k -> new Bucket(burst, nowNanos));
        synchronized (bucket) {
            bucket.tokens = Math.min(burst, bucket.tokens + (nowNanos - bucket.updated) / 1e9 * perSecond);
            bucket.updated = nowNanos;
            if (bucket.tokens >= 1) {
                bucket.tokens -= 1;
                return 0;
            }
            return Math.max(1, (long) Math.ceil((1 - bucket.tokens) / perSecond));
        }
    }
}
