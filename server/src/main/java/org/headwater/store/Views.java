package org.headwater.store;

import com.fasterxml.jackson.annotation.JsonRawValue;
import java.time.Instant;
import java.util.List;

/** Read-side shapes of catalog content, as the API, the CLI and the search index see them. */
public final class Views {
    private Views() {
    }

    /** A dataset in a list. {@code present} is false once the dataset is gone from its source. */
    public record DatasetSummary(long id, String uri, String name, String kind, String source, String format,
            Long sizeBytes, Instant modifiedAt, int columnCount, boolean present) {
    }

    /** One column of a dataset's current (or as-of) schema version. */
    public record ColumnView(int ordinal, String name, String type, boolean nullable) {
    }

    /**
     * One schema version of a dataset, for its history, with how it differs from the version before.
     *
     * @param tableVersion for a table format, the table's own version ({@code 12}, {@code snapshot 3051}); else null
     * @param recordedAt for a table format, when the table says the version was made (its clock, not the catalog's)
     * @param operation for a table format, what the table says was done, or null
     * @param partitionColumns for a table format, the partition columns of that version; else null
     */
    public record SchemaVersionView(int version, Instant validFrom, Instant validTo, List<ColumnView> columns,
            Drift drift, String tableVersion, Instant recordedAt, String operation, List<String> partitionColumns) {
    }

    /** Columns added, removed and retyped (as {@code name: old -> new}) since the previous schema version. */
    public record Drift(List<String> added, List<String> removed, List<String> retyped) {
        public static Drift between(List<ColumnView> before, List<ColumnView> after) {
            java.util.Map<String, String> old = new java.util.LinkedHashMap<>();
            before.forEach(c -> old.put(c.name(), c.type()));
            java.util.Map<String, String> now = new java.util.LinkedHashMap<>();
            after.forEach(c -> now.put(c.name(), c.type()));
            List<String> added = now.keySet().stream().filter(n -> !old.containsKey(n)).toList();
            List<String> removed = old.keySet().stream().filter(n -> !now.containsKey(n)).toList();
            List<String> retyped = now.entrySet().stream()
                    .filter(e -> old.containsKey(e.getKey()) && !old.get(e.getKey()).equals(e.getValue()))
                    .map(e -> e.getKey() + ": " + old.get(e.getKey()) + " -> " + e.getValue()).toList();
            return new Drift(added, removed, retyped);
        }
    }

    /**
     * An owner of a dataset, and the rule or evidence that says so.
     *
     * @param origin {@code file} (the owners file), {@code manual} (set by a person), {@code declared}
     *     (another source) or {@code git} (a suggestion from the history of the scripts that write it)
     * @param inherited given to a folder above the dataset, or to the partitioned set a partition belongs to
     * @param suggested a person to ask rather than an owner: git authors of the scripts that write it
     */
    public record OwnerView(String name, String kind, String reason, String origin, boolean inherited,
            boolean suggested) {
    }

    /** A lineage edge as seen from one of its ends. */
    /**
     * A lineage edge as seen from one of its ends.
     *
     * @param corroboration how code and runs agree on it: {@code static and runtime} (found in the code and
     *     seen in a run of that script), {@code runtime only}, {@code static only} (the script never ran under
     *     a connector), or {@code static, not seen in recent runs} (the script's last runs did not do it:
     *     possibly dead code)
     * @param combinedConfidence the confidence when both kinds of evidence are counted: 1 - (1-a)(1-b)
     */
    public record EdgeView(long edgeId, long datasetId, String datasetName, String script, String evidence,
            double confidence, String corroboration, double combinedConfidence) {
    }

    /** Everything the catalog knows of one dataset at one time. */
    public record DatasetView(long id, String uri, String name, String kind, String source, boolean present,
            Instant firstSeen, String format, Long sizeBytes, Instant modifiedAt, String contentHash, Long rowCount,
            boolean rowCountExact, @JsonRawValue String details, String error, String description, List<String> tags,
            List<OwnerView> owners, Integer schemaVersion, List<ColumnView> columns, List<PartitionView> partitions,
            List<EdgeView> upstream, List<EdgeView> downstream) {
    }

    /** A script, with its current version. */
    public record ScriptView(long id, String uri, String name, String language, String source, boolean present,
            Long sizeBytes, Instant modifiedAt, String contentHash, String gitCommit, String gitAuthor,
            Instant gitCommittedAt, @JsonRawValue String gitAuthors) {
    }

    /** One column-level flow into a dataset, from a current lineage edge. */
    public record ColumnFlowView(String sourceDataset, String sourceColumn, String targetColumn, String role,
            String evidence, String script) {
    }

    /** One read or write a script's code holds, as static analysis found it. */
    public record ReferenceView(String direction, String pattern, boolean resolved, String dataset, String function,
            String expression, int line, int column, Integer cell, double confidence) {
    }

    /** A run of a script, as lists show it. */
    public record RunSummary(String id, String script, Instant startedAt, Instant endedAt, Integer exitCode,
            String exception, String user, String host, String gitCommit, int reads, int writes) {
    }

    /** A file the catalog already holds, with what incremental harvest compares. */
    /** A file or object a source harvested before; {@code contentHash} is a SHA-256 or {@code etag:<tag>}. */
    public record KnownFile(String uri, Long sizeBytes, Instant modifiedAt, FileRole role, String setUri,
            String contentHash) {
    }

    /** What a harvested file is in the catalog. */
    public enum FileRole { DATASET, SCRIPT, PARTITION }

    /** One member file of a partitioned set. */
    public record PartitionView(String name, String uri, @JsonRawValue String keys, Long sizeBytes, Instant modifiedAt,
            String contentHash, Long rowCount, boolean rowCountExact, List<ColumnView> columns, String error) {
    }

    /** What the search index stores of a dataset or script. */
    public record IndexEntry(String kind, long id, String uri, String name, String format, String source,
            List<String> columns, String description, List<String> tags, List<String> owners) {
    }

    /** One harvest, with its counts and the first of its errors. */
    public record HarvestView(long id, String source, Instant startedAt, Instant finishedAt, String status,
            int filesSeen, int filesUnchanged, int filesIgnored, int datasets, int scripts, int changes, int removed, int errors,
            List<HarvestErrorView> errorList) {
    }

    /** A file a harvest could not read, and why. */
    public record HarvestErrorView(String uri, String kind, String message) {
    }
}
