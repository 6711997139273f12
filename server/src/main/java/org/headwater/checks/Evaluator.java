package org.headwater.checks;

import java.time.Duration;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.Comparator;
import java.util.List;
import java.util.Optional;

/**
 * Decides one dataset's state from its modification time, its policy and its direct inputs; a pure
 * function of what it is given, so it can be tested without a catalog.
 *
 * <p>The rules, in order: a policy that says late wins; otherwise an input modified after the dataset
 * makes it stale; otherwise the policy's state (fresh or due); with no policy, a dataset with inputs that
 * are all older is fresh, and one with no inputs is unknown. No modification time: unknown.
 */
final class Evaluator {

    /** The dataset being judged; {@code policy} may be null. */
    record Subject(long datasetId, String name, Instant modifiedAt, Policy policy) {
    }

    /** A direct input (upstream over one lineage edge). */
    record Input(long datasetId, String name, Instant modifiedAt) {
    }

    /** The judgement; {@code since} is when the state began as far as the facts tell. */
    record Verdict(FreshnessState state, Instant since, String why, Input newerInput) {
    }

    private Evaluator() {
    }

    static Verdict evaluate(Subject subject, List<Input> inputs, Instant now) {
        Instant modified = subject.modifiedAt();
        if (modified == null) {
            return new Verdict(FreshnessState.UNKNOWN, now, "No modification time is known for it, so its freshness"
                    + " cannot be judged.", null);
        }
        List<Input> timed = inputs.stream()
                .filter(i -> i.datasetId() != subject.datasetId() && i.modifiedAt() != null)
                .toList();
        // The newest input that is newer names the largest gap, which is the one worth acting on.
        Optional<Input> newer = timed.stream()
                .filter(i -> i.modifiedAt().isAfter(modified))
                .max(Comparator.comparing(Input::modifiedAt).thenComparing(Input::datasetId, Comparator.reverseOrder()));
        Verdict byPolicy = subject.policy() == null ? null : byPolicy(subject.policy(), modified, now);
        if (byPolicy != null && byPolicy.state() == FreshnessState.LATE) {
            return newer.map(i -> new Verdict(byPolicy.state(), byPolicy.since(), byPolicy.why() + " "
                    + staleWords("Its input also", i, modified), i)).orElse(byPolicy);
        }
        if (newer.isPresent()) {
            return new Verdict(FreshnessState.STALE, newer.get().modifiedAt(), staleWords("Its input", newer.get(), modified),
                    newer.get());
        }
        if (byPolicy != null) {
            return byPolicy;
        }
        if (!timed.isEmpty()) {
            Input newest = timed.stream().max(Comparator.comparing(Input::modifiedAt)).orElseThrow();
            String compared = timed.size() == 1 ? "its only input (" + newest.name()
                    : "all of its " + timed.size() + " inputs (the newest, " + newest.name();
            return new Verdict(FreshnessState.FRESH, modified, "Modified at " + time(modified) + ", after " + compared
                    + ", at " + time(newest.modifiedAt()) + ").", null);
        }
        return new Verdict(FreshnessState.UNKNOWN, now, "It has no freshness policy and no known inputs to compare"
                + " it with.", null);
    }

    private static Verdict byPolicy(Policy policy, Instant modified, Instant now) {
        if (policy instanceof Policy.MaxAge maxAge) {
            Instant deadline = modified.plus(maxAge.maxAge());
            String limit = Durations.text(maxAge.maxAge());
            if (now.isAfter(deadline)) {
                return new Verdict(FreshnessState.LATE, deadline, "Last modified at " + time(modified) + "; its maximum"
                        + " age of " + limit + " ran out at " + time(deadline) + ".", null);
            }
            return new Verdict(FreshnessState.FRESH, modified, "Modified at " + time(modified) + ", within its maximum"
                    + " age of " + limit + " (until " + time(deadline) + ").", null);
        }
        Policy.Schedule schedule = (Policy.Schedule) policy;
        Optional<Instant> expected = schedule.previous(now);
        if (expected.isEmpty() || !modified.isBefore(expected.get())) {
            String next = schedule.next(now).map(t -> "; the next update is expected at " + time(t)).orElse("");
            String last = expected.map(t -> ", not before its last expected update at " + time(t)).orElse("");
            return new Verdict(FreshnessState.FRESH, modified, "Modified at " + time(modified) + last + next + ".", null);
        }
        Instant lateAt = expected.get().plus(schedule.grace());
        String missed = "An update was expected at " + time(expected.get()) + " (schedule " + schedule.cron()
                + "); last modified at " + time(modified);
        if (now.isBefore(lateAt)) {
            return new Verdict(FreshnessState.DUE, expected.get(), missed + "; it becomes late at " + time(lateAt)
                    + ", after a grace of " + Durations.text(schedule.grace()) + ".", null);
        }
        return new Verdict(FreshnessState.LATE, lateAt, missed + "; the grace of " + Durations.text(schedule.grace())
                + " ran out at " + time(lateAt) + ".", null);
    }

    private static String staleWords(String lead, Input input, Instant modified) {
        Duration gap = Duration.between(modified, input.modifiedAt());
        return lead + " " + input.name() + " was modified at " + time(input.modifiedAt()) + ", "
                + Durations.words(gap) + " after this dataset (" + time(modified) + ").";
    }

    /** Times in sentences to the second: file systems give nanoseconds nobody wants to read. */
    static String time(Instant instant) {
        return instant.truncatedTo(ChronoUnit.SECONDS).toString();
    }
}
