package org.headwater.http;

import java.nio.file.Path;
import java.time.Duration;
import java.util.List;

/**
 * How a server guards itself: whether anonymous callers may read, the folders run records may name,
 * request limits and query time limits.
 *
 * @param anonymousRead whether GET requests without a token are answered
 * @param roots folders that run records may name; empty means any path (a warning is logged)
 * @param maxBodyBytes largest request body; larger ones get 413
 * @param ratePerSecond sustained requests per second per token, or per address without a token
 * @param rateBurst requests a caller may make at once before the sustained rate applies
 * @param queryTime longest a bounded query (search, lineage, whence) may run before a 503
 */
public record ServerSettings(boolean anonymousRead, List<Path> roots, long maxBodyBytes, double ratePerSecond,
        double rateBurst, Duration queryTime) {

    public ServerSettings {
        roots = roots.stream().map(p -> p.toAbsolutePath().normalize()).toList();
    }

    /** Anonymous read on, no roots, 1 MiB bodies, 50 requests/s with bursts of 200, 10 s per query. */
    public static ServerSettings defaults() {
        return new ServerSettings(true, List.of(), 1024 * 1024, 50, 200, Duration.ofSeconds(10));
    }

    public ServerSettings withAnonymousRead(boolean allowed) {
        return new ServerSettings(allowed, roots, maxBodyBytes, ratePerSecond, rateBurst, queryTime);
    }

    public ServerSettings withRoots(List<Path> folders) {
        return new ServerSettings(anonymousRead, folders, maxBodyBytes, ratePerSecond, rateBurst, queryTime);
    }

    public ServerSettings withRate(double perSecond, double burst) {
        return new ServerSettings(anonymousRead, roots, maxBodyBytes, perSecond, burst, queryTime);
    }

    public ServerSettings withQueryTime(Duration limit) {
        return new ServerSettings(anonymousRead, roots, maxBodyBytes, ratePerSecond, rateBurst, limit);
    }

    public ServerSettings withMaxBody(long bytes) {
        return new ServerSettings(anonymousRead, roots, bytes, ratePerSecond, rateBurst, queryTime);
    }
}
