package org.headwater.harvest;

import java.io.IOException;
import java.io.InputStream;
import java.security.MessageDigest;
import java.time.Instant;
import java.util.Optional;
import java.security.NoSuchAlgorithmException;
import java.util.Arrays;
import java.util.HexFormat;
import org.headwater.harvest.format.FormatReader;
import org.headwater.harvest.format.FormatRegistry;
import org.headwater.harvest.format.Reading;
import org.headwater.harvest.format.Sample;
import org.headwater.harvest.format.UnreadableFileException;
import org.headwater.model.Language;

/**
 * Looks at one file and says what it holds. Reads the file once: the first bytes are
 * kept for the format reader while the whole file (up to the hash cap) streams through SHA-256. On a
 * backend that does not hash (an object store) only the first bytes are fetched, and the content's
 * identity is the store's ETag, stored as {@code etag:<tag>} so it never passes for a SHA-256.
 * Has no state, so several threads may share one.
 */
final class FileInspector {
    /** Marks a content identity that is a store's ETag rather than a SHA-256 of the bytes. */
    static final String ETAG_PREFIX = "etag:";

    private final FormatRegistry formats;
    private final long hashCapBytes;
    private final int sampleBytes;

    FileInspector(FormatRegistry formats, long hashCapBytes, int sampleBytes) {
        this.formats = formats;
        this.hashCapBytes = hashCapBytes;
        this.sampleBytes = sampleBytes;
    }

    /**
     * What inspecting one file found: its physical facts, and either what its format reader read or why
     * it could not be read. Scripts are not read by format readers.
     *
     * @param reading the format reader's result, or null for scripts and unreadable files
     * @param errorKind a short word for the harvest summary when the file could not be read, else null
     */
    record Facts(StoredObject object, long size, Instant modified, String sha256, Optional<Language> language,
            Reading reading, String fallbackFormat, String errorKind, String errorMessage) {
    }

    /**
     * @param detail how much of the reading the harvest keeps: a partition of a set keeps only its schema
     *     and row count, so its readers may leave out column statistics
     */
    Facts inspect(StorageBackend backend, StoredObject object, FormatReader.Detail detail) {
        long size = object.size();
        Instant modified = object.modified();
        String fileName = object.fileName();
        Optional<Language> language = Language.ofFileName(fileName);
        Head head;
        try {
            head = readHead(backend, object, size);
        } catch (StoreUnavailableException e) {
            throw new java.io.UncheckedIOException(e);
        } catch (IOException | RuntimeException e) {
            return new Facts(object, size, modified, null, language, null, "unknown", "unreadable",
                    "Could not read the file: " + e.getMessage());
        }
        if (language.isPresent()) {
            return new Facts(object, size, modified, head.sha256(), language, null, null, null, null);
        }
        Sample sample = new Sample(fileName, head.bytes(), head.bytes().length >= size, size, backend.tailOf(object));
        String fallback = sample.extension().isEmpty() ? "unknown" : sample.extension();
        try {
            return new Facts(object, size, modified, head.sha256(), language, formats.read(sample, detail), fallback, null, null);
        } catch (UnreadableFileException e) {
            return new Facts(object, size, modified, head.sha256(), language, null, fallback, e.kind(), e.getMessage());
        } catch (RuntimeException e) {
            // A reader bug must cost one file, not the harvest; the message names the reader's failure.
            return new Facts(object, size, modified, head.sha256(), language, null, fallback, "reader_failure",
                    "The format reader failed: " + e);
        }
    }

    /** The first bytes of a file, and its SHA-256 when it is under the hash cap. */
    record Head(byte[] bytes, String sha256) {
    }

    private Head readHead(StorageBackend backend, StoredObject object, long size) throws IOException {
        // Without a content hash (an object store) only the sample is fetched; the ETag identifies the content.
        boolean hash = backend.hashesContent() && size <= hashCapBytes;
        MessageDigest digest = hash ? sha256() : null;
        byte[] head = new byte[(int) Math.min(sampleBytes, size)];
        int filled;
        try (InputStream in = backend.open(object, hash ? size : head.length)) {
            // Straight into the sample: most files fit in it whole, and a 64 KiB buffer per file besides
            // was 3 GiB of allocation in a 50,000-file harvest.
            filled = in.readNBytes(head, 0, head.length);
            if (hash) {
                digest.update(head, 0, filled);
                // Whatever follows the sample is hashed too (a file larger than the sample, or one that grew
                // since it was listed).
                int next = filled == head.length ? in.read() : -1;
                if (next >= 0) {
                    digest.update((byte) next);
                    byte[] buffer = new byte[64 * 1024];
                    int n;
                    while ((n = in.read(buffer)) > 0) {
                        digest.update(buffer, 0, n);
                    }
                }
            }
        }
        byte[] bytes = filled == head.length ? head : Arrays.copyOf(head, filled);
        String identity = hash ? HexFormat.of().formatHex(digest.digest())
                : etagIdentity(object.etag());
        return new Head(bytes, identity);
    }

    /**
     * The stored content identity for an ETag: {@code etag:<tag>}, or for a tag too long for the 64-character
     * column, {@code etag:} and the start of the tag's SHA-256 (still equal exactly when the tags are).
     */
    static String etagIdentity(String etag) {
        if (etag == null) {
            return null;
        }
        String plain = ETAG_PREFIX + etag;
        if (plain.length() <= 64) {
            return plain;
        }
        byte[] digest = sha256().digest(etag.getBytes(java.nio.charset.StandardCharsets.UTF_8));
        return ETAG_PREFIX + HexFormat.of().formatHex(digest).substring(0, 64 - ETAG_PREFIX.length());
    }

    private static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
