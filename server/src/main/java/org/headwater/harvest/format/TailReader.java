package org.headwater.harvest.format;

import java.io.IOException;

/**
 * Reads the end of a file whose reader was given only its head: Parquet keeps its schema in a footer, a PDF
 * its cross-reference table and trailer. A local harvest backs it with a file channel
 * ({@link FileTailReader}); an object store can back it with one ranged request per call.
 */
@FunctionalInterface
public interface TailReader {

    /** For a sample without access to the rest of its file: every call fails, so readers report it. */
    TailReader NONE = n -> {
        throw new IOException("The harvester gave no access to the end of the file");
    };

    /**
     * The last {@code n} bytes of the file, or the whole file when it is shorter.
     *
     * @param n how many bytes, not negative; callers bound it (see {@link Sample#readTail(int)})
     * @throws IOException when the bytes cannot be read, or the file changed since its head was sampled
     */
    byte[] readTail(int n) throws IOException;
}
