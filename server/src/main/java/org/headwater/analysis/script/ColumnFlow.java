package org.headwater.analysis.script;

import java.util.Objects;

/**
 * One column of a written dataset and where it comes from.
 *
 * @param targetColumn the column written
 * @param source the dataset read that holds the source column (its path pattern or {@code table:name})
 * @param sourceColumn the column read
 * @param derived {@code false} when the value is copied as it is (selection, rename, merge key),
 *     {@code true} when it is computed from the source column
 */
public record ColumnFlow(String targetColumn, String source, String sourceColumn, boolean derived) {
    public ColumnFlow {
        Objects.requireNonNull(targetColumn, "targetColumn");
        Objects.requireNonNull(source, "source");
        Objects.requireNonNull(sourceColumn, "sourceColumn");
    }
}
