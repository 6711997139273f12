package org.headwater.analysis.sql;

import java.util.List;
import java.util.Optional;

/** Looks up the columns of a table or view the catalog already knows (for {@code *} expansion). */
@FunctionalInterface
public interface SchemaLookup {

    /** The columns of {@code table} in order, or empty when the catalog does not know it. */
    Optional<List<String>> columnsOf(QualifiedName table);

    /** A lookup that knows no table: only tables created in the script itself are known. */
    static SchemaLookup none() {
        return table -> Optional.empty();
    }
}
