package org.headwater.analysis.sql;

import java.util.List;
import java.util.Locale;
import java.util.Optional;

/** How written identifiers become the names lineage compares. */
final class Identifiers {

    private Identifiers() {}

    /**
     * Unquoted identifiers fold to lower case, as PostgreSQL does (the SQL standard folds to
     * upper case, but lower case is what PostgreSQL users see in their catalogs); quoted
     * identifiers keep their case, with doubled quotes inside them undone.
     */
    static String normalize(String written) {
        if (written.length() >= 2) {
            char first = written.charAt(0);
            char last = written.charAt(written.length() - 1);
            if (first == '"' && last == '"') {
                return written.substring(1, written.length() - 1).replace("\"\"", "\"");
            }
            if (first == '`' && last == '`') {
                return written.substring(1, written.length() - 1).replace("``", "`");
            }
            if (first == '[' && last == ']') {
                return written.substring(1, written.length() - 1);
            }
        }
        return written.toLowerCase(Locale.ROOT);
    }

    /**
     * The position of {@code name} in {@code columns}: an exact match first, otherwise a unique
     * case-insensitive one, because a catalog fed from another system may store names in a
     * different case than the script writes them.
     */
    static Optional<Integer> indexOf(List<String> columns, String name) {
        int exact = columns.indexOf(name);
        if (exact >= 0) {
            return Optional.of(exact);
        }
        int found = -1;
        for (int i = 0; i < columns.size(); i++) {
            if (columns.get(i).equalsIgnoreCase(name)) {
                if (found >= 0) {
                    return Optional.empty();
                }
                found = i;
            }
        }
        return found >= 0 ? Optional.of(found) : Optional.empty();
    }
}
