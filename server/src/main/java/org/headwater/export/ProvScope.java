package org.headwater.export;

import java.time.Instant;

/**
 * Which part of the catalog an export covers.
 *
 * @param datasetId the centre of a neighbourhood, or null for the whole graph
 * @param depth how many hops up and down from the centre (ignored for the whole graph)
 * @param asOf the catalog as it was at this time, or null for now
 */
public record ProvScope(Long datasetId, int depth, Instant asOf) {
    public ProvScope {
        if (depth < 0) {
            throw new IllegalArgumentException("depth must not be negative: " + depth);
        }
    }

    public static ProvScope whole(Instant asOf) {
        return new ProvScope(null, 0, asOf);
    }

    public static ProvScope around(long datasetId, int depth, Instant asOf) {
        return new ProvScope(datasetId, depth, asOf);
    }
}
