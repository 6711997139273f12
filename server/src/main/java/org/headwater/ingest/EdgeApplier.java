package org.headwater.ingest;

import static org.headwater.store.schema.Tables.COLUMN_LINEAGE;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;

import java.util.Comparator;
import java.util.List;
import org.headwater.ingest.Observation.ColumnFlow;
import org.headwater.ingest.Observation.EdgeGone;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.store.schema.tables.records.LineageEdgeRecord;
import org.jooq.Condition;

/** Applies lineage edges between datasets, with their column-level flows, keeping superseded versions. */
final class EdgeApplier {

    void apply(Tx tx, EdgeSeen seen) {
        long source = datasetFor(tx, seen.sourceUri());
        long target = datasetFor(tx, seen.targetUri());
        Long script = ScriptApplier.find(tx, seen.scriptUri());
        String fingerprint = fingerprint(seen);
        LineageEdgeRecord current = tx.db.selectFrom(LINEAGE_EDGE)
                .where(key(source, target, script, seen.evidence()), LINEAGE_EDGE.VALID_TO.isNull())
                .fetchOne();
        if (current != null && current.getFingerprint().equals(fingerprint)) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        long edgeId = tx.db.insertInto(LINEAGE_EDGE)
                .set(LINEAGE_EDGE.SOURCE_DATASET_ID, source)
                .set(LINEAGE_EDGE.TARGET_DATASET_ID, target)
                .set(LINEAGE_EDGE.SCRIPT_ID, script)
                .set(LINEAGE_EDGE.SCRIPT_HASH, seen.scriptHash())
                .set(LINEAGE_EDGE.RUN_ID, seen.runId())
                .set(LINEAGE_EDGE.EVIDENCE, seen.evidence().word())
                .set(LINEAGE_EDGE.CONFIDENCE, seen.confidence())
                .set(LINEAGE_EDGE.FINGERPRINT, fingerprint)
                .set(LINEAGE_EDGE.VALID_FROM, tx.now)
                .returningResult(LINEAGE_EDGE.ID)
                .fetchOne(LINEAGE_EDGE.ID);
        if (!seen.columns().isEmpty()) {
            var insert = tx.db.insertInto(COLUMN_LINEAGE, COLUMN_LINEAGE.EDGE_ID, COLUMN_LINEAGE.SOURCE_COLUMN,
                    COLUMN_LINEAGE.TARGET_COLUMN, COLUMN_LINEAGE.ROLE);
            for (ColumnFlow flow : seen.columns()) {
                insert = insert.values(edgeId, flow.sourceColumn(), flow.targetColumn(), flow.role().name().toLowerCase());
            }
            insert.execute();
        }
        tx.changed(Change.EDGE, edgeId, current == null ? "created" : "updated", seen.sourceUri() + " -> " + seen.targetUri());
    }

    void apply(Tx tx, EdgeGone gone) {
        Long source = DatasetApplier.find(tx, gone.sourceUri());
        Long target = DatasetApplier.find(tx, gone.targetUri());
        if (source == null || target == null) {
            return;
        }
        Long script = ScriptApplier.find(tx, gone.scriptUri());
        LineageEdgeRecord current = tx.db.selectFrom(LINEAGE_EDGE)
                .where(key(source, target, script, gone.evidence()), LINEAGE_EDGE.VALID_TO.isNull())
                .fetchOne();
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
            tx.changed(Change.EDGE, current.getId(), "removed", gone.sourceUri() + " -> " + gone.targetUri());
        }
    }

    private static Condition key(long source, long target, Long script, Evidence evidence) {
        return LINEAGE_EDGE.SOURCE_DATASET_ID.eq(source)
                .and(LINEAGE_EDGE.TARGET_DATASET_ID.eq(target))
                .and(script == null ? LINEAGE_EDGE.SCRIPT_ID.isNull() : LINEAGE_EDGE.SCRIPT_ID.eq(script))
                .and(LINEAGE_EDGE.EVIDENCE.eq(evidence.word()));
    }

    /** An edge may name a dataset that no harvest has seen yet; it gets an identity and no state. */
    private static long datasetFor(Tx tx, String uri) {
        Long id = DatasetApplier.find(tx, uri);
        return id != null ? id : DatasetApplier.identity(tx, uri, DatasetNames.fallbackName(uri), DatasetKind.OTHER, null);
    }

    /**
     * What makes two observations of the same edge the same version. The run id is left out on purpose:
     * every run of an unchanged script confirms the same edge, and a new version per run would bury the
     * real changes in history. The row keeps the run that first showed this version; all runs are in run_io.
     */
    private static String fingerprint(EdgeSeen seen) {
        StringBuilder text = new StringBuilder()
                .append(seen.confidence()).append('|').append(seen.scriptHash());
        List<ColumnFlow> flows = seen.columns().stream()
                .sorted(Comparator.comparing(ColumnFlow::sourceColumn)
                        .thenComparing(f -> String.valueOf(f.targetColumn()))
                        .thenComparing(ColumnFlow::role))
                .toList();
        for (ColumnFlow f : flows) {
            text.append('|').append(f.sourceColumn()).append('>').append(f.targetColumn()).append(':').append(f.role());
        }
        return SchemaFingerprint.sha256(text.toString());
    }
}
