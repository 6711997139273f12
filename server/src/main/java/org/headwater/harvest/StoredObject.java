package org.headwater.harvest;

import java.time.Instant;
import java.util.Objects;

/**
 * One object a storage backend listed: a file in a folder, a key under an object-store prefix.
 *
 * @param name the path relative to the root, with {@code /} separators
 * @param uri the object's own URI ({@code file:…}, {@code s3://bucket/key})
 * @param etag the store's entity tag without quotes, or null where the store has none (local files)
 */
public record StoredObject(String name, String uri, long size, Instant modified, String etag) {
    public StoredObject {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(uri, "uri");
        Objects.requireNonNull(modified, "modified");
    }

    /** The last path segment. */
    public String fileName() {
        int slash = name.lastIndexOf('/');
        return slash < 0 ? name : name.substring(slash + 1);
    }
}
