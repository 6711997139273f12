package org.headwater.harvest.table;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The table state a Delta checkpoint holds (PROTOCOL.md "Checkpoints" and "Checkpoint Schema"): one row per
 * action, the {@code metaData}, {@code protocol} and live {@code add} actions as struct columns; {@code remove}
 * rows are tombstones and not part of the state. Read with {@link ParquetColumns}.
 */
final class DeltaCheckpoint {
    private static final String PARTITION_PREFIX = "metaData.partitionColumns.";

    /**
     * The state at the checkpoint's version.
     *
     * @param files live files: path and size
     * @param rows live files: path and {@code numRecords} from their stats, null where a file has none
     */
    record State(String tableId, String schemaString, List<String> partitionColumns, Integer minReaderVersion,
            Integer minWriterVersion, Map<String, Long> files, Map<String, Long> rows) {
    }

    private DeltaCheckpoint() {
    }

    /** Reads the parts of one checkpoint (a single file, or "multi-part" files in part order). */
    static State read(List<byte[]> parts) throws UnreadableTableException {
        String tableId = null;
        String schemaString = null;
        List<String> partitionColumns = new ArrayList<>();
        Integer minReader = null;
        Integer minWriter = null;
        Map<String, Long> files = new LinkedHashMap<>();
        Map<String, Long> rows = new LinkedHashMap<>();
        for (byte[] part : parts) {
            Map<String, ParquetColumns.Column> columns = ParquetColumns.read(part, Set.of("metaData.id",
                    "metaData.schemaString", "metaData.partitionColumns.list.element", "metaData.partitionColumns.array",
                    "metaData.partitionColumns.list.item", "protocol.minReaderVersion", "protocol.minWriterVersion",
                    "add.path", "add.size", "add.stats"));
            tableId = first(columns.get("metaData.id"), tableId);
            schemaString = first(columns.get("metaData.schemaString"), schemaString);
            minReader = first(columns.get("protocol.minReaderVersion"), minReader);
            minWriter = first(columns.get("protocol.minWriterVersion"), minWriter);
            for (Map.Entry<String, ParquetColumns.Column> c : columns.entrySet()) {
                if (c.getKey().startsWith(PARTITION_PREFIX)) {
                    c.getValue().values().stream().filter(v -> v != null).forEach(v -> partitionColumns.add((String) v));
                }
            }
            ParquetColumns.Column paths = columns.get("add.path");
            if (paths == null) {
                continue;
            }
            List<Object> sizes = present(columns.get("add.size"));
            List<Object> stats = present(columns.get("add.stats"));
            List<Object> pathValues = present(paths);
            for (int i = 0; i < pathValues.size(); i++) {
                String path = (String) pathValues.get(i);
                files.put(path, i < sizes.size() && sizes.get(i) != null ? ((Number) sizes.get(i)).longValue() : 0L);
                rows.put(path, i < stats.size() ? DeltaLog.numRecords((String) stats.get(i)) : null);
            }
        }
        if (schemaString == null) {
            throw new UnreadableTableException("The checkpoint holds no metaData action with a schemaString");
        }
        return new State(tableId, schemaString, List.copyOf(partitionColumns), minReader, minWriter, files, rows);
    }

    /** The entries of a column of the add struct whose struct is there (definition level 1 or more), in row order. */
    private static List<Object> present(ParquetColumns.Column column) {
        List<Object> out = new ArrayList<>();
        if (column == null) {
            return out;
        }
        for (int i = 0; i < column.levels().size(); i++) {
            if (column.levels().get(i) >= 1) {
                out.add(column.values().get(i));
            }
        }
        return out;
    }

    @SuppressWarnings("unchecked")
    private static <T> T first(ParquetColumns.Column column, T otherwise) {
        if (column != null) {
            for (Object v : column.values()) {
                if (v != null) {
                    return (T) v;
                }
            }
        }
        return otherwise;
    }
}
