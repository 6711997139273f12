package org.headwater.lineage;

/**
 * What a lineage question is about: a dataset, or one column of it.
 *
 * @param column the column, or null for the dataset as a whole
 * @param partition the partition's name when the person named one file of a partitioned set (the
 *     question is then about the set, which the partition belongs to), else null
 */
public record Target(long datasetId, String dataset, String column, String partition) {

    /** How the target is written in answers: {@code name} or {@code name.column}. */
    public String label() {
        return column == null ? dataset : dataset + "." + column;
    }

    public boolean namesColumn() {
        return column != null;
    }
}
