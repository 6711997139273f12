package org.headwater.harvest.format;

import java.io.IOException;
import java.util.Optional;

/** What the figure readers share: reading a whole file within a cap, as a reader error when it fails. */
final class Figures {

    private Figures() {
    }

    /** The whole file when it is at most {@code cap} bytes; empty when larger. */
    static Optional<byte[]> whole(Sample sample, int cap) throws UnreadableFileException {
        try {
            return sample.readWhole(cap);
        } catch (IOException e) {
            throw new UnreadableFileException("unreadable", "Could not read the rest of the file: " + e.getMessage());
        }
    }

    /**
     * Like {@link #whole}, for readers that can do without the rest: empty also when the rest cannot be read
     * (a sample without a tail reader), and the reader reports what the head held.
     */
    static Optional<byte[]> wholeIfReadable(Sample sample, int cap) {
        try {
            return sample.readWhole(cap);
        } catch (IOException e) {
            return Optional.empty();
        }
    }
}
