package org.headwater.ingest;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import java.util.Set;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.model.Language;

/**
 * One thing a source saw. Observations state facts, not commands: applying the same one twice leaves
 * the catalog as applying it once did.
 */
public sealed interface Observation {

    /**
     * A dataset exists and looks like this now.
     *
     * @param columns the column structure, or {@code null} when the dataset has none (a figure) or it
     *     could not be read (then {@code error} says why)
     * @param details format-specific facts as a canonical JSON object text, or {@code null}
     */
    record DatasetSeen(String uri, String name, DatasetKind kind, Long sourceId, String format,
            Long sizeBytes, Instant modifiedAt, String contentHash, Long rowCount, boolean rowCountExact,
            String details, String error, List<ColumnDef> columns) implements Observation {
        public DatasetSeen {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(name, "name");
            Objects.requireNonNull(kind, "kind");
            Objects.requireNonNull(format, "format");
            columns = columns == null ? null : List.copyOf(columns);
        }
    }

    /**
     * A table format's own history of a dataset (Delta commits, Iceberg snapshots), oldest first. Each version
     * not yet known becomes a schema version with the table's own timestamp; known ones are left alone, so a
     * log that lost its early commits to cleanup takes nothing away. Send it before the table's
     * {@link DatasetSeen}, whose columns then equal the newest version and add nothing.
     */
    record TableVersionsSeen(String uri, String name, Long sourceId, List<TableVersion> versions)
            implements Observation {
        public TableVersionsSeen {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(name, "name");
            versions = List.copyOf(versions);
        }
    }

    /**
     * One version of a table as the table recorded it.
     *
     * @param version the table's own name for it ({@code 12} for a Delta commit, {@code snapshot 3051} or
     *     {@code schema 2} for Iceberg), unique within the table
     * @param recordedAt when the table says it happened, or null when it does not say
     * @param operation what the table says was done ({@code WRITE}, {@code append}), or null
     */
    record TableVersion(String version, Instant recordedAt, String operation, List<ColumnDef> columns,
            List<String> partitionColumns) {
        public TableVersion {
            Objects.requireNonNull(version, "version");
            columns = List.copyOf(columns);
            partitionColumns = List.copyOf(partitionColumns);
        }
    }

    /** A dataset that was seen before is no longer there; its history stays. */
    record DatasetGone(String uri) implements Observation {
        public DatasetGone {
            Objects.requireNonNull(uri, "uri");
        }
    }

    /**
     * One file of a partitioned set exists and looks like this. The set's identity is created if needed;
     * the set's own facts (union schema, totals) come in a {@link DatasetSeen} for the set.
     *
     * @param keys the values of the set's variable path parts, as canonical JSON ({"month":"01"})
     * @param columns the partition's own columns, or null when it could not be read
     */
    record PartitionSeen(String setUri, String setName, Long sourceId, String uri, String name, String keys,
            Long sizeBytes, Instant modifiedAt, String contentHash, Long rowCount, boolean rowCountExact,
            List<ColumnDef> columns, String error) implements Observation {
        public PartitionSeen {
            Objects.requireNonNull(setUri, "setUri");
            Objects.requireNonNull(setName, "setName");
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(name, "name");
            Objects.requireNonNull(keys, "keys");
            columns = columns == null ? null : List.copyOf(columns);
        }
    }

    /** A partition that was seen before is no longer there. */
    record PartitionGone(String setUri, String uri) implements Observation {
        public PartitionGone {
            Objects.requireNonNull(setUri, "setUri");
            Objects.requireNonNull(uri, "uri");
        }
    }

    /**
     * A script exists and this is its current version.
     *
     * @param gitCommit the last commit that changed the file, or null outside git
     * @param gitAuthors everyone who changed it in git, most recent first (names only)
     */
    record ScriptSeen(String uri, String name, Language language, Long sourceId, Long sizeBytes,
            Instant modifiedAt, String contentHash, String gitCommit, String gitAuthor, Instant gitCommittedAt,
            List<String> gitAuthors) implements Observation {
        public ScriptSeen {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(name, "name");
            Objects.requireNonNull(language, "language");
            gitAuthors = gitAuthors == null ? List.of() : List.copyOf(gitAuthors);
        }
    }

    /** A script that was seen before is no longer there. */
    record ScriptGone(String uri) implements Observation {
        public ScriptGone {
            Objects.requireNonNull(uri, "uri");
        }
    }

    /**
     * Data flows from one dataset to another, through a script (and maybe a particular run).
     * The edge is identified by (source, target, script, evidence); its other facts may change.
     */
    record EdgeSeen(String sourceUri, String targetUri, String scriptUri, String scriptHash, String runId,
            Evidence evidence, double confidence, List<ColumnFlow> columns) implements Observation {
        public EdgeSeen {
            Objects.requireNonNull(sourceUri, "sourceUri");
            Objects.requireNonNull(targetUri, "targetUri");
            Objects.requireNonNull(evidence, "evidence");
            if (!(confidence >= 0.0 && confidence <= 1.0)) {
                throw new IllegalArgumentException("confidence must be within [0, 1]: " + confidence);
            }
            columns = columns == null ? List.of() : List.copyOf(columns);
        }
    }

    /** An edge that was observed before no longer holds (for example the script stopped reading a file). */
    record EdgeGone(String sourceUri, String targetUri, String scriptUri, Evidence evidence) implements Observation {
        public EdgeGone {
            Objects.requireNonNull(sourceUri, "sourceUri");
            Objects.requireNonNull(targetUri, "targetUri");
            Objects.requireNonNull(evidence, "evidence");
        }
    }

    /**
     * Column-level flow inside a dataset edge.
     *
     * @param targetColumn the column written, or {@code null} for an influencing column (filters, joins)
     */
    record ColumnFlow(String sourceColumn, String targetColumn, ColumnRole role) {
        public ColumnFlow {
            Objects.requireNonNull(sourceColumn, "sourceColumn");
            Objects.requireNonNull(role, "role");
        }
    }

    /** How a source column reaches a target column. */
    enum ColumnRole { DIRECT, DERIVED, INFLUENCING }

    /**
     * One execution of a script, as a runtime connector reported it. The run id is made by the client,
     * so a record sent twice is stored once.
     *
     * @param scriptUri the script's {@code file:} URI
     * @param arguments the command-line arguments, as a JSON array text
     */
    record RunReported(String runId, String client, String scriptUri, String scriptHash, String gitCommit,
            Instant startedAt, Instant endedAt, Integer exitCode, String exception, String user, String host,
            String arguments, List<RunIo> io) implements Observation {
        public RunReported {
            Objects.requireNonNull(runId, "runId");
            Objects.requireNonNull(scriptUri, "scriptUri");
            Objects.requireNonNull(startedAt, "startedAt");
            arguments = arguments == null ? "[]" : arguments;
            io = io == null ? List.of() : List.copyOf(io);
        }
    }

    /**
     * One file a run read or wrote.
     *
     * @param direction {@code read}, {@code write}, {@code delete}, {@code rename_from} or {@code rename_to}
     * @param columns the data frame's columns when the connector saw one, else null
     */
    record RunIo(String uri, String direction, Long sizeBytes, String contentHash, String via, List<ColumnDef> columns,
            Long rowCount) {
        public RunIo {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(direction, "direction");
            columns = columns == null ? null : List.copyOf(columns);
        }
    }

    /**
     * What static analysis found in one version of a script: every read and write, resolved to a dataset
     * where it could be, kept with its expression and location where it could not.
     */
    record ScriptReferencesSeen(String scriptUri, String scriptHash, List<Reference> references, List<String> warnings)
            implements Observation {
        public ScriptReferencesSeen {
            Objects.requireNonNull(scriptUri, "scriptUri");
            references = List.copyOf(references);
            warnings = warnings == null ? List.of() : List.copyOf(warnings);
        }
    }

    /**
     * One read or write in a script's code.
     *
     * @param pattern the workspace-relative path or glob, a table name, or null when nothing is known
     * @param datasetUri the dataset it was matched to, or null when unresolved
     */
    record Reference(String direction, String pattern, boolean resolved, String datasetUri, String function,
            String expression, int line, int column, Integer cell, double confidence) {
        public Reference {
            Objects.requireNonNull(direction, "direction");
            Objects.requireNonNull(function, "function");
            expression = expression == null ? "" : expression;
        }
    }

    /** What people wrote about a dataset: its description and tags, replacing the previous ones. */
    record NoteSet(String uri, String description, Set<String> tags, String author) implements Observation {
        public NoteSet {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(author, "author");
            tags = tags == null ? Set.of() : Set.copyOf(tags);
        }
    }

    /**
     * Someone owns a dataset, for a stated reason (a rule, a git history, a person's word).
     *
     * @param origin {@code file} (the owners file), {@code manual} (a person) or {@code declared}
     * @param inherited whether the owner was given to a folder above the dataset rather than to it
     */
    record OwnerAssigned(String uri, String owner, String ownerKind, String reason, String origin, boolean inherited)
            implements Observation {
        public static final String FILE = "file";
        public static final String MANUAL = "manual";
        public static final String DECLARED = "declared";

        public OwnerAssigned {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(owner, "owner");
            Objects.requireNonNull(ownerKind, "ownerKind");
            Objects.requireNonNull(reason, "reason");
            Objects.requireNonNull(origin, "origin");
        }

        /** An ownership declared by some source, given to the dataset itself. */
        public OwnerAssigned(String uri, String owner, String ownerKind, String reason) {
            this(uri, owner, ownerKind, reason, DECLARED, false);
        }
    }

    /** An owner no longer owns a dataset. */
    record OwnerRemoved(String uri, String owner) implements Observation {
        public OwnerRemoved {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(owner, "owner");
        }
    }

    /**
     * A dataset is held to a freshness policy.
     *
     * @param policy the policy's canonical text, as {@code org.headwater.checks.Policy} writes it
     * @param setBy who said so: the policy file and its line, or {@code api:} and a person's name
     */
    record FreshnessPolicySet(String uri, String policy, String setBy) implements Observation {
        public FreshnessPolicySet {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(policy, "policy");
            Objects.requireNonNull(setBy, "setBy");
        }
    }

    /** A dataset is no longer held to a freshness policy (the file's rule went, or a person removed it). */
    record FreshnessPolicyRemoved(String uri, String setBy) implements Observation {
        public FreshnessPolicyRemoved {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(setBy, "setBy");
        }
    }

    /**
     * A freshness check found a dataset in this state. Seeing the same state (and the same newer input)
     * again changes nothing, so the first sighting's {@code since} is kept.
     *
     * @param state {@code fresh}, {@code due}, {@code late}, {@code stale} or {@code unknown}
     * @param policy the canonical text of the policy judged against, or null
     * @param newerInputUri for {@code stale}, the input that is newer than the dataset, else null
     */
    record FreshnessChecked(String uri, String state, Instant since, String why, String policy, String newerInputUri)
            implements Observation {
        public FreshnessChecked {
            Objects.requireNonNull(uri, "uri");
            Objects.requireNonNull(state, "state");
            Objects.requireNonNull(since, "since");
            Objects.requireNonNull(why, "why");
        }
    }
}
