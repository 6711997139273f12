package org.headwater.harvest.table;

/** A table folder whose metadata cannot be read; the message says what is wrong. */
public final class UnreadableTableException extends Exception {
    public UnreadableTableException(String message) {
        super(message);
    }

    public UnreadableTableException(String message, Throwable cause) {
        super(message, cause);
    }
}
