package org.headwater.lineage;

/**
 * A column of a dataset. A null {@code column} stands for the dataset as a whole: what an influencing
 * column (a filter, a join key) reaches when the edge names no columns of its target.
 */
public record ColumnKey(long datasetId, String column) {
}
