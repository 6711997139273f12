package org.headwater.analysis.script.io;

import java.util.Locale;

/** What the path argument of a read or write function holds. */
public enum IoKind {
    /** A file path. */
    FILE,
    /** A figure file (savefig, ggsave, graphics devices). */
    FIGURE,
    /** A database table name. */
    TABLE,
    /** SQL text, or a bare table name: the tables come out of the statement. */
    QUERY,
    /** An open file object: the {@code open} call that made it is the reference. */
    STREAM;

    static IoKind of(String word) {
        return valueOf(word.trim().toUpperCase(Locale.ROOT));
    }
}
