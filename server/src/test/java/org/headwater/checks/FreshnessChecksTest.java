package org.headwater.checks;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneOffset;
import java.util.List;
import java.util.Map;
import java.util.function.Function;
import java.util.stream.Collectors;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.store.StoreConfig;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class FreshnessChecksTest {
    private static final Instant NOW = HiveWorkspace.NOW;

    @TempDir
    Path temp;

    Path workspace;
    Catalog catalog;

    @BeforeEach
    void harvest() throws IOException {
        workspace = HiveWorkspace.write(temp.resolve("hive-coop"));
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
    }

    @AfterEach
    void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    private FreshnessChecks checksAt(Instant now) {
        return new FreshnessChecks(catalog.store(), catalog.lineage(), catalog.ingestor(), Clock.fixed(now, ZoneOffset.UTC));
    }

    private static Map<String, Check> byName(Report report) {
        return report.checks().stream().collect(Collectors.toMap(Check::name, Function.identity()));
    }

    private static Instant time(String name) {
        return HiveWorkspace.TIMES.get(name);
    }

    @Test
    void eachDatasetIsInTheStateItsFileTimesAndPolicyGiveIt() {
        Map<String, Check> checks = byName(checksAt(NOW).evaluate());

        // expected: the state rules documented in README "Freshness"; times computed here with java.time from
        // the file times the fixture set, schedule times from crontab(5) field meanings.
        Check weights = checks.get("hives/weights.csv");
        assertThat(weights.state()).isEqualTo("fresh");
        assertThat(weights.since()).isEqualTo(time("hives/weights.csv"));
        assertThat(weights.policy()).isEqualTo("max-age 1d");
        assertThat(weights.policyFrom()).isEqualTo(".headwater-freshness line 2 (hives/weights.csv)");
        assertThat(weights.why()).isEqualTo("Modified at 2026-12-07T06:30:00Z, within its maximum age of 1d (until "
                + time("hives/weights.csv").plus(Duration.ofDays(1)) + ").");

        Check feed = checks.get("hives/feed_log.csv");
        assertThat(feed.state()).isEqualTo("late");
        assertThat(feed.since()).isEqualTo(time("hives/feed_log.csv").plus(Duration.ofHours(36)));
        assertThat(feed.why()).isEqualTo("Last modified at 2026-12-04T08:30:00Z; its maximum age of 36h ran out at"
                + " 2026-12-05T20:30:00Z.");

        // 0 7 * * 1: Mondays 07:00; NOW is Monday 08:30, the file is from the Monday before; grace 3h ends 10:00.
        Check weekly = checks.get("reports/weekly.csv");
        assertThat(weekly.state()).isEqualTo("due");
        assertThat(weekly.since()).isEqualTo(Instant.parse("2026-12-07T07:00:00Z"));
        assertThat(weekly.why()).isEqualTo("An update was expected at 2026-12-07T07:00:00Z (schedule 0 7 * * 1); last"
                + " modified at 2026-11-30T07:10:00Z; it becomes late at 2026-12-07T10:00:00Z, after a grace of 3h.");

        // 0 6 1 * *: the 1st at 06:00; the last one passed was 2026-12-01, plus the default grace of 1h.
        Check monthly = checks.get("reports/monthly.csv");
        assertThat(monthly.state()).isEqualTo("late");
        assertThat(monthly.since()).isEqualTo(Instant.parse("2026-12-01T07:00:00Z"));

        Check daily = checks.get("reports/daily_counts.csv");
        assertThat(daily.state()).isEqualTo("fresh");
        assertThat(daily.since()).isEqualTo(time("reports/daily_counts.csv"));
        assertThat(daily.why()).isEqualTo("Modified at 2026-12-07T05:45:00Z, not before its last expected update at"
                + " 2026-12-07T05:30:00Z; the next update is expected at 2026-12-08T05:30:00Z.");

        Check summary = checks.get("hives/daily_summary.csv");
        assertThat(summary.state()).isEqualTo("stale");
        assertThat(summary.since()).isEqualTo(time("hives/weights.csv"));
        assertThat(summary.policy()).isNull();
        assertThat(summary.newerInput().datasetId()).isEqualTo(weights.datasetId());
        assertThat(summary.newerInput().name()).isEqualTo("hives/weights.csv");
        assertThat(summary.newerInput().modifiedAt()).isEqualTo(time("hives/weights.csv"));
        assertThat(Duration.between(time("hives/daily_summary.csv"), time("hives/weights.csv"))).isEqualTo(Duration.ofHours(22));
        assertThat(summary.why()).isEqualTo("Its input hives/weights.csv was modified at 2026-12-07T06:30:00Z, 22 hours"
                + " after this dataset (2026-12-06T08:30:00Z).");

        Check tally = checks.get("reports/apiary_tally.csv");
        assertThat(tally.state()).isEqualTo("fresh");
        assertThat(tally.since()).isEqualTo(time("reports/apiary_tally.csv"));
        assertThat(tally.why()).isEqualTo("Modified at 2026-11-15T00:00:00Z, after its only input (reference/apiaries.csv,"
                + " at 2026-10-01T00:00:00Z).");

        Check apiaries = checks.get("reference/apiaries.csv");
        assertThat(apiaries.state()).isEqualTo("unknown");
        assertThat(apiaries.since()).isEqualTo(NOW);
        assertThat(apiaries.why()).isEqualTo("It has no freshness policy and no known inputs to compare it with.");
        assertThat(apiaries.newerInput()).isNull();

        assertThat(checks).hasSize(8);
    }

    @Test
    void countsListEveryStateInOrderAndLateOrStaleFailTheRun() {
        Report report = checksAt(NOW).evaluate();

        assertThat(report.counts()).containsExactly(Map.entry("fresh", 3), Map.entry("due", 1), Map.entry("late", 2),
                Map.entry("stale", 1), Map.entry("unknown", 1));
        assertThat(report.failed()).isTrue();
    }

    @Test
    void thePassingOfTimeMovesAScheduledReportFromDueToLateAtTheEndOfItsGrace() {
        // expected: README "Freshness" — due until expected time + grace, late from then on.
        assertThat(byName(checksAt(Instant.parse("2026-12-07T09:59:59Z")).evaluate()).get("reports/weekly.csv").state())
                .isEqualTo("due");
        Check late = byName(checksAt(Instant.parse("2026-12-07T10:00:00Z")).evaluate()).get("reports/weekly.csv");
        assertThat(late.state()).isEqualTo("late");
        assertThat(late.since()).isEqualTo(Instant.parse("2026-12-07T10:00:00Z"));
        // Before Monday's 07:00 the last expected update was the previous Monday's, which the file followed.
        assertThat(byName(checksAt(Instant.parse("2026-12-07T06:59:00Z")).evaluate()).get("reports/weekly.csv").state())
                .isEqualTo("fresh");
    }

    @Test
    void staleAgreesWithGnuMakesQuestionModeOnTheSameFilesAndPrerequisites() throws Exception {
        org.headwater.testing.External.need(MakeReference.available(), "GNU make");
        Map<String, Check> checks = byName(checksAt(NOW).evaluate());
        for (Map.Entry<String, List<String>> rule : HiveWorkspace.MADE_FROM.entrySet()) {
            // expected: GNU make's `make -q` (exit 1 when a target is older than a prerequisite), run on a
            // Makefile written from the scripts' code, not from the catalog.
            boolean makeSaysOutOfDate = MakeReference.outOfDate(workspace, HiveWorkspace.MADE_FROM, rule.getKey());
            assertThat(checks.get(rule.getKey()).state().equals("stale")).as(rule.getKey()).isEqualTo(makeSaysOutOfDate);
        }
        // Touch the tally's input after it, as a person editing the reference list would.
        HiveWorkspace.touch(workspace.resolve("reference/apiaries.csv"), Instant.parse("2026-12-01T12:00:00Z"));
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        assertThat(MakeReference.outOfDate(workspace, HiveWorkspace.MADE_FROM, "reports/apiary_tally.csv")).isTrue();
        Check tally = byName(checksAt(NOW).evaluate()).get("reports/apiary_tally.csv");
        assertThat(tally.state()).isEqualTo("stale");
        assertThat(tally.newerInput().name()).isEqualTo("reference/apiaries.csv");
        assertThat(tally.why()).isEqualTo("Its input reference/apiaries.csv was modified at 2026-12-01T12:00:00Z, 16 days"
                + " 12 hours after this dataset (2026-11-15T00:00:00Z).");
    }

    @Test
    void aLatePolicyWinsOverStaleAndStillNamesTheNewerInput() throws IOException {
        catalog.policies().setByPerson(uri("hives/daily_summary.csv"), Policy.parse("max-age 12h"), "Ilse Marrow");
        Check summary = checksAt(NOW).evaluate(id("hives/daily_summary.csv")).orElseThrow();

        assertThat(summary.state()).isEqualTo("late");
        assertThat(summary.policyFrom()).isEqualTo("api:Ilse Marrow");
        assertThat(summary.since()).isEqualTo(time("hives/daily_summary.csv").plus(Duration.ofHours(12)));
        assertThat(summary.newerInput().name()).isEqualTo("hives/weights.csv");
        assertThat(summary.why()).endsWith("Its input also hives/weights.csv was modified at 2026-12-07T06:30:00Z,"
                + " 22 hours after this dataset (2026-12-06T08:30:00Z).");
    }

    @Test
    void recordingKeepsSinceWhileTheStateHoldsAndStartsANewHistoryRowWhenItChanges() throws IOException {
        FreshnessChecks.Recorded first = checksAt(NOW).record();
        FreshnessChecks.Recorded again = checksAt(NOW.plus(Duration.ofMinutes(10))).record();

        assertThat(first.transitions()).hasSize(8);
        assertThat(first.transitions()).allMatch(t -> t.previousState() == null);
        assertThat(again.transitions()).isEmpty();
        // Unknown has no time of its own: it began at the first check that found it, and stays so.
        assertThat(byName(again.report()).get("reference/apiaries.csv").since()).isEqualTo(NOW);

        // The feed log is refilled; the next check finds it fresh.
        HiveWorkspace.touch(workspace.resolve("hives/feed_log.csv"), Instant.parse("2026-12-07T08:35:00Z"));
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        FreshnessChecks.Recorded after = checksAt(NOW.plus(Duration.ofMinutes(20))).record();

        assertThat(after.transitions()).hasSize(1);
        Transition change = after.transitions().get(0);
        assertThat(change.previousState()).isEqualTo("late");
        assertThat(change.check().name()).isEqualTo("hives/feed_log.csv");
        assertThat(change.check().state()).isEqualTo("fresh");
        assertThat(change.check().since()).isEqualTo(Instant.parse("2026-12-07T08:35:00Z"));

        History history = catalog.freshness().history(id("hives/feed_log.csv")).orElseThrow();
        assertThat(history.checks()).extracting(History.Entry::state).containsExactly("fresh", "late");
        assertThat(history.checks().get(0).endedAt()).isNull();
        assertThat(history.checks().get(1).endedAt()).isEqualTo(history.checks().get(0).recordedAt());
        assertThat(history.checks().get(1).since()).isEqualTo(Instant.parse("2026-12-05T20:30:00Z"));
        assertThat(history.policies()).extracting(History.PolicyEntry::policy).containsExactly("max-age 36h");
    }

    @Test
    void statesAndSinceSurviveClosingAndReopeningTheCatalog() throws IOException {
        Path dir = temp.resolve("kept");
        StoreConfig store = StoreConfig.embedded(dir);
        try (Catalog kept = Catalog.open(dir, store, Clock.systemUTC())) {
            kept.harvestFolder(workspace, false, HarvestProgress.NONE);
            new FreshnessChecks(kept.store(), kept.lineage(), kept.ingestor(), Clock.fixed(NOW, ZoneOffset.UTC)).record();
        }
        Instant later = NOW.plus(Duration.ofDays(2));
        try (Catalog reopened = Catalog.open(dir, store, Clock.systemUTC())) {
            Map<String, Check> checks = byName(new FreshnessChecks(reopened.store(), reopened.lineage(),
                    reopened.ingestor(), Clock.fixed(later, ZoneOffset.UTC)).evaluate());
            assertThat(checks.get("reference/apiaries.csv").state()).isEqualTo("unknown");
            assertThat(checks.get("reference/apiaries.csv").since()).isEqualTo(NOW);
            // Two days on, the weights (max-age 1d) are late since their age ran out, not since the check.
            assertThat(checks.get("hives/weights.csv").state()).isEqualTo("late");
            assertThat(checks.get("hives/weights.csv").since()).isEqualTo(time("hives/weights.csv").plus(Duration.ofDays(1)));
        }
    }

    @Test
    void aPersonsPolicyOutranksThePolicyFileAndRemovingItHandsTheDatasetBackToTheFile() throws IOException {
        String feed = uri("hives/feed_log.csv");
        catalog.policies().setByPerson(feed, Policy.parse("max-age 7d"), "Ilse Marrow");
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        assertThat(checksAt(NOW).evaluate(id("hives/feed_log.csv")).orElseThrow().state()).isEqualTo("fresh");

        catalog.policies().setByPerson(feed, null, "Ilse Marrow");
        assertThat(checksAt(NOW).evaluate(id("hives/feed_log.csv")).orElseThrow().policy()).isNull();
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        Check back = checksAt(NOW).evaluate(id("hives/feed_log.csv")).orElseThrow();
        assertThat(back.policy()).isEqualTo("max-age 36h");
        assertThat(back.state()).isEqualTo("late");
        assertThat(catalog.freshness().history(id("hives/feed_log.csv")).orElseThrow().policies())
                .extracting(History.PolicyEntry::setBy)
                .containsExactly(".headwater-freshness line 3 (hives/feed_log.csv)", "api:Ilse Marrow",
                        ".headwater-freshness line 3 (hives/feed_log.csv)");
    }

    @Test
    void aBadPolicyFileLineIsAHarvestErrorAndTheOtherLinesStillApply() throws IOException {
        java.nio.file.Files.writeString(workspace.resolve(PolicyFile.NAME), HiveWorkspace.POLICIES
                + "reports/*.csv  schedule every monday\n");
        var summary = catalog.harvestFolder(workspace, false, HarvestProgress.NONE);

        assertThat(summary.errors()).isEqualTo(1);
        assertThat(summary.errorsByKind()).containsExactly(Map.entry("freshness_policy", 1));
        assertThat(summary.firstErrors().get(0).message()).isEqualTo("line 7: a schedule has the five crontab fields"
                + " (minute hour day-of-month month day-of-week), for example 'schedule 0 6 * * 1-5'; got"
                + " 'schedule every monday'");
        assertThat(summary.firstErrors().get(0).uri()).endsWith("/hive-coop/.headwater-freshness");
        assertThat(checksAt(NOW).evaluate(id("reports/weekly.csv")).orElseThrow().policy())
                .isEqualTo("schedule 0 7 * * 1 grace 3h");
    }

    private long id(String name) {
        return catalog.reader().findDatasets(name).get(0).id();
    }

    private String uri(String name) {
        return catalog.reader().findDatasets(name).get(0).uri();
    }
}
