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
}
