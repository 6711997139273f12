package org.headwater.harvest.table;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.headwater.ingest.Observation.TableVersion;
import org.headwater.model.ColumnDef;

/**
 * Reads an Apache Iceberg table from its metadata file, following the Iceberg Table Spec (format versions
 * 1 and 2, "Table Metadata" and "Table Metadata Fields"): the current metadata file is named by
 * {@code metadata/version-hint.text} where present, else it is the one with the highest version number in its
 * name ({@code v<N>.metadata.json} or {@code <N>-<uuid>.metadata.json}). Schemas, snapshots and partition
 * specs come from that one file; table properties are not kept (they are free text, and may hold anything).
 */
public final class IcebergMetadata {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Pattern METADATA = Pattern.compile("metadata/v?(\\d+)(-[^/]*)?\\.metadata\\.json");
    private static final String HINT = "metadata/version-hint.text";

    /** Whether a name relative to a table folder's parent is an Iceberg metadata file; group 1 is the table folder. */
    public static final Pattern METADATA_ANYWHERE = Pattern.compile("(^|.*/)metadata/[^/]+\\.metadata\\.json");

    private IcebergMetadata() {
    }

    public static TableReading read(List<TableFile> files) throws UnreadableTableException, IOException {
        Map<Long, TableFile> byVersion = new HashMap<>();
        Map<String, TableFile> byName = new HashMap<>();
        TableFile hint = null;
        for (TableFile f : files) {
            byName.put(f.name(), f);
            Matcher m = METADATA.matcher(f.name());
            if (m.matches()) {
                byVersion.put(Long.parseLong(m.group(1)), f);
            } else if (f.name().equals(HINT)) {
                hint = f;
            }
        }
        if (byVersion.isEmpty()) {
            throw new UnreadableTableException("The metadata folder holds no metadata file named by a version number");
        }
        TableFile current = byVersion.values().stream()
                .max(Comparator.comparingLong(f -> versionOf(f.name()))).orElseThrow();
        if (hint != null) {
            String text = new String(hint.read(), StandardCharsets.UTF_8).trim();
            try {
                TableFile hinted = byVersion.get(Long.parseLong(text));
                if (hinted != null) {
                    current = hinted;
                }
            } catch (NumberFormatException e) {
                // A damaged hint: the highest-numbered file is the spec's fallback.
            }
        }
        JsonNode meta;
        try {
            meta = JSON.readTree(current.read());
        } catch (IOException e) {
            throw new UnreadableTableException(current.name() + " is not JSON: " + e.getMessage(), e);
        }
        return reading(meta, current.name(), byName);
    }

    private static long versionOf(String name) {
        Matcher m = METADATA.matcher(name);
        return m.matches() ? Long.parseLong(m.group(1)) : -1;
    }

    private static TableReading reading(JsonNode meta, String fileName, Map<String, TableFile> byName)
            throws UnreadableTableException, IOException {
        IcebergManifests.Files manifests = IcebergManifests.in(byName, meta.path("location").asText(null));
        int formatVersion = meta.path("format-version").asInt(1);
        // Table Spec "Table Metadata Fields": v2 lists schemas with current-schema-id; v1 may hold only "schema".
        Map<Integer, JsonNode> schemas = new LinkedHashMap<>();
        for (JsonNode s : meta.path("schemas")) {
            schemas.put(s.path("schema-id").asInt(), s);
        }
        JsonNode currentSchema = meta.hasNonNull("current-schema-id") ? schemas.get(meta.get("current-schema-id").asInt())
                : meta.get("schema");
        if (currentSchema == null && meta.has("schema")) {
            currentSchema = meta.get("schema");
        }
        if (currentSchema == null) {
            throw new UnreadableTableException(fileName + " names no current schema");
        }
        if (schemas.isEmpty()) {
            schemas.put(currentSchema.path("schema-id").asInt(0), currentSchema);
        }
        List<ColumnDef> columns = columns(currentSchema);
        Map<Integer, String> namesById = new HashMap<>();
        for (JsonNode s : schemas.values()) {
            s.path("fields").forEach(f -> namesById.put(f.path("id").asInt(), f.path("name").asText()));
        }

        List<Map<String, Object>> specs = new ArrayList<>();
        for (JsonNode spec : meta.path("partition-specs")) {
            specs.add(spec(spec.path("spec-id").asInt(), spec.path("fields"), namesById));
        }
        if (specs.isEmpty() && meta.has("partition-spec")) {
            specs.add(spec(0, meta.get("partition-spec"), namesById));
        }
        int defaultSpec = meta.path("default-spec-id").asInt(0);
        List<Object> partitionColumns = new ArrayList<>();
        for (Map<String, Object> spec : specs) {
            if (spec.get("spec_id").equals(defaultSpec)) {
                partitionColumns.addAll((List<?>) spec.get("fields"));
            }
        }

        long currentSnapshot = meta.path("current-snapshot-id").asLong(-1);
        List<Map<String, Object>> snapshots = new ArrayList<>();
        JsonNode currentSummary = null;
        IcebergManifests.Counts currentCounts = null;
        for (JsonNode snap : meta.path("snapshots")) {
            Map<String, Object> s = new LinkedHashMap<>();
            s.put("snapshot_id", snap.path("snapshot-id").asLong());
            if (snap.hasNonNull("sequence-number")) {
                s.put("sequence_number", snap.get("sequence-number").asLong());
            }
            s.put("timestamp", Instant.ofEpochMilli(snap.path("timestamp-ms").asLong()).toString());
            s.put("operation", snap.path("summary").path("operation").asText(null));
            s.put("schema_id", snap.hasNonNull("schema-id") ? snap.get("schema-id").asInt() : null);
            IcebergManifests.Counts counts = null;
            if (snap.hasNonNull("manifest-list")) {
                try {
                    counts = IcebergManifests.count(snap.get("manifest-list").asText(), manifests);
                    s.put("data_files", counts.dataFiles());
                    s.put("records", counts.records());
                } catch (UnreadableTableException e) {
                    // The metadata file still says what the table is; the counts of this snapshot are unknown.
                    s.put("manifest_problem", e.getMessage());
                }
            }
            snapshots.add(s);
            if (snap.path("snapshot-id").asLong() == currentSnapshot) {
                currentSummary = snap.path("summary");
                currentCounts = counts;
            }
        }
        snapshots.sort(Comparator.comparing(s -> (String) s.get("timestamp")));
        List<TableVersion> history = history(meta, schemas, currentSchema, partitionColumns);

        List<Map<String, Object>> schemaList = new ArrayList<>();
        for (Map.Entry<Integer, JsonNode> s : schemas.entrySet()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("schema_id", s.getKey());
            m.put("columns", DeltaLog.columnMaps(columns(s.getValue())));
            schemaList.add(m);
        }
        // Table Spec "Snapshot Summary": total-records and total-files-size describe the whole table at the snapshot.
        // The manifests' counts where they could be read, else the optional summary fields.
        Long rows = currentCounts != null ? Long.valueOf(currentCounts.records()) : summaryLong(currentSummary, "total-records");
        Long size = summaryLong(currentSummary, "total-files-size");
        Instant modified = Instant.ofEpochMilli(meta.path("last-updated-ms").asLong());

        Map<String, Object> details = new LinkedHashMap<>();
        details.put("table_format", "iceberg");
        details.put("format_version", formatVersion);
        details.put("table_uuid", meta.path("table-uuid").asText(null));
        details.put("metadata_file", fileName);
        details.put("current_schema_id", currentSchema.path("schema-id").asInt(0));
        details.put("current_snapshot_id", currentSnapshot < 0 ? null : currentSnapshot);
        details.put("data_files", currentCounts != null ? currentCounts.dataFiles()
                : summaryLong(currentSummary, "total-data-files"));
        details.put("partition_columns", partitionColumns);
        details.put("partition_specs", specs);
        details.put("snapshots", snapshots);
        details.put("schemas", schemaList);
        return new TableReading("iceberg", columns, rows, size, modified, details, history);
    }

    /**
     * Table Spec "Snapshots": every snapshot, in sequence-number order (v2) or time order (v1), with the schema
     * it was written with ({@code schema-id}, optional in v1: then the current schema). A schema made current
     * after the last snapshot ("Schema Evolution" without a write) is one more version at the metadata file's
     * {@code last-updated-ms}.
     */
    private static List<TableVersion> history(JsonNode meta, Map<Integer, JsonNode> schemas, JsonNode currentSchema,
            List<Object> partitionFields) {
        List<String> partitions = new ArrayList<>();
        for (Object f : partitionFields) {
            Map<?, ?> field = (Map<?, ?>) f;
            String transform = String.valueOf(field.get("transform"));
            partitions.add(transform.equals("identity") ? String.valueOf(field.get("source_column"))
                    : transform + "(" + field.get("source_column") + ")");
        }
        List<JsonNode> snaps = new ArrayList<>();
        meta.path("snapshots").forEach(snaps::add);
        snaps.sort(Comparator.comparingLong((JsonNode n) -> n.path("sequence-number").asLong(0))
                .thenComparingLong(n -> n.path("timestamp-ms").asLong()));
        int currentId = currentSchema.path("schema-id").asInt(0);
        List<TableVersion> versions = new ArrayList<>();
        int lastSchemaId = -1;
        for (JsonNode snap : snaps) {
            JsonNode schema = snap.hasNonNull("schema-id") ? schemas.get(snap.get("schema-id").asInt()) : null;
            if (schema == null) {
                schema = currentSchema;
            }
            lastSchemaId = schema.path("schema-id").asInt(currentId);
            versions.add(new TableVersion("snapshot " + snap.path("snapshot-id").asLong(),
                    Instant.ofEpochMilli(snap.path("timestamp-ms").asLong()),
                    snap.path("summary").path("operation").asText(null), columns(schema), partitions));
        }
        if (lastSchemaId != currentId) {
            versions.add(new TableVersion("schema " + currentId, Instant.ofEpochMilli(meta.path("last-updated-ms").asLong()),
                    null, columns(currentSchema), partitions));
        }
        return versions;
    }

    private static Map<String, Object> spec(int id, JsonNode fields, Map<Integer, String> namesById) {
        List<Map<String, Object>> out = new ArrayList<>();
        for (JsonNode f : fields) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("name", f.path("name").asText());
            m.put("source_column", namesById.get(f.path("source-id").asInt()));
            m.put("transform", f.path("transform").asText());
            out.add(m);
        }
        Map<String, Object> spec = new LinkedHashMap<>();
        spec.put("spec_id", id);
        spec.put("fields", out);
        return spec;
    }

    /** Table Spec "Schemas and Data Types": a struct's fields with id, name, required and type. */
    private static List<ColumnDef> columns(JsonNode schema) {
        List<ColumnDef> columns = new ArrayList<>();
        for (JsonNode field : schema.path("fields")) {
            columns.add(new ColumnDef(field.path("name").asText(), TableTypes.word(field.get("type")),
                    !field.path("required").asBoolean(false)));
        }
        return columns;
    }

    private static Long summaryLong(JsonNode summary, String key) {
        if (summary == null || !summary.hasNonNull(key)) {
            return null;
        }
        try {
            return Long.parseLong(summary.get(key).asText());
        } catch (NumberFormatException e) {
            return null;
        }
    }
}
