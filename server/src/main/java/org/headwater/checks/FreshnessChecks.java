package org.headwater.checks;

import java.time.Clock;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import org.headwater.ingest.Ingestor;
import org.headwater.ingest.Observation;
import org.headwater.lineage.DatasetReach;
import org.headwater.lineage.LineageGraph;
import org.headwater.lineage.Query;
import org.headwater.store.Store;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Evaluates every present dataset's freshness. {@link #evaluate()} only reads; {@link #record()} also writes
 * the states that changed through the ingestion path, which is what keeps {@code since} across restarts
 * and makes the check history.
 */
public final class FreshnessChecks {
    private static final Logger LOG = LoggerFactory.getLogger(FreshnessChecks.class);
    // Make-style: a dataset is compared with what it is made from directly; an input's own staleness
    // is that input's check.
    private static final Query DIRECT_INPUTS = Query.everything().withMaxDepth(1);

    private final FreshnessRecords records;
    private final LineageGraph lineage;
    private final Ingestor ingestor;
    private final Clock clock;

    public FreshnessChecks(Store store, LineageGraph lineage, Ingestor ingestor, Clock clock) {
        this.records = new FreshnessRecords(store);
        this.lineage = lineage;
        this.ingestor = ingestor;
        this.clock = clock;
    }

    /** What a recorded check run found, and which datasets changed state in it. */
    public record Recorded(Report report, List<Transition> transitions) {
    }

    /** Every present dataset's freshness now, without recording anything. */
    public Report evaluate() {
        Instant now = clock.instant();
        return Report.of(now, judge(now, null).stream().map(Judged::check).toList());
    }

    /** The freshness the checks had recorded by {@code asOf}: history, not a new evaluation. */
    public Report recordedAsOf(Instant asOf) {
        return Report.of(asOf, records.recordedAt(asOf));
    }

    /** One present dataset's freshness now, without recording anything; empty when it is not present. */
    public Optional<Check> evaluate(long datasetId) {
        return judge(clock.instant(), datasetId).stream().map(Judged::check).findFirst();
    }

    /** Evaluates every present dataset and records the states that changed, in one batch. */
    public Recorded record() {
        Instant now = clock.instant();
        List<Judged> judged = judge(now, null);
        List<Observation> changed = new ArrayList<>();
        List<Transition> transitions = new ArrayList<>();
        for (Judged j : judged) {
            if (j.changed()) {
                Check c = j.check();
                changed.add(new Observation.FreshnessChecked(j.uri(), c.state(), c.since(), c.why(), c.policy(),
                        j.newerInputUri()));
                transitions.add(new Transition(j.previousState(), c));
            }
        }
        ingestor.apply("check", changed);
        return new Recorded(Report.of(now, judged.stream().map(Judged::check).toList()), transitions);
    }

    /** The recorded states and policies of a dataset; empty when no such dataset was ever known. */
    public Optional<History> history(long datasetId) {
        String name = records.name(datasetId);
        if (name == null) {
            return Optional.empty();
        }
        return Optional.of(new History(datasetId, name, records.checkHistory(datasetId), records.policyHistory(datasetId)));
    }

    private record Judged(String uri, Check check, String newerInputUri, String previousState, boolean changed) {
    }

    private List<Judged> judge(Instant now, Long onlyDataset) {
        List<FreshnessRecords.Present> present = records.present(null);
        Map<Long, FreshnessRecords.Present> byId = new HashMap<>();
        present.forEach(p -> byId.put(p.id(), p));
        Map<Long, FreshnessRecords.CurrentPolicy> policies = records.currentPolicies();
        Map<Long, FreshnessRecords.CurrentCheck> stored = records.currentChecks();
        Map<String, Policy> parsed = new HashMap<>();
        List<Judged> judged = new ArrayList<>();
        for (FreshnessRecords.Present p : present) {
            if (onlyDataset != null && p.id() != onlyDataset) {
                continue;
            }
            FreshnessRecords.CurrentPolicy policy = policies.get(p.id());
            Policy rule = policy == null ? null : parse(parsed, policy.policy());
            Evaluator.Verdict verdict = Evaluator.evaluate(
                    new Evaluator.Subject(p.id(), p.name(), p.modifiedAt(), rule), inputs(p.id(), byId), now);
            FreshnessRecords.CurrentCheck before = stored.get(p.id());
            Long newerId = verdict.newerInput() == null ? null : verdict.newerInput().datasetId();
            String policyText = rule == null ? null : rule.text();
            boolean same = before != null && before.state().equals(verdict.state().word())
                    && Objects.equals(before.newerInputId(), newerId) && Objects.equals(before.policy(), policyText);
            Check.NewerInput newer = verdict.newerInput() == null ? null : new Check.NewerInput(newerId,
                    verdict.newerInput().name(), verdict.newerInput().modifiedAt());
            Check check = new Check(p.id(), p.name(), verdict.state().word(), same ? before.since() : verdict.since(),
                    verdict.why(), policyText, policy == null ? null : policy.setBy(), p.modifiedAt(), newer);
            judged.add(new Judged(p.uri(), check, newerId == null ? null : byId.get(newerId).uri(),
                    before == null ? null : before.state(), !same));
        }
        return judged;
    }

    private List<Evaluator.Input> inputs(long datasetId, Map<Long, FreshnessRecords.Present> present) {
        DatasetReach reach = lineage.upstream(datasetId, DIRECT_INPUTS);
        List<Evaluator.Input> inputs = new ArrayList<>(reach.size());
        for (int i = 0; i < reach.size(); i++) {
            FreshnessRecords.Present input = present.get(reach.datasetId(i));
            // A gone input no longer says anything about its outputs.
            if (input != null) {
                inputs.add(new Evaluator.Input(input.id(), input.name(), input.modifiedAt()));
            }
        }
        return inputs;
    }

    private static Policy parse(Map<String, Policy> parsed, String text) {
        return parsed.computeIfAbsent(text, t -> {
            try {
                return Policy.parse(t);
            } catch (IllegalArgumentException e) {
                // Only valid policies are stored; a text an older build wrote differently is skipped, not fatal.
                LOG.warn("Stored freshness policy '{}' cannot be read: {}", t, e.getMessage());
                return null;
            }
        });
    }
}
