package org.headwater.ingest;

/** An observation named a dataset the catalog does not know; the whole batch is rolled back. */
public final class UnknownDatasetException extends RuntimeException {
    public UnknownDatasetException(String uri) {
        super("No dataset with URI " + uri + " is in the catalog");
    }
}
