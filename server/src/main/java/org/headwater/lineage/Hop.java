package org.headwater.lineage;

import org.headwater.model.Evidence;

/** One dataset edge on a path, in the direction data flows (from an input to what was made from it). */
public record Hop(long edgeId, long fromDatasetId, long toDatasetId, Long scriptId, String runId, Evidence evidence,
        double confidence) {
}
