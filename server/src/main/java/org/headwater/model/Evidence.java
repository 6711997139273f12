package org.headwater.model;

import java.util.Locale;

/** Why the catalog believes a lineage edge exists. */
public enum Evidence {
    /** Found by reading a script's code without running it. */
    STATIC,
    /** Seen while a script ran, reported by a runtime connector. */
    RUNTIME,
    /** Stated by a person through the API or the CLI. */
    DECLARED,
    /** Concluded by the catalog itself, for example from equal content hashes. */
    INFERRED;

    /** The lower-case word stored and shown. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Reads a stored or typed word back. */
    public static Evidence of(String word) {
        return valueOf(word.trim().toUpperCase(Locale.ROOT));
    }
}
