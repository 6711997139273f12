package org.headwater.store;

/** The catalog database could not be opened or used; the message says what to do. */
public final class StoreException extends RuntimeException {
    public StoreException(String message) {
        super(message);
    }

    public StoreException(String message, Throwable cause) {
        super(message, cause);
    }

    static StoreException opening(StoreConfig config, Throwable cause) {
        String text = String.valueOf(cause.getMessage());
        if (text.contains("already in use") || text.contains("Database may be already in use")) {
            return new StoreException("The catalog at " + config.redactedUrl()
                    + " is in use by another Headwater process (a running 'serve'?). Stop it, use its"
                    + " HTTP API, or pass a different --data-dir.", cause);
        }
        return new StoreException("Could not open the catalog at " + config.redactedUrl() + ": " + text, cause);
    }
}
