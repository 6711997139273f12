package org.headwater.impact;

import java.util.Arrays;
import java.util.Locale;
import java.util.stream.Collectors;

/** A proposed change to a source, as an impact report understands it. */
public enum ChangeKind {
    /** A column disappears. */
    DROP(true, "Impact of dropping column %s"),
    /** A column gets a new name. */
    RENAME(true, "Impact of renaming column %s"),
    /** A column gets a new type. */
    RETYPE(true, "Impact of changing the type of column %s"),
    /** A dataset disappears from where it was (deleted, or moved elsewhere). */
    DELETE(false, "Impact of deleting or moving %s"),
    /** A dataset arrives late, or is not refreshed. */
    STALE(false, "Impact of %s being late or stale");

    private final boolean aboutColumn;
    private final String phrase;

    ChangeKind(boolean aboutColumn, String phrase) {
        this.aboutColumn = aboutColumn;
        this.phrase = phrase;
    }

    /** Whether the change is to one column (drop, rename, retype) rather than to a whole dataset. */
    public boolean aboutColumn() {
        return aboutColumn;
    }

    /** The report's title for a target. */
    public String title(String target) {
        return String.format(Locale.ROOT, phrase, target);
    }

    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Reads a typed word; {@code move} is a synonym of {@code delete}. */
    public static ChangeKind of(String word) {
        String w = word.trim().toLowerCase(Locale.ROOT);
        if (w.equals("move")) {
            return DELETE;
        }
        for (ChangeKind k : values()) {
            if (k.word().equals(w)) {
                return k;
            }
        }
        throw new IllegalArgumentException("unknown change '" + word + "'; use "
                + Arrays.stream(values()).map(ChangeKind::word).collect(Collectors.joining(", ")) + " (or move)");
    }
}
