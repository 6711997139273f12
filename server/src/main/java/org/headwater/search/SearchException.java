package org.headwater.search;

/** The search index could not be opened, read or written. */
public final class SearchException extends RuntimeException {
    public SearchException(String message, Throwable cause) {
        super(message, cause);
    }
}
