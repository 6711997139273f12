package org.headwater.harvest.table;

import java.time.Instant;
import java.util.List;
import java.util.Map;
import org.headwater.ingest.Observation.TableVersion;
import org.headwater.model.ColumnDef;

/**
 * What a table format's metadata says about the table now, and its history.
 *
 * @param format {@code delta} or {@code iceberg}
 * @param columns the current schema
 * @param rowCount live rows from the format's own statistics, or null when it keeps none
 * @param sizeBytes total size of the live data files, or null when unknown
 * @param modified the time of the current table version, as the table recorded it
 * @param details the table's versions, schemas and partitioning, for the dataset's details
 * @param versions the table's versions still in its metadata, oldest first, each with the schema then in force
 */
public record TableReading(String format, List<ColumnDef> columns, Long rowCount, Long sizeBytes, Instant modified,
        Map<String, Object> details, List<TableVersion> versions) {
    public TableReading {
        columns = List.copyOf(columns);
        versions = List.copyOf(versions);
    }
}
