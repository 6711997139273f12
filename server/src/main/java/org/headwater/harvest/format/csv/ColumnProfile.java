package org.headwater.harvest.format.csv;

/**
 * What was learnt about one column from the profiled rows.
 *
 * @param name header name (de-duplicated) or {@code column_N} when the file has no header
 * @param type the logical type
 * @param datePattern a {@link java.time.format.DateTimeFormatter} pattern for DATE and
 *     TIMESTAMP columns, otherwise {@code null}
 * @param nullCount cells that are empty, a missing-value token or a sentinel
 * @param min the smallest value in the type's order, as written in the file, or {@code null}
 * @param max the largest value in the type's order, as written in the file, or {@code null}
 * @param distinctEstimate estimated number of distinct non-missing values
 * @param nullable whether any profiled cell was missing
 */
public record ColumnProfile(
    String name,
    LogicalType type,
    String datePattern,
    long nullCount,
    String min,
    String max,
    long distinctEstimate,
    boolean nullable) {}
