package org.headwater.harvest;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import org.headwater.harvest.format.TailReader;

/**
 * Where a harvest finds its files: a local folder or an object-store prefix. The harvest pipeline (list,
 * group partitions, recognise table folders, read, observe) is the same for every backend; a backend only
 * lists and hands out bytes.
 */
public interface StorageBackend {

    /**
     * What a backend's listing found: the harvestable objects in name order, how many it left alone, what it
     * could not look at ({@code problems}, errors of the harvest) and what it left alone for a reason worth
     * recording ({@code skipped}: links, devices, FIFOs; counted as ignored, not as errors).
     */
    record Listing(List<StoredObject> objects, int ignored, List<Problem> problems, List<Problem> skipped) {
        public Listing {
            objects = List.copyOf(objects);
            problems = List.copyOf(problems);
            skipped = List.copyOf(skipped);
        }

        public Listing(List<StoredObject> objects, int ignored, List<Problem> problems) {
            this(objects, ignored, problems, List.of());
        }
    }

    /** Something the listing could not look at, for the harvest's error list; the listing went on. */
    record Problem(String uri, String kind, String message) {
    }

    /** The source kind stored in {@code source.kind}: {@code folder}, {@code s3}. */
    String kind();

    /** The URI that identifies this root as a source. */
    String rootUri();

    /** A name for the source when the caller gives none. */
    String defaultName();

    /**
     * Every object under the root, with size, modification time and (where the store has one) its ETag.
     *
     * @throws IOException when the root itself cannot be listed; nothing has been observed then
     */
    Listing list() throws IOException;

    /** The URI of a name relative to the root (a partition pattern, a table folder). */
    String uriOf(String relativeName);

    /**
     * A stream over the object's first {@code length} bytes (more is allowed; callers stop reading).
     * An object store issues a ranged request for just these bytes.
     */
    InputStream open(StoredObject object, long length) throws IOException;

    /** True when reading a whole object is cheap enough to hash it (local files); else the ETag stands in. */
    boolean hashesContent();

    /** Reads the end of the object, for formats whose structure is there. */
    TailReader tailOf(StoredObject object);

    /** The object as a local file, for git history; empty for remote stores. */
    default Optional<Path> localFile(StoredObject object) {
        return Optional.empty();
    }

    /** The root as a local folder, for script analysis; empty for remote stores. */
    default Optional<Path> localRoot() {
        return Optional.empty();
    }
}
