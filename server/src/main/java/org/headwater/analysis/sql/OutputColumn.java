package org.headwater.analysis.sql;

import java.util.Objects;
import java.util.Set;

/**
 * One column a statement produces. {@code ordinal} is its 1-based position among the statement's
 * output columns (as ORDINAL_POSITION in the SQL standard's information schema); {@code origins}
 * is empty for a column made of literals only, or defined by a plain {@code CREATE TABLE}.
 */
public record OutputColumn(String name, int ordinal, Set<ColumnOrigin> origins) {

    public OutputColumn {
        Objects.requireNonNull(name, "name");
        if (ordinal < 1) {
            throw new IllegalArgumentException("ordinals start at 1: " + ordinal);
        }
        origins = Set.copyOf(origins);
    }
}
