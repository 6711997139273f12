package org.headwater.ingest;

import static org.headwater.store.schema.Tables.SCRIPT_ANALYSIS;
import static org.headwater.store.schema.Tables.SCRIPT_REFERENCE;

import java.util.List;
import org.headwater.ingest.Observation.Reference;
import org.headwater.ingest.Observation.ScriptReferencesSeen;
import org.headwater.model.DatasetKind;
import org.headwater.store.schema.tables.records.ScriptAnalysisRecord;

/** Applies the references static analysis found in scripts, one analysis version at a time. */
final class ReferenceApplier {
    /** References per insert statement (11 bind values each). */
    private static final int CHUNK = 500;

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
        // A multi-row insert per chunk of references, where each was a statement; chunks keep the bind values
        // of one statement well under PostgreSQL's limit of 65,535.
        List<Reference> references = seen.references();
        for (int from = 0; from < references.size(); from += CHUNK) {
            var insert = tx.db.insertInto(SCRIPT_REFERENCE, SCRIPT_REFERENCE.ANALYSIS_ID, SCRIPT_REFERENCE.DIRECTION,
                    SCRIPT_REFERENCE.PATTERN, SCRIPT_REFERENCE.RESOLVED, SCRIPT_REFERENCE.DATASET_ID,
                    SCRIPT_REFERENCE.FUNCTION_NAME, SCRIPT_REFERENCE.EXPRESSION, SCRIPT_REFERENCE.LINE_NO,
                    SCRIPT_REFERENCE.COLUMN_NO, SCRIPT_REFERENCE.CELL, SCRIPT_REFERENCE.CONFIDENCE);
            for (Reference r : references.subList(from, Math.min(references.size(), from + CHUNK))) {
                insert = insert.values(analysis, r.direction(), r.pattern() == null ? null : Tx.truncate(r.pattern(), 2000),
                        r.resolved(), datasetOf(tx, r), Tx.truncate(r.function(), 200), Tx.truncate(r.expression(), 4000),
                        r.line(), r.column(), r.cell(), r.confidence());
            }
            insert.execute();
        }
        tx.changed(Change.SCRIPT, script, "analysis", seen.references().size() + " references");
    }

    /** The dataset a resolved reference names, given an identity when no harvest has seen it yet; or null. */
    private static Long datasetOf(Tx tx, Reference r) {
        if (r.datasetUri() == null) {
            return null;
        }
        Long dataset = DatasetApplier.find(tx, r.datasetUri());
        return dataset != null ? dataset
                : DatasetApplier.identity(tx, r.datasetUri(), DatasetNames.fallbackName(r.datasetUri()), DatasetKind.OTHER, null);
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
