package org.headwater.harvest.table;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.BufferedReader;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.headwater.ingest.Observation.TableVersion;
import org.headwater.model.ColumnDef;

/**
 * Reads a Delta Lake table from its transaction log, following the Delta Transaction Log Protocol
 * (PROTOCOL.md, "Delta Table Specification"): commits are {@code _delta_log/<version, 20 digits>.json},
 * one action per line; the table's state is the replay of {@code metaData}, {@code add} and {@code remove}
 * actions in version order; {@code commitInfo} carries the operation and its timestamp.
 *
 * <p>When the log no longer starts at version 0 (commits before a checkpoint may be cleaned up, "Checkpoints"),
 * the state starts from the newest Parquet checkpoint after which every commit is still there, and the commits
 * after it are replayed. Without such a checkpoint the table is reported unreadable rather than guessed.
 */
public final class DeltaLog {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final Pattern COMMIT = Pattern.compile("_delta_log/(\\d{20})\\.json");
    private static final Pattern CHECKPOINT = Pattern.compile("_delta_log/(\\d{20})\\.checkpoint(\\..+)?\\.parquet");

    private DeltaLog() {
    }

    /** Whether a name relative to a table folder's parent is a Delta commit file; group 1 is the table folder. */
    public static final Pattern COMMIT_ANYWHERE = Pattern.compile("(^|.*/)_delta_log/\\d{20}\\.json");

    public static TableReading read(List<TableFile> files) throws UnreadableTableException, IOException {
        TreeMap<Long, TableFile> commits = new TreeMap<>();
        TreeMap<Long, List<TableFile>> checkpointParts = new TreeMap<>();
        for (TableFile f : files) {
            Matcher c = COMMIT.matcher(f.name());
            if (c.matches()) {
                commits.put(Long.parseLong(c.group(1)), f);
            }
            Matcher p = CHECKPOINT.matcher(f.name());
            if (p.matches()) {
                checkpointParts.computeIfAbsent(Long.parseLong(p.group(1)), k -> new ArrayList<>()).add(f);
            }
        }
        TreeSet<Long> checkpoints = new TreeSet<>(checkpointParts.keySet());
        if (commits.isEmpty() && checkpoints.isEmpty()) {
            throw new UnreadableTableException("The _delta_log folder holds no commit files");
        }
        Long from = startingCheckpoint(commits, checkpoints);
        boolean complete = from != null || unbroken(commits, 0);
        List<Map<String, Object>> versions = new ArrayList<>();
        List<Map<String, Object>> schemas = new ArrayList<>();
        List<TableVersion> history = new ArrayList<>();
        Map<String, Long> liveFiles = new LinkedHashMap<>();
        Map<String, Long> liveRows = new LinkedHashMap<>();
        List<ColumnDef> columns = null;
        List<String> partitionColumns = List.of();
        String tableId = null;
        String schemaString = null;
        Map<String, Object> protocol = null;
        Instant modified = null;
        if (from != null) {
            List<TableFile> parts = checkpointParts.get(from);
            parts.sort(java.util.Comparator.comparing(TableFile::name));
            List<byte[]> bytes = new ArrayList<>();
            for (TableFile part : parts) {
                bytes.add(part.read());
            }
            DeltaCheckpoint.State state = DeltaCheckpoint.read(bytes);
            tableId = state.tableId();
            schemaString = state.schemaString();
            columns = columns(schemaString);
            partitionColumns = state.partitionColumns();
            if (state.minReaderVersion() != null) {
                protocol = new LinkedHashMap<>();
                protocol.put("min_reader_version", state.minReaderVersion());
                protocol.put("min_writer_version", state.minWriterVersion());
            }
            liveFiles.putAll(state.files());
            liveRows.putAll(state.rows());
            // The checkpoint's own version: its commit's time and operation if that commit is still there, else
            // the time the checkpoint was written.
            TableFile commit = commits.get(from);
            CommitInfo info = commit == null ? null : commitInfo(commit);
            Instant at = info != null && info.timestamp() != null ? info.timestamp() : parts.get(0).modified();
            modified = at;
            Map<String, Object> v = new LinkedHashMap<>();
            v.put("version", from);
            v.put("timestamp", at.toString());
            v.put("operation", info == null ? null : info.operation());
            v.put("from_checkpoint", true);
            versions.add(v);
            history.add(new TableVersion(Long.toString(from), at, info == null ? null : info.operation(), columns,
                    partitionColumns));
            Map<String, Object> sv = new LinkedHashMap<>();
            sv.put("from_version", from);
            sv.put("timestamp", at.toString());
            sv.put("columns", columnMaps(columns));
            schemas.add(sv);
        }
        for (Map.Entry<Long, TableFile> e : (from == null ? commits : commits.tailMap(from, false)).entrySet()) {
            long version = e.getKey();
            Instant timestamp = null;
            String operation = null;
            boolean schemaChanged = false;
            for (JsonNode action : actions(e.getValue())) {
                if (action.has("commitInfo")) {
                    JsonNode info = action.get("commitInfo");
                    // PROTOCOL.md "Commit Provenance Information": implementation-specific; timestamp and operation
                    // are what writers put there.
                    if (info.hasNonNull("timestamp")) {
                        timestamp = Instant.ofEpochMilli(info.get("timestamp").asLong());
                    }
                    operation = info.path("operation").asText(null);
                } else if (action.has("metaData")) {
                    JsonNode meta = action.get("metaData");
                    tableId = meta.path("id").asText(tableId);
                    String text = meta.path("schemaString").asText(null);
                    if (text != null && !text.equals(schemaString)) {
                        schemaString = text;
                        columns = columns(text);
                        schemaChanged = true;
                    }
                    List<String> parts = new ArrayList<>();
                    meta.path("partitionColumns").forEach(p -> parts.add(p.asText()));
                    partitionColumns = List.copyOf(parts);
                } else if (action.has("protocol")) {
                    JsonNode p = action.get("protocol");
                    protocol = new LinkedHashMap<>();
                    protocol.put("min_reader_version", p.path("minReaderVersion").asInt());
                    protocol.put("min_writer_version", p.path("minWriterVersion").asInt());
                } else if (action.has("add")) {
                    JsonNode add = action.get("add");
                    String path = add.path("path").asText();
                    liveFiles.put(path, add.path("size").asLong());
                    liveRows.put(path, numRecords(add.path("stats").asText(null)));
                } else if (action.has("remove")) {
                    String path = action.get("remove").path("path").asText();
                    liveFiles.remove(path);
                    liveRows.remove(path);
                }
            }
            // PROTOCOL.md "Commit Provenance Information" / "In-Commit Timestamps": without a recorded
            // timestamp, a commit's time is its file's modification time.
            Instant at = timestamp != null ? timestamp : e.getValue().modified();
            modified = at;
            Map<String, Object> v = new LinkedHashMap<>();
            v.put("version", version);
            v.put("timestamp", at.toString());
            v.put("operation", operation);
            versions.add(v);
            if (columns != null) {
                history.add(new TableVersion(Long.toString(version), at, operation, columns, partitionColumns));
            }
            if (schemaChanged) {
                Map<String, Object> s = new LinkedHashMap<>();
                s.put("from_version", version);
                s.put("timestamp", at.toString());
                s.put("columns", columnMaps(columns));
                schemas.add(s);
            }
        }
        if (columns == null) {
            throw new UnreadableTableException("The log starts at version " + commits.firstKey()
                    + " and no checkpoint holds the table's state before it");
        }
        Long rows = null;
        if (complete && liveRows.values().stream().allMatch(r -> r != null)) {
            rows = liveRows.values().stream().mapToLong(Long::longValue).sum();
        }
        Long size = complete ? liveFiles.values().stream().mapToLong(Long::longValue).sum() : null;
        Map<String, Object> details = new LinkedHashMap<>();
        details.put("table_format", "delta");
        details.put("table_id", tableId);
        details.put("current_version", Math.max(commits.isEmpty() ? -1 : commits.lastKey(), from == null ? -1 : from));
        details.put("checkpoint_read", from);
        details.put("partition_columns", partitionColumns);
        details.put("data_files", complete ? liveFiles.size() : null);
        details.put("protocol", protocol);
        details.put("checkpoints", List.copyOf(checkpoints));
        details.put("versions", versions);
        details.put("schemas", schemas);
        return new TableReading("delta", columns, rows, size, modified, details, history);
    }

    /**
     * The checkpoint to start from when the commits do not go back to version 0: the newest one after which
     * every commit up to the last is still there (PROTOCOL.md "Checkpoints": readers start at the newest one).
     */
    private static Long startingCheckpoint(TreeMap<Long, TableFile> commits, TreeSet<Long> checkpoints) {
        if (!commits.isEmpty() && unbroken(commits, 0)) {
            return null;
        }
        for (Long c : checkpoints.descendingSet()) {
            if (unbroken(commits, c + 1)) {
                return c;
            }
        }
        return null;
    }

    /** Whether the commits from {@code first} to the last one are all there (none, when the last is before it). */
    private static boolean unbroken(TreeMap<Long, TableFile> commits, long first) {
        if (commits.isEmpty() || commits.lastKey() < first) {
            return first == 0 ? false : true;
        }
        return commits.containsKey(first) && commits.tailMap(first, true).size() == commits.lastKey() - first + 1;
    }

    private record CommitInfo(Instant timestamp, String operation) {
    }

    private static CommitInfo commitInfo(TableFile commit) throws IOException, UnreadableTableException {
        for (JsonNode action : actions(commit)) {
            if (action.has("commitInfo")) {
                JsonNode info = action.get("commitInfo");
                return new CommitInfo(info.hasNonNull("timestamp") ? Instant.ofEpochMilli(info.get("timestamp").asLong())
                        : null, info.path("operation").asText(null));
            }
        }
        return null;
    }

    private static List<JsonNode> actions(TableFile file) throws IOException, UnreadableTableException {
        List<JsonNode> actions = new ArrayList<>();
        try (BufferedReader lines = new BufferedReader(new InputStreamReader(new ByteArrayInputStream(file.read()),
                StandardCharsets.UTF_8))) {
            String line;
            int number = 0;
            while ((line = lines.readLine()) != null) {
                number++;
                if (line.isBlank()) {
                    continue;
                }
                try {
                    actions.add(JSON.readTree(line));
                } catch (IOException e) {
                    throw new UnreadableTableException(file.name() + " line " + number + " is not a JSON action: "
                            + e.getMessage(), e);
                }
            }
        }
        return actions;
    }

    /** PROTOCOL.md "Schema Serialization Format": a struct type's fields, each with name, type and nullable. */
    static List<ColumnDef> columns(String schemaString) throws UnreadableTableException {
        JsonNode schema;
        try {
            schema = JSON.readTree(schemaString);
        } catch (IOException e) {
            throw new UnreadableTableException("The table's schemaString is not JSON: " + e.getMessage(), e);
        }
        List<ColumnDef> columns = new ArrayList<>();
        for (JsonNode field : schema.path("fields")) {
            columns.add(new ColumnDef(field.path("name").asText(), TableTypes.word(field.get("type")),
                    field.path("nullable").asBoolean(true)));
        }
        return columns;
    }

    /** PROTOCOL.md "Per-file Statistics": {@code numRecords} in the add action's stats JSON. */
    static Long numRecords(String stats) {
        if (stats == null) {
            return null;
        }
        try {
            JsonNode node = JSON.readTree(stats);
            return node.hasNonNull("numRecords") ? node.get("numRecords").asLong() : null;
        } catch (IOException e) {
            return null;
        }
    }

    static List<Map<String, Object>> columnMaps(List<ColumnDef> columns) {
        List<Map<String, Object>> out = new ArrayList<>();
        for (ColumnDef c : columns) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("name", c.name());
            m.put("type", c.dataType());
            m.put("nullable", c.nullable());
            out.add(m);
        }
        return out;
    }
}
