package org.headwater.harvest;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.BasicFileAttributes;
import java.security.MessageDigest;
import java.time.Instant;
import java.util.Optional;
import java.security.NoSuchAlgorithmException;
import java.util.Arrays;
import java.util.HexFormat;
import org.headwater.harvest.format.FileTailReader;
import org.headwater.harvest.format.FormatRegistry;
import org.headwater.harvest.format.Reading;
import org.headwater.harvest.format.Sample;
import org.headwater.harvest.format.UnreadableFileException;
import org.headwater.model.Language;

/**
 * Looks at one file and says what it holds. Reads the file once: the first bytes are
 * kept for the format reader while the whole file (up to the hash cap) streams through SHA-256.
 * Has no state, so several threads may share one.
 */
final class FileInspector {
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
    record Facts(Path file, long size, Instant modified, String sha256, Optional<Language> language, Reading reading,
            String fallbackFormat, String errorKind, String errorMessage) {
    }

    Facts inspect(Path file, BasicFileAttributes attrs) {
        long size = attrs.size();
        Instant modified = attrs.lastModifiedTime().toInstant();
        String fileName = file.getFileName().toString();
        Optional<Language> language = Language.ofFileName(fileName);
        Head head;
        try {
            head = readHead(file, size);
        } catch (IOException e) {
            return new Facts(file, size, modified, null, language, null, "unknown", "unreadable",
                    "Could not read the file: " + e.getMessage());
        }
        if (language.isPresent()) {
            return new Facts(file, size, modified, head.sha256(), language, null, null, null, null);
        }
        Sample sample = new Sample(fileName, head.bytes(), head.bytes().length >= size, size,
                new FileTailReader(file, size));
        String fallback = sample.extension().isEmpty() ? "unknown" : sample.extension();
        try {
            return new Facts(file, size, modified, head.sha256(), language, formats.read(sample), fallback, null, null);
        } catch (UnreadableFileException e) {
            return new Facts(file, size, modified, head.sha256(), language, null, fallback, e.kind(), e.getMessage());
        } catch (RuntimeException e) {
            // A reader bug must cost one file, not the harvest; the message names the reader's failure.
            return new Facts(file, size, modified, head.sha256(), language, null, fallback, "reader_failure",
                    "The format reader failed: " + e);
        }
    }

    /** The first bytes of a file, and its SHA-256 when it is under the hash cap. */
    record Head(byte[] bytes, String sha256) {
    }

    private Head readHead(Path file, long size) throws IOException {
        boolean hash = size <= hashCapBytes;
        MessageDigest digest = hash ? sha256() : null;
        byte[] head = new byte[(int) Math.min(sampleBytes, size)];
        int filled = 0;
        try (InputStream in = Files.newInputStream(file)) {
            byte[] buffer = new byte[64 * 1024];
            int n;
            while ((n = in.read(buffer)) > 0) {
                if (filled < head.length) {
                    int take = Math.min(n, head.length - filled);
                    System.arraycopy(buffer, 0, head, filled, take);
                    filled += take;
                }
                if (!hash) {
                    if (filled >= head.length) {
                        break;
                    }
                    continue;
                }
                digest.update(buffer, 0, n);
            }
        }
        byte[] bytes = filled == head.length ? head : Arrays.copyOf(head, filled);
        return new Head(bytes, hash ? HexFormat.of().formatHex(digest.digest()) : null);
    }

    private static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
