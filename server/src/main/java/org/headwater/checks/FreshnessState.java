package org.headwater.checks;

import java.util.Locale;

/** The states a freshness check can find, in the order reports list them. */
public enum FreshnessState {
    /** Within its policy, and not older than any of its inputs. */
    FRESH,
    /** A scheduled update time has passed without an update, but the grace period has not. */
    DUE,
    /** Past its maximum age, or past a scheduled update time and its grace period. */
    LATE,
    /** Older than one of its inputs: it was made before an input changed. */
    STALE,
    /** Nothing to judge it by: no policy and no inputs, or no modification time. */
    UNKNOWN;

    /** The word used in the API, the CLI and the store. */
    public String word() {
        return name().toLowerCase(Locale.ROOT);
    }

    /** Whether {@code headwater check} counts this state as a failed check. */
    public boolean fails() {
        return this == LATE || this == STALE;
    }

    public static FreshnessState of(String word) {
        return valueOf(word.toUpperCase(Locale.ROOT));
    }
}
