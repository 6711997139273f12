package org.headwater.ingest;

import static org.headwater.store.schema.Tables.SCRIPT_ANALYSIS;
import static org.headwater.store.schema.Tables.SCRIPT_REFERENCE;

import org.headwater.ingest.Observation.Reference;
import org.headwater.ingest.Observation.ScriptReferencesSeen;
import org.headwater.model.DatasetKind;
import org.headwater.store.schema.tables.records.ScriptAnalysisRecord;

/** Applies the references static analysis found in scripts, one analysis version at a time. */
final class ReferenceApplier {

    void apply(Tx tx, ScriptReferencesSeen seen) {
        Long script = ScriptApplier.find(tx, seen.scriptUri());
        if (script == null) {
            throw new IllegalArgumentException("Script analysis for a script the catalog does not hold: " + seen.scriptUri());
        }
        String fingerprint = fingerprint(seen);
        ScriptAnalysisRecord current = tx.db.selectFrom(SCRIPT_ANALYSIS)
                .where(SCRIPT_ANALYSIS.SCRIPT_ID.eq(script), SCRIPT_ANALYSIS.VALID_TO.isNull()).fetchOne();
        if (current != null && current.getFingerprint().equals(fingerprint)) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        long analysis = tx.db.insertInto(SCRIPT_ANALYSIS)
                .set(SCRIPT_ANALYSIS.SCRIPT_ID, script)
                .set(SCRIPT_ANALYSIS.SCRIPT_HASH, seen.scriptHash())
                .set(SCRIPT_ANALYSIS.FINGERPRINT, fingerprint)
                .set(SCRIPT_ANALYSIS.WARNINGS, seen.warnings().isEmpty() ? null : Tx.truncate(Json.stringArray(seen.warnings()), 100000))
                .set(SCRIPT_ANALYSIS.VALID_FROM, tx.now)
                .returningResult(SCRIPT_ANALYSIS.ID).fetchOne(SCRIPT_ANALYSIS.ID);
        for (Reference r : seen.references()) {
            Long dataset = null;
            if (r.datasetUri() != null) {
                dataset = DatasetApplier.find(tx, r.datasetUri());
                if (dataset == null) {
                    dataset = DatasetApplier.identity(tx, r.datasetUri(), DatasetNames.fallbackName(r.datasetUri()),
                            DatasetKind.OTHER, null);
                }
            }
            tx.db.insertInto(SCRIPT_REFERENCE)
                    .set(SCRIPT_REFERENCE.ANALYSIS_ID, analysis)
                    .set(SCRIPT_REFERENCE.DIRECTION, r.direction())
                    .set(SCRIPT_REFERENCE.PATTERN, r.pattern() == null ? null : Tx.truncate(r.pattern(), 2000))
                    .set(SCRIPT_REFERENCE.RESOLVED, r.resolved())
                    .set(SCRIPT_REFERENCE.DATASET_ID, dataset)
                    .set(SCRIPT_REFERENCE.FUNCTION_NAME, Tx.truncate(r.function(), 200))
                    .set(SCRIPT_REFERENCE.EXPRESSION, Tx.truncate(r.expression(), 4000))
                    .set(SCRIPT_REFERENCE.LINE_NO, r.line())
                    .set(SCRIPT_REFERENCE.COLUMN_NO, r.column())
                    .set(SCRIPT_REFERENCE.CELL, r.cell())
                    .set(SCRIPT_REFERENCE.CONFIDENCE, r.confidence())
                    .execute();
        }
        tx.changed(Change.SCRIPT, script, "analysis", seen.references().size() + " references");
    }

    private static String fingerprint(ScriptReferencesSeen seen) {
        StringBuilder text = new StringBuilder(String.valueOf(seen.scriptHash()));
        for (Reference r : seen.references()) {
            text.append('\u001e').append(r);
        }
        seen.warnings().forEach(w -> text.append('\u001d').append(w));
        return SchemaFingerprint.sha256(text.toString());
    }
}
