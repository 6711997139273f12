package org.headwater.model;

import java.util.Locale;

/** What sort of thing a dataset is. */
public enum DatasetKind {
    FILE, FILE_SET, TABLE, VIEW, FIGURE, OTHER;

    /** The lower-case word stored and shown, for example {@code file_set}. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Reads a stored or typed word back; unknown words are an error, not a guess. */
    public static DatasetKind of(String word) {
        return valueOf(word.trim().toUpperCase(Locale.ROOT));
    }
}
