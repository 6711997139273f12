package org.headwater.model;

import java.util.Objects;

/**
 * One column of a dataset's structure: what a schema version is made of.
 *
 * @param name the column name as the file or table spells it
 * @param dataType a logical type word: integer, decimal, boolean, date, timestamp, text, or the
 *     source's own type name for tables
 * @param nullable whether empty or missing values were seen or are allowed
 */
public record ColumnDef(String name, String dataType, boolean nullable) {
    public ColumnDef {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(dataType, "dataType");
    }
}
