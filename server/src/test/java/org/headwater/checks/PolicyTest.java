package org.headwater.checks;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.time.DayOfWeek;
import java.time.Duration;
import java.time.Instant;
import java.time.LocalTime;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.time.temporal.ChronoUnit;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.api.Test;

class PolicyTest {

    // expected: crontab(5), Debian cron 3.0pl1-162, "EXAMPLE CRON FILE" and the day-of-month/day-of-week
    // note; each line's comment in the manual says when it runs, the instants follow from that wording for
    // the reference time (weekdays checked with Python's datetime: 2026-12-02 is a Wednesday).
    @ParameterizedTest(name = "{0} after {1}")
    @CsvSource(delimiter = '|', textBlock = """
            5 0 * * *      | 2026-12-02T10:00:00Z | 2026-12-02T00:05:00Z | 2026-12-03T00:05:00Z
            15 14 1 * *    | 2026-12-02T10:00:00Z | 2026-12-01T14:15:00Z | 2027-01-01T14:15:00Z
            0 22 * * 1-5   | 2026-12-02T10:00:00Z | 2026-12-01T22:00:00Z | 2026-12-02T22:00:00Z
            0 22 * * 1-5   | 2026-12-05T10:00:00Z | 2026-12-04T22:00:00Z | 2026-12-07T22:00:00Z
            23 0-23/2 * * * | 2026-12-02T10:00:00Z | 2026-12-02T08:23:00Z | 2026-12-02T10:23:00Z
            23 0-23/2 * * * | 2026-12-02T10:30:00Z | 2026-12-02T10:23:00Z | 2026-12-02T12:23:00Z
            5 4 * * sun    | 2026-12-02T10:00:00Z | 2026-11-29T04:05:00Z | 2026-12-06T04:05:00Z
            30 4 1,15 * 5  | 2026-12-02T10:00:00Z | 2026-12-01T04:30:00Z | 2026-12-04T04:30:00Z
            30 4 1,15 * 5  | 2026-12-12T00:00:00Z | 2026-12-11T04:30:00Z | 2026-12-15T04:30:00Z
            """)
    void scheduleTimesFollowTheCrontabManualsExamples(String cron, String at, String previous, String next) {
        Policy.Schedule schedule = (Policy.Schedule) Policy.parse("schedule " + cron);
        Instant now = Instant.parse(at);

        assertThat(schedule.previous(now)).contains(Instant.parse(previous));
        assertThat(schedule.next(now)).contains(Instant.parse(next));
    }

    @Test
    void weekdayMorningScheduleAgreesWithAJavaTimeComputationForEveryHalfHourOfFourWeeks() {
        Policy.Schedule schedule = (Policy.Schedule) Policy.parse("schedule 0 6 * * 1-5");
        Instant start = Instant.parse("2026-11-30T00:00:00Z");
        for (Instant now = start; now.isBefore(start.plus(Duration.ofDays(28))); now = now.plus(Duration.ofMinutes(30))) {
            // expected: computed independently with java.time — the first weekday 06:00 UTC strictly after now.
            ZonedDateTime candidate = now.atZone(ZoneOffset.UTC).with(LocalTime.of(6, 0));
            while (!candidate.toInstant().isAfter(now) || candidate.getDayOfWeek().compareTo(DayOfWeek.SATURDAY) >= 0) {
                candidate = candidate.plusDays(1).with(LocalTime.of(6, 0));
            }
            assertThat(schedule.next(now)).as("next after %s", now).contains(candidate.toInstant());
        }
    }

    @Test
    void aTimeOnTheScheduleIsItsOwnPreviousExpectedUpdate() {
        Policy.Schedule schedule = (Policy.Schedule) Policy.parse("schedule 0 6 * * *");
        // expected: crontab(5) — a job runs in the minute its fields match, so 06:00 itself is an update time.
        assertThat(schedule.previous(Instant.parse("2026-12-02T06:00:00Z"))).contains(Instant.parse("2026-12-02T06:00:00Z"));
        assertThat(schedule.previous(Instant.parse("2026-12-02T05:59:59Z"))).contains(Instant.parse("2026-12-01T06:00:00Z"));
    }

    @Test
    void aScheduleInAnOffsetZoneExpectsItsTimesInThatZone() {
        Policy.Schedule schedule = (Policy.Schedule) Policy.parse("schedule 0 6 * * * zone +02:00 grace 30m");
        // expected: 06:00 at +02:00 is 04:00 UTC (ISO 8601 offsets).
        assertThat(schedule.next(Instant.parse("2026-12-02T03:00:00Z"))).contains(Instant.parse("2026-12-02T04:00:00Z"));
        assertThat(schedule.grace()).isEqualTo(Duration.ofMinutes(30));
        assertThat(schedule.text()).isEqualTo("schedule 0 6 * * * grace 30m zone +02:00");
    }

    @Test
    void policiesReadBackFromTheirCanonicalText() {
        assertThat(Policy.parse("max-age 36h").text()).isEqualTo("max-age 36h");
        assertThat(Policy.parse("MAX-AGE 1d12h").text()).isEqualTo("max-age 36h");
        assertThat(Policy.parse("max-age 14d").text()).isEqualTo("max-age 2w");
        assertThat(Policy.parse("schedule   0 7 * * 1").text()).isEqualTo("schedule 0 7 * * 1 grace 1h");
        assertThat(Policy.parse(Policy.parse("schedule 0 7 * * 1 grace 3h").text()))
                .isEqualTo(Policy.parse("schedule 0 7 * * 1 grace 3h"));
        assertThat(((Policy.MaxAge) Policy.parse("max-age 90m")).maxAge()).isEqualTo(Duration.of(90, ChronoUnit.MINUTES));
    }

    @Test
    void badPoliciesAreRefusedWithAMessageThatSaysWhatIsExpected() {
        assertThatThrownBy(() -> Policy.parse("max-age soon")).hasMessage(
                "'soon' is not a duration: write for example 36h, 7d, 1d12h or 90m (w weeks, d days, h hours, m minutes,"
                        + " s seconds; more than zero)");
        assertThatThrownBy(() -> Policy.parse("schedule 0 6 * *")).hasMessageStartingWith(
                "a schedule has the five crontab fields");
        // expected: crontab(5) — hours run 0-23.
        assertThatThrownBy(() -> Policy.parse("schedule 0 25 * * *")).hasMessageStartingWith(
                "'0 25 * * *' is not a crontab schedule");
        assertThatThrownBy(() -> Policy.parse("schedule 0 6 * * * grace")).hasMessageStartingWith(
                "after the five schedule fields come 'grace DURATION' and 'zone ZONE'");
        assertThatThrownBy(() -> Policy.parse("hourly")).hasMessage(
                "a policy starts with 'max-age' or 'schedule', got 'hourly'");
        assertThatThrownBy(() -> Policy.parse("max-age 0h")).hasMessageStartingWith("'0h' is not a duration");
    }

    @Test
    void durationsInSentencesUseTheTwoLargestUnits() {
        // common practice, no source: round down to the two largest non-zero units.
        assertThat(Durations.words(Duration.ofHours(51).plusMinutes(10))).isEqualTo("2 days 3 hours");
        assertThat(Durations.words(Duration.ofMinutes(40))).isEqualTo("40 minutes");
        assertThat(Durations.words(Duration.ofDays(1))).isEqualTo("1 day");
        assertThat(Durations.words(Duration.ofDays(1).plusMinutes(5))).isEqualTo("1 day");
        assertThat(Durations.words(Duration.ofMillis(300))).isEqualTo("under a second");
    }
}
