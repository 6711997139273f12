package org.headwater.harvest;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.BasicFileAttributes;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.Arrays;
import java.util.HexFormat;
import org.headwater.harvest.format.FormatRegistry;
import org.headwater.harvest.format.Reading;
import org.headwater.harvest.format.Sample;
import org.headwater.harvest.format.UnreadableFileException;
import org.headwater.ingest.Json;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.ScriptSeen;
import org.headwater.model.Language;

/**
 * Looks at one file and says what it is, as an observation. Reads the file once: the first bytes are
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

    /** What inspecting a file produced: its observation, and the problem found, if any. */
    record Inspection(Observation observation, String errorKind, String errorMessage) {
    }

    Inspection inspect(Path file, BasicFileAttributes attrs, String name, long sourceId) {
        String uri = file.toUri().toString();
        long size = attrs.size();
        var modified = attrs.lastModifiedTime().toInstant();
        Head head;
        try {
            head = readHead(file, size);
        } catch (IOException e) {
            String message = "Could not read the file: " + e.getMessage();
            var seen = new DatasetSeen(uri, name, org.headwater.model.DatasetKind.OTHER, sourceId, "unknown", size,
                    modified, null, null, false, null, message, null);
            return new Inspection(seen, "unreadable", message);
        }
        var language = Language.ofFileName(file.getFileName().toString());
        if (language.isPresent()) {
            return new Inspection(new ScriptSeen(uri, name, language.get(), sourceId, size, modified, head.sha256(), null),
                    null, null);
        }
        Sample sample = new Sample(file.getFileName().toString(), head.bytes(), head.bytes().length >= size, size);
        try {
            Reading r = formats.read(sample);
            return new Inspection(new DatasetSeen(uri, name, r.kind(), sourceId, r.format(), size, modified, head.sha256(),
                    r.rowCount(), r.rowCountExact(), Json.canonical(r.details()), null, r.columns()), null, null);
        } catch (UnreadableFileException e) {
            var seen = new DatasetSeen(uri, name, org.headwater.model.DatasetKind.OTHER, sourceId, sample.extension().isEmpty()
                    ? "unknown" : sample.extension(), size, modified, head.sha256(), null, false, null, e.getMessage(), null);
            return new Inspection(seen, e.kind(), e.getMessage());
        } catch (RuntimeException e) {
            // A reader bug must cost one file, not the harvest; the message names the reader's failure.
            String message = "The format reader failed: " + e;
            var seen = new DatasetSeen(uri, name, org.headwater.model.DatasetKind.OTHER, sourceId, "unknown", size, modified,
                    head.sha256(), null, false, null, message, null);
            return new Inspection(seen, "reader_failure", message);
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
