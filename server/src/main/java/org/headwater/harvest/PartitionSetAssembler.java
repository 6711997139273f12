package org.headwater.harvest;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Set;
import java.util.TreeSet;
import org.headwater.ingest.Json;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.PartitionView;

/**
 * Describes a partitioned set from its members: the union of their columns, their totals, and how each
 * member's columns differ from the union (drift). Works from the stored partitions, so members that were
 * not read again in this harvest still count.
 */
final class PartitionSetAssembler {
    private PartitionSetAssembler() {
    }

    static DatasetSeen assemble(String uri, String name, long sourceId, List<String> keyNames, List<PartitionView> parts) {
        Map<String, ColumnDef> union = new LinkedHashMap<>();
        Set<String> formats = new TreeSet<>();
        long size = 0;
        long rows = 0;
        boolean exact = true;
        java.time.Instant newest = null;
        int readable = 0;
        for (PartitionView p : parts) {
            size += p.sizeBytes() == null ? 0 : p.sizeBytes();
            rows += p.rowCount() == null ? 0 : p.rowCount();
            exact &= p.rowCountExact() && p.rowCount() != null;
            if (p.modifiedAt() != null && (newest == null || p.modifiedAt().isAfter(newest))) {
                newest = p.modifiedAt();
            }
            String ending = p.name().substring(p.name().lastIndexOf('.') + 1);
            formats.add(ending);
            if (p.error() != null) {
                continue;
            }
            readable++;
            for (ColumnView c : p.columns()) {
                ColumnDef seen = union.get(c.name());
                union.put(c.name(), seen == null ? new ColumnDef(c.name(), c.type(), c.nullable())
                        : new ColumnDef(c.name(), widen(seen.dataType(), c.type()), seen.nullable() || c.nullable()));
            }
        }
        List<ColumnDef> columns = new ArrayList<>();
        for (ColumnDef c : union.values()) {
            boolean inAll = parts.stream().filter(p -> p.error() == null)
                    .allMatch(p -> p.columns().stream().anyMatch(pc -> pc.name().equals(c.name())));
            columns.add(new ColumnDef(c.name(), c.dataType(), c.nullable() || !inAll));
        }
        Map<String, Object> details = new LinkedHashMap<>();
        details.put("partition_keys", keyNames);
        details.put("partition_count", parts.size());
        details.put("drift", drift(parts, columns));
        String format = formats.size() == 1 ? formats.iterator().next() : "mixed";
        return new DatasetSeen(uri, name, DatasetKind.FILE_SET, sourceId, format, size, newest, null,
                rows, exact, Json.canonical(details), readable == 0 ? "No partition could be read" : null, columns);
    }

    /** Members whose columns are not the union's: what they lack, add or type differently. */
    private static List<Map<String, Object>> drift(List<PartitionView> parts, List<ColumnDef> union) {
        List<Map<String, Object>> drift = new ArrayList<>();
        for (PartitionView p : parts) {
            if (p.error() != null) {
                continue;
            }
            List<String> missing = new ArrayList<>();
            List<String> retyped = new ArrayList<>();
            for (ColumnDef u : union) {
                ColumnView own = p.columns().stream().filter(c -> c.name().equals(u.name())).findFirst().orElse(null);
                if (own == null) {
                    missing.add(u.name());
                } else if (!Objects.equals(own.type(), u.dataType())) {
                    retyped.add(u.name() + ": " + own.type());
                }
            }
            if (!missing.isEmpty() || !retyped.isEmpty()) {
                Map<String, Object> entry = new LinkedHashMap<>();
                entry.put("partition", p.name());
                entry.put("missing", missing);
                entry.put("retyped", retyped);
                drift.add(entry);
            }
        }
        return drift;
    }

    /** The narrowest type both values fit: integer and decimal make decimal; anything else mixed is text. */
    static String widen(String a, String b) {
        if (a.equals(b)) {
            return a;
        }
        Set<String> pair = Set.of(a, b);
        if (pair.equals(Set.of("integer", "decimal"))) {
            return "decimal";
        }
        if (pair.equals(Set.of("date", "timestamp"))) {
            return "timestamp";
        }
        return "text";
    }
}
