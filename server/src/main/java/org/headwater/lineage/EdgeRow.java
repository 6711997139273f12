package org.headwater.lineage;

import java.util.Objects;
import org.headwater.model.Evidence;

/**
 * One version of a dataset lineage edge as the store holds it.
 *
 * @param current whether the row is still in force ({@code valid_to} is null); a row read back after a
 *     change that is no longer current means the edge is gone or was superseded
 */
public record EdgeRow(long id, long sourceDatasetId, long targetDatasetId, Long scriptId, String runId,
        Evidence evidence, double confidence, boolean current) {
    public EdgeRow {
        Objects.requireNonNull(evidence, "evidence");
    }
}
