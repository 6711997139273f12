package org.headwater.harvest.format;

import java.io.IOException;
import java.util.Arrays;
import java.util.Locale;
import java.util.Objects;
import java.util.Optional;

/**
 * The bytes a reader gets of one file: its beginning, whether that is the whole file, and a way to read its
 * end for formats that keep their structure there (Parquet's footer, a PDF's trailer).
 *
 * @param fileName the file's own name, for readers that use the extension as a hint
 * @param head the first bytes of the file (all of it when {@code complete})
 * @param complete true when {@code head} holds the whole file
 * @param size the file's full size in bytes
 * @param tail reads the end of the file; {@link TailReader#NONE} when the harvester offers no such access.
 *     Readers go through {@link #readTail(int)} and {@link #readWhole(int)}, which serve a complete sample
 *     from {@code head} without calling it
 */
public record Sample(String fileName, byte[] head, boolean complete, long size, TailReader tail) {

    public Sample {
        Objects.requireNonNull(fileName, "fileName");
        Objects.requireNonNull(head, "head");
        Objects.requireNonNull(tail, "tail");
    }

    /** A sample without access to the rest of the file: the contract before tail reading, kept for callers of it. */
    public Sample(String fileName, byte[] head, boolean complete, long size) {
        this(fileName, head, complete, size, TailReader.NONE);
    }

    /** The lower-case extension without the dot, or an empty string. */
    public String extension() {
        int dot = fileName.lastIndexOf('.');
        return dot < 0 ? "" : fileName.substring(dot + 1).toLowerCase(Locale.ROOT);
    }

    /** The last {@code n} bytes of the file, or all of it when it is shorter. */
    public byte[] readTail(int n) throws IOException {
        if (n < 0) {
            throw new IllegalArgumentException("n must not be negative: " + n);
        }
        if (complete) {
            int length = Math.min(n, head.length);
            return Arrays.copyOfRange(head, head.length - length, head.length);
        }
        byte[] bytes;
        try {
            bytes = tail.readTail((int) Math.min(n, size));
        } catch (RuntimeException e) {
            // A faulty tail reader costs the reader its tail, not the harvest its thread.
            throw new IOException("The tail reader failed: " + e, e);
        }
        if (bytes == null || bytes.length != Math.min(n, size)) {
            throw new IOException("Asked for the last " + Math.min(n, size) + " bytes, got " + (bytes == null ? "none" : bytes.length));
        }
        return bytes;
    }

    /**
     * The whole file when it is at most {@code maxBytes} long: the head, followed when needed by the rest read
     * through the tail reader. Empty when the file is longer, so each reader states its own size cap.
     */
    public Optional<byte[]> readWhole(int maxBytes) throws IOException {
        if (complete) {
            return head.length <= maxBytes ? Optional.of(head) : Optional.empty();
        }
        if (size > maxBytes) {
            return Optional.empty();
        }
        if (head.length >= size) {
            return Optional.of(head);
        }
        byte[] rest = readTail((int) (size - head.length));
        byte[] whole = Arrays.copyOf(head, (int) size);
        System.arraycopy(rest, 0, whole, head.length, rest.length);
        return Optional.of(whole);
    }
}
