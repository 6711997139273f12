package org.headwater.search;

/** A search text that does not follow the query syntax; the message says what is wrong and where. */
public final class QuerySyntaxException extends RuntimeException {
    public QuerySyntaxException(String message) {
        super(message);
    }
}
