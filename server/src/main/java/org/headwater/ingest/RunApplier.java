package org.headwater.ingest;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_PARTITION;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.RUN;
import static org.headwater.store.schema.Tables.RUN_IO;

import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.ingest.Observation.RunIo;
import org.headwater.ingest.Observation.RunReported;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;

/**
 * Applies run records: the run, what it read and wrote (each path mapped to the dataset the catalog
 * knows it as), and a runtime lineage edge from every input to every output of the run.
 */
final class RunApplier {
    private static final Set<String> FIGURE_ENDINGS = Set.of("png", "jpg", "jpeg", "gif", "svg", "pdf");

    private final EdgeApplier edges;

    RunApplier(EdgeApplier edges) {
        this.edges = edges;
    }

    void apply(Tx tx, RunReported run) {
        if (tx.db.fetchExists(RUN, RUN.ID.eq(run.runId()))) {
            return;
        }
        Long scriptId = ScriptApplier.find(tx, run.scriptUri());
        tx.db.insertInto(RUN)
                .set(RUN.ID, run.runId())
                .set(RUN.SCRIPT_ID, scriptId)
                .set(RUN.SCRIPT_URI, run.scriptUri())
                .set(RUN.SCRIPT_HASH, run.scriptHash())
                .set(RUN.GIT_COMMIT, run.gitCommit())
                .set(RUN.STARTED_AT, DatasetApplier.toStoredTime(run.startedAt()))
                .set(RUN.ENDED_AT, DatasetApplier.toStoredTime(run.endedAt()))
                .set(RUN.EXIT_CODE, run.exitCode())
                .set(RUN.EXCEPTION, run.exception() == null ? null : Tx.truncate(run.exception(), 400))
                .set(RUN.USER_NAME, run.user())
                .set(RUN.HOST, run.host())
                .set(RUN.ARGUMENTS, run.arguments())
                .set(RUN.CLIENT, run.client())
                .set(RUN.RECEIVED_AT, tx.now)
                .execute();
        Set<String> inputs = new LinkedHashSet<>();
        Set<String> outputs = new LinkedHashSet<>();
        for (RunIo io : run.io()) {
            String uri = datasetFor(tx, io);
            long datasetId = DatasetApplier.find(tx, uri);
            tx.db.insertInto(RUN_IO)
                    .set(RUN_IO.RUN_ID, run.runId())
                    .set(RUN_IO.DATASET_ID, datasetId)
                    .set(RUN_IO.DIRECTION, io.direction())
                    .set(RUN_IO.SIZE_BYTES, io.sizeBytes())
                    .set(RUN_IO.CONTENT_HASH, io.contentHash())
                    .set(RUN_IO.VIA, io.via() == null ? null : Tx.truncate(io.via(), 200))
                    .set(RUN_IO.COLUMNS_JSON, Json.columns(io.columns()))
                    .set(RUN_IO.ROW_COUNT, io.rowCount())
                    .execute();
            if (io.direction().equals("read")) {
                inputs.add(uri);
            } else if (io.direction().equals("write") || io.direction().equals("rename_to")) {
                outputs.add(uri);
            }
        }
        // A run's record is complete evidence of its own flows; its id is the first run that showed each.
        for (String in : inputs) {
            for (String out : outputs) {
                edges.apply(tx, new EdgeSeen(in, out, run.scriptUri(), run.scriptHash(), run.runId(), Evidence.RUNTIME,
                        1.0, List.of()));
            }
        }
        tx.changed("run", scriptId == null ? 0 : scriptId, "run", run.runId());
    }

    /**
     * The dataset a reported path stands for: the same URI; the partitioned set it is a member of; a
     * present dataset with the same content (the folder is mounted elsewhere); or, failing all, a new
     * dataset known by that path.
     */
    private static String datasetFor(Tx tx, RunIo io) {
        if (DatasetApplier.find(tx, io.uri()) != null) {
            return io.uri();
        }
        String set = tx.db.select(DATASET.URI).from(DATASET_PARTITION).join(DATASET).on(DATASET.ID.eq(DATASET_PARTITION.DATASET_ID))
                .where(DATASET_PARTITION.URI.eq(io.uri()), DATASET_PARTITION.VALID_TO.isNull())
                .limit(1).fetchOne(DATASET.URI);
        if (set != null) {
            return set;
        }
        if (io.contentHash() != null) {
            List<String> same = tx.db.select(DATASET.URI).from(DATASET_STATE).join(DATASET).on(DATASET.ID.eq(DATASET_STATE.DATASET_ID))
                    .where(DATASET_STATE.CONTENT_HASH.eq(io.contentHash()), DATASET_STATE.VALID_TO.isNull())
                    .limit(2).fetch(DATASET.URI);
            if (same.size() == 1) {
                return same.get(0);
            }
        }
        String name = io.uri().replaceFirst("^file://", "");
        DatasetApplier.identity(tx, io.uri(), name, kindOf(io.uri()), null);
        return io.uri();
    }

    private static DatasetKind kindOf(String uri) {
        String ending = uri.substring(uri.lastIndexOf('.') + 1).toLowerCase(Locale.ROOT);
        return FIGURE_ENDINGS.contains(ending) ? DatasetKind.FIGURE : DatasetKind.FILE;
    }

}
