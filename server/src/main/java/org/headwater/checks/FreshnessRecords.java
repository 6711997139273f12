package org.headwater.checks;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.DATASET_STATE;
import static org.headwater.store.schema.Tables.FRESHNESS_CHECK;
import static org.headwater.store.schema.Tables.FRESHNESS_POLICY;

import java.time.Instant;
import java.time.OffsetDateTime;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.headwater.store.Store;
import org.jooq.Condition;
import org.jooq.impl.DSL;

/** The read side of freshness: present datasets with their times, current policies and checks, history. */
final class FreshnessRecords {
    private final Store store;

    FreshnessRecords(Store store) {
        this.store = store;
    }

    /**
     * The checks in force at {@code asOf} as they were recorded then (by {@code check} or the schedule), with
     * the newer input's name as it is now; nothing is evaluated again.
     */
    List<Check> recordedAt(Instant asOf) {
        var input = DATASET.as("input");
        return store.dsl().select(FRESHNESS_CHECK.DATASET_ID, DATASET.NAME, FRESHNESS_CHECK.STATE, FRESHNESS_CHECK.SINCE,
                        FRESHNESS_CHECK.WHY, FRESHNESS_CHECK.POLICY, FRESHNESS_CHECK.NEWER_INPUT_ID, input.NAME)
                .from(FRESHNESS_CHECK).join(DATASET).on(DATASET.ID.eq(FRESHNESS_CHECK.DATASET_ID))
                .leftJoin(input).on(input.ID.eq(FRESHNESS_CHECK.NEWER_INPUT_ID))
                .where(org.headwater.store.Validity.at(FRESHNESS_CHECK.VALID_FROM, FRESHNESS_CHECK.VALID_TO, asOf))
                .orderBy(DATASET.NAME)
                .fetch(r -> new Check(r.value1(), r.value2(), r.value3(), instant(r.value4()), r.value5(), r.value6(), null,
                        null, r.value7() == null ? null : new Check.NewerInput(r.value7(), r.value8(), null)));
    }

    /** A present dataset: identity, name, source and current modification time (may be null). */
    record Present(long id, String uri, String name, Long sourceId, Instant modifiedAt) {
    }

    /** A current policy and who set it. */
    record CurrentPolicy(String policy, String setBy) {
    }

    /** The current recorded check of a dataset. */
    record CurrentCheck(String state, Instant since, String policy, Long newerInputId) {
    }

    /** Present datasets (with a current state row), by name; {@code sourceId} null means every source. */
    List<Present> present(Long sourceId) {
        Condition where = DATASET_STATE.VALID_TO.isNull();
        if (sourceId != null) {
            where = where.and(DATASET.SOURCE_ID.eq(sourceId));
        }
        return store.dsl().select(DATASET.ID, DATASET.URI, DATASET.NAME, DATASET.SOURCE_ID, DATASET_STATE.MODIFIED_AT)
                .from(DATASET).join(DATASET_STATE).on(DATASET_STATE.DATASET_ID.eq(DATASET.ID))
                .where(where)
                .orderBy(DATASET.NAME, DATASET.ID)
                .fetch(r -> new Present(r.value1(), r.value2(), r.value3(), r.value4(), instant(r.value5())));
    }

    Map<Long, CurrentPolicy> currentPolicies() {
        Map<Long, CurrentPolicy> policies = new HashMap<>();
        store.dsl().select(FRESHNESS_POLICY.DATASET_ID, FRESHNESS_POLICY.POLICY, FRESHNESS_POLICY.SET_BY)
                .from(FRESHNESS_POLICY).where(FRESHNESS_POLICY.VALID_TO.isNull())
                .forEach(r -> policies.put(r.value1(), new CurrentPolicy(r.value2(), r.value3())));
        return policies;
    }

    Map<Long, CurrentCheck> currentChecks() {
        Map<Long, CurrentCheck> checks = new HashMap<>();
        store.dsl().select(FRESHNESS_CHECK.DATASET_ID, FRESHNESS_CHECK.STATE, FRESHNESS_CHECK.SINCE,
                        FRESHNESS_CHECK.POLICY, FRESHNESS_CHECK.NEWER_INPUT_ID)
                .from(FRESHNESS_CHECK).where(FRESHNESS_CHECK.VALID_TO.isNull())
                .forEach(r -> checks.put(r.value1(), new CurrentCheck(r.value2(), instant(r.value3()), r.value4(), r.value5())));
        return checks;
    }

    /** Every recorded check of a dataset, newest first. */
    List<History.Entry> checkHistory(long datasetId) {
        var input = DATASET.as("input");
        var inputState = DATASET_STATE.as("input_state");
        return store.dsl().select(FRESHNESS_CHECK.STATE, FRESHNESS_CHECK.SINCE, FRESHNESS_CHECK.WHY, FRESHNESS_CHECK.POLICY,
                        FRESHNESS_CHECK.NEWER_INPUT_ID, input.NAME, inputState.MODIFIED_AT, FRESHNESS_CHECK.VALID_FROM,
                        FRESHNESS_CHECK.VALID_TO)
                .from(FRESHNESS_CHECK)
                .leftJoin(input).on(input.ID.eq(FRESHNESS_CHECK.NEWER_INPUT_ID))
                // The input's modification time as it was when the state was recorded.
                .leftJoin(inputState).on(inputState.DATASET_ID.eq(FRESHNESS_CHECK.NEWER_INPUT_ID)
                        .and(inputState.VALID_FROM.le(FRESHNESS_CHECK.VALID_FROM))
                        .and(inputState.VALID_TO.isNull().or(inputState.VALID_TO.gt(FRESHNESS_CHECK.VALID_FROM))))
                .where(FRESHNESS_CHECK.DATASET_ID.eq(datasetId))
                .orderBy(FRESHNESS_CHECK.VALID_FROM.desc(), FRESHNESS_CHECK.ID.desc())
                .fetch(r -> new History.Entry(r.value1(), instant(r.value2()), r.value3(), r.value4(),
                        r.value5() == null ? null : new Check.NewerInput(r.value5(), r.value6(), instant(r.value7())),
                        instant(r.value8()), instant(r.value9())));
    }

    List<History.PolicyEntry> policyHistory(long datasetId) {
        return store.dsl().select(FRESHNESS_POLICY.POLICY, FRESHNESS_POLICY.SET_BY, FRESHNESS_POLICY.VALID_FROM,
                        FRESHNESS_POLICY.VALID_TO)
                .from(FRESHNESS_POLICY).where(FRESHNESS_POLICY.DATASET_ID.eq(datasetId))
                .orderBy(FRESHNESS_POLICY.VALID_FROM.desc(), FRESHNESS_POLICY.ID.desc())
                .fetch(r -> new History.PolicyEntry(r.value1(), r.value2(), instant(r.value3()), instant(r.value4())));
    }

    /** The name of a dataset, present or not; null when no such dataset was ever known. */
    String name(long datasetId) {
        return store.dsl().select(DATASET.NAME).from(DATASET).where(DATASET.ID.eq(datasetId)).fetchOne(DSL.field(DATASET.NAME));
    }

    private static Instant instant(OffsetDateTime time) {
        return time == null ? null : time.toInstant();
    }
}
