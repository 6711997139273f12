package org.headwater.analysis.sql;

import java.util.Objects;

/**
 * One source column of an output column. {@code derived} is false when the value is copied
 * as is (a bare column reference, possibly through views, CTEs or subqueries that copy it
 * unchanged) and true when anything computes it: an operator, function, aggregate, CASE or cast.
 */
public record ColumnOrigin(ColumnRef source, boolean derived) {

    public ColumnOrigin {
        Objects.requireNonNull(source, "source");
    }

    /** The same source, marked as computed. */
    public ColumnOrigin asDerived() {
        return derived ? this : new ColumnOrigin(source, true);
    }

    @Override
    public String toString() {
        return source + (derived ? " (derived)" : " (direct)");
    }
}
