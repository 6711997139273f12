package org.headwater.harvest;

import java.io.IOException;
import java.io.InputStream;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.regex.Matcher;
import org.headwater.harvest.format.Reading;
import org.headwater.harvest.table.DeltaLog;
import org.headwater.ingest.Observation.TableVersion;
import org.headwater.harvest.table.IcebergMetadata;
import org.headwater.harvest.table.TableFile;
import org.headwater.harvest.table.TableReading;
import org.headwater.harvest.table.UnreadableTableException;
import org.headwater.model.DatasetKind;

/** Finds the table folders among a root's objects and reads each through its format's metadata. */
final class TableFolders {
    /** Metadata files larger than this are not read: no real commit or metadata file comes near it. */
    private static final int METADATA_CAP = 64 * 1024 * 1024;

    enum Format { DELTA, ICEBERG }

    /**
     * One table folder read.
     *
     * @param reading the table as a dataset reading, or null with {@code error} saying why
     * @param versions the table's own versions, oldest first (empty when unreadable)
     */
    record Result(String format, Reading reading, Long sizeBytes, Instant modified, String error,
            List<TableVersion> versions) {
    }

    private TableFolders() {
    }

    /** Table folders by prefix relative to the root ({@code ""} when the root itself is a table, else ending in /). */
    static Map<String, Format> find(Collection<StoredObject> objects) {
        Map<String, Format> roots = new TreeMap<>();
        for (StoredObject o : objects) {
            // Most names hold neither folder; the regular expressions, which scan the whole name, are for the few.
            if (!o.name().endsWith(".json") || !(o.name().contains("_delta_log/") || o.name().contains("metadata/"))) {
                continue;
            }
            Matcher delta = DeltaLog.COMMIT_ANYWHERE.matcher(o.name());
            if (delta.matches()) {
                roots.put(delta.group(1), Format.DELTA);
                continue;
            }
            Matcher iceberg = IcebergMetadata.METADATA_ANYWHERE.matcher(o.name());
            if (iceberg.matches()) {
                roots.putIfAbsent(iceberg.group(1), Format.ICEBERG);
            }
        }
        return roots;
    }

    /** The innermost table folder holding this name, or null. */
    static String tableOf(String name, Collection<String> prefixes) {
        String best = null;
        for (String prefix : prefixes) {
            if (name.startsWith(prefix) && (best == null || prefix.length() > best.length())) {
                best = prefix;
            }
        }
        return best;
    }

    static Result read(StorageBackend backend, String prefix, List<StoredObject> members) {
        Format format = find(members).get(prefix);
        String word = format == Format.ICEBERG ? "iceberg" : "delta";
        List<TableFile> files = new ArrayList<>();
        for (StoredObject o : members) {
            String relative = o.name().substring(prefix.length());
            if (relative.startsWith("_delta_log/") || relative.startsWith("metadata/")) {
                files.add(new TableFile(relative, o.size(), o.modified(), () -> readWhole(backend, o)));
            }
        }
        try {
            TableReading t = format == Format.ICEBERG ? IcebergMetadata.read(files) : DeltaLog.read(files);
            Reading reading = new Reading(t.format(), DatasetKind.TABLE, t.columns(), t.rowCount(), t.rowCount() != null,
                    t.details());
            return new Result(word, reading, t.sizeBytes(), t.modified(), null, t.versions());
        } catch (UnreadableTableException e) {
            return new Result(word, null, null, null, e.getMessage(), List.of());
        } catch (IOException | RuntimeException e) {
            return new Result(word, null, null, null, "Could not read the table's metadata: " + e.getMessage(),
                    List.of());
        }
    }

    private static byte[] readWhole(StorageBackend backend, StoredObject o) throws IOException {
        if (o.size() > METADATA_CAP) {
            throw new IOException(o.name() + " is " + o.size() + " bytes, more than the " + METADATA_CAP
                    + " read for table metadata");
        }
        try (InputStream in = backend.open(o, o.size())) {
            return in.readNBytes((int) o.size());
        }
    }
}
