package org.headwater.lineage;

import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.model.Evidence;

/**
 * One column edge on a path, in the direction data flows, with the dataset edge it belongs to
 * ({@code edgeId}, script, run, evidence, confidence) and how the source column reaches the target.
 */
public record ColumnHop(long edgeId, ColumnKey from, ColumnKey to, ColumnRole role, Long scriptId, String runId,
        Evidence evidence, double confidence) {
}
