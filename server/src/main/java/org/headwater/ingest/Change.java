package org.headwater.ingest;

/**
 * One change the ingestion path applied: which entity, and what happened to it.
 *
 * @param entity {@code dataset}, {@code script}, {@code edge}, {@code owner} or {@code freshness}
 * @param operation a short word such as {@code created}, {@code state}, {@code schema}, {@code removed}
 */
public record Change(long seq, String entity, long entityId, String operation) {
    public static final String DATASET = "dataset";
    public static final String SCRIPT = "script";
    public static final String EDGE = "edge";
    /** A dataset's freshness policy or checked state; the entity id is the dataset's. */
    public static final String FRESHNESS = "freshness";
}
