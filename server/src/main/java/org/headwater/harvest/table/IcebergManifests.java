package org.headwater.harvest.table;

import java.io.IOException;
import java.util.Map;
import org.apache.avro.file.DataFileReader;
import org.apache.avro.file.SeekableByteArrayInput;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;

/**
 * Counts the live data files and records of an Iceberg snapshot from its manifest list, following the Iceberg
 * Table Spec, "Manifest Lists" and "Manifests": both are Avro container files. The snapshot summary's
 * {@code total-data-files} and {@code total-records} are optional ("Optional Snapshot Summary Fields"), so they
 * are no substitute. A manifest list entry carries its manifest's file and row counts (required from format
 * version 2); where they are absent (allowed in version 1) the manifest's entries are counted instead.
 */
final class IcebergManifests {
    /** Manifest entry status ("Manifest Entry Fields"): 0 existing, 1 added, 2 deleted. */
    private static final int DELETED = 2;

    /** Data files and records live in a snapshot. */
    record Counts(long dataFiles, long records) {
    }

    /** Finds a metadata file by its location as the table metadata writes it (absolute), or null. */
    @FunctionalInterface
    interface Files {
        TableFile byLocation(String location);
    }

    private IcebergManifests() {
    }

    /**
     * Counts a snapshot's live data files and records.
     *
     * @throws UnreadableTableException when the manifest list or a manifest is missing or not Avro
     */
    static Counts count(String manifestList, Files files) throws UnreadableTableException, IOException {
        long dataFiles = 0;
        long records = 0;
        for (GenericRecord manifest : records(manifestList, files)) {
            // "Manifest Lists": content 0 is data, 1 deletes (field absent in v1: data).
            if (intOf(manifest, 0, "content") != 0) {
                continue;
            }
            Long added = longOf(manifest, "added_files_count", "added_data_files_count");
            Long existing = longOf(manifest, "existing_files_count", "existing_data_files_count");
            Long addedRows = longOf(manifest, "added_rows_count");
            Long existingRows = longOf(manifest, "existing_rows_count");
            if (added != null && existing != null && addedRows != null && existingRows != null) {
                dataFiles += added + existing;
                records += addedRows + existingRows;
                continue;
            }
            for (GenericRecord entry : records(String.valueOf(manifest.get("manifest_path")), files)) {
                if (intOf(entry, 0, "status") == DELETED) {
                    continue;
                }
                GenericRecord file = (GenericRecord) entry.get("data_file");
                dataFiles++;
                records += longOf(file, "record_count");
            }
        }
        return new Counts(dataFiles, records);
    }

    private static Iterable<GenericRecord> records(String location, Files files) throws UnreadableTableException,
            IOException {
        TableFile file = files.byLocation(location);
        if (file == null) {
            throw new UnreadableTableException("the table names " + location + ", which is not in its metadata folder");
        }
        java.util.List<GenericRecord> out = new java.util.ArrayList<>();
        try (DataFileReader<GenericRecord> reader = new DataFileReader<>(new SeekableByteArrayInput(file.read()),
                new GenericDatumReader<>())) {
            while (reader.hasNext()) {
                out.add(reader.next());
            }
        } catch (IOException | RuntimeException e) {
            throw new UnreadableTableException(file.name() + " is not an Avro file: " + e.getMessage(), e);
        }
        return out;
    }

    private static int intOf(GenericRecord r, int absent, String field) {
        Object v = r.hasField(field) ? r.get(field) : null;
        return v == null ? absent : ((Number) v).intValue();
    }

    private static Long longOf(GenericRecord r, String... names) {
        for (String name : names) {
            if (r.hasField(name) && r.get(name) != null) {
                return ((Number) r.get(name)).longValue();
            }
        }
        return null;
    }

    /** The relative name of an absolute location under the table's location, or null. */
    static String relative(String location, String tableLocation) {
        if (tableLocation != null) {
            String base = tableLocation.endsWith("/") ? tableLocation : tableLocation + "/";
            if (location.startsWith(base)) {
                return location.substring(base.length());
            }
        }
        // A table copied or moved keeps its old absolute locations: its metadata folder is still "metadata/".
        int at = location.lastIndexOf("/metadata/");
        return at < 0 ? null : location.substring(at + 1);
    }

    static Files in(Map<String, TableFile> byName, String tableLocation) {
        return location -> {
            String name = relative(location, tableLocation);
            return name == null ? null : byName.get(name);
        };
    }
}
