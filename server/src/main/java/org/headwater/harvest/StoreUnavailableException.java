package org.headwater.harvest;

import java.io.IOException;

/**
 * A read failed because of the store, not the object: it cannot be reached, refuses the credentials, or
 * keeps answering 5xx after the retries. The harvest stops as failed instead of marking every object it
 * could not read as broken, so the source keeps its previous state.
 */
public final class StoreUnavailableException extends IOException {
    public StoreUnavailableException(String message, Throwable cause) {
        super(message, cause);
    }
}
