package org.headwater.ingest;

import static org.headwater.store.schema.Tables.FRESHNESS_CHECK;
import static org.headwater.store.schema.Tables.FRESHNESS_POLICY;

import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.Objects;
import org.headwater.ingest.Observation.FreshnessChecked;
import org.headwater.ingest.Observation.FreshnessPolicyRemoved;
import org.headwater.ingest.Observation.FreshnessPolicySet;
import org.headwater.store.schema.tables.records.FreshnessCheckRecord;
import org.headwater.store.schema.tables.records.FreshnessPolicyRecord;

/** Applies freshness policies and checked states, keeping every earlier one as history. */
final class FreshnessApplier {

    void apply(Tx tx, FreshnessPolicySet set) {
        long id = dataset(tx, set.uri());
        FreshnessPolicyRecord current = currentPolicy(tx, id);
        if (current != null && current.getPolicy().equals(set.policy()) && current.getSetBy().equals(set.setBy())) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        tx.db.insertInto(FRESHNESS_POLICY)
                .set(FRESHNESS_POLICY.DATASET_ID, id)
                .set(FRESHNESS_POLICY.POLICY, set.policy())
                .set(FRESHNESS_POLICY.SET_BY, Tx.truncate(set.setBy(), 400))
                .set(FRESHNESS_POLICY.VALID_FROM, tx.now)
                .execute();
        tx.changed(Change.FRESHNESS, id, "policy", set.policy() + " (" + set.setBy() + ")");
    }

    void apply(Tx tx, FreshnessPolicyRemoved removed) {
        long id = dataset(tx, removed.uri());
        FreshnessPolicyRecord current = currentPolicy(tx, id);
        if (current == null) {
            return;
        }
        current.setValidTo(tx.now);
        current.update();
        tx.changed(Change.FRESHNESS, id, "no_policy", "policy removed (" + removed.setBy() + ")");
    }

    void apply(Tx tx, FreshnessChecked checked) {
        long id = dataset(tx, checked.uri());
        Long newerInput = checked.newerInputUri() == null ? null : dataset(tx, checked.newerInputUri());
        FreshnessCheckRecord current = tx.db.selectFrom(FRESHNESS_CHECK)
                .where(FRESHNESS_CHECK.DATASET_ID.eq(id), FRESHNESS_CHECK.VALID_TO.isNull())
                .fetchOne();
        // The same state for the same reason is no change: the row keeps the moment the state began.
        if (current != null && current.getState().equals(checked.state())
                && Objects.equals(current.getNewerInputId(), newerInput)
                && Objects.equals(current.getPolicy(), checked.policy())) {
            return;
        }
        if (current != null) {
            current.setValidTo(tx.now);
            current.update();
        }
        tx.db.insertInto(FRESHNESS_CHECK)
                .set(FRESHNESS_CHECK.DATASET_ID, id)
                .set(FRESHNESS_CHECK.STATE, checked.state())
                .set(FRESHNESS_CHECK.SINCE, OffsetDateTime.ofInstant(checked.since(), ZoneOffset.UTC))
                .set(FRESHNESS_CHECK.WHY, Tx.truncate(checked.why(), 4000))
                .set(FRESHNESS_CHECK.POLICY, checked.policy())
                .set(FRESHNESS_CHECK.NEWER_INPUT_ID, newerInput)
                .set(FRESHNESS_CHECK.VALID_FROM, tx.now)
                .execute();
        tx.changed(Change.FRESHNESS, id, "check", checked.state());
    }

    private static FreshnessPolicyRecord currentPolicy(Tx tx, long datasetId) {
        return tx.db.selectFrom(FRESHNESS_POLICY)
                .where(FRESHNESS_POLICY.DATASET_ID.eq(datasetId), FRESHNESS_POLICY.VALID_TO.isNull())
                .fetchOne();
    }

    private static long dataset(Tx tx, String uri) {
        Long id = DatasetApplier.find(tx, uri);
        if (id == null) {
            throw new UnknownDatasetException(uri);
        }
        return id;
    }
}
