package org.headwater.http;

import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionException;
import org.headwater.Catalog;

/**
 * The catalog the server answers from, which may still be opening: the HTTP server starts while the
 * store opens, so that the two overlap at start-up. Until the catalog is ready, requests get a 503.
 */
final class CatalogHolder {
    private final CompletableFuture<Catalog> catalog;

    CatalogHolder(CompletableFuture<Catalog> catalog) {
        this.catalog = catalog;
    }

    boolean ready() {
        return catalog.isDone() && !catalog.isCompletedExceptionally();
    }

    Catalog get() {
        if (!catalog.isDone()) {
            throw ApiError.unavailable("Headwater is still opening the catalog; try again in a moment");
        }
        try {
            return catalog.join();
        } catch (CompletionException e) {
            throw ApiError.unavailable("The catalog could not be opened: " + e.getCause().getMessage());
        }
    }
}
