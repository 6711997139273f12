package org.headwater.harvest.format;

/** Reads one family of file formats. Implementations are stateless and safe to share between threads. */
public interface FormatReader {

    /** Whether this reader is the one for the file; cheap, it looks at the name and the first bytes only. */
    boolean accepts(Sample sample);

    /**
     * Reads the sample.
     *
     * @throws UnreadableFileException when the bytes do not hold what the format promises; the harvest
     *     records the message and goes on with the next file
     */
    Reading read(Sample sample) throws UnreadableFileException;

    /**
     * Reads the sample to the given detail; a reader with nothing to leave out reads it in full.
     *
     * @throws UnreadableFileException as {@link #read(Sample)}
     */
    default Reading read(Sample sample, Detail detail) throws UnreadableFileException {
        return read(sample);
    }

    /** How much of a file's reading the harvest keeps. */
    enum Detail {
        /** Everything: columns, row count and the reader's details (dialect, column statistics). */
        FULL,
        /**
         * The columns (names, types, nullability) and the row count: all a partition of a set keeps, so a
         * reader may leave out its column statistics.
         */
        SCHEMA
    }
}
