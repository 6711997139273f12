package org.headwater.harvest.table;

import java.io.IOException;
import java.time.Instant;

/**
 * One metadata file of a table folder, read on demand.
 *
 * @param name the path relative to the table folder ({@code _delta_log/00000000000000000003.json})
 */
public record TableFile(String name, long size, Instant modified, Loader loader) {

    /** Reads a whole metadata file. */
    @FunctionalInterface
    public interface Loader {
        byte[] load() throws IOException;
    }

    public byte[] read() throws IOException {
        return loader.load();
    }
}
