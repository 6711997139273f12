package org.headwater.checks;

import com.cronutils.model.Cron;
import com.cronutils.model.CronType;
import com.cronutils.model.definition.CronDefinitionBuilder;
import com.cronutils.model.time.ExecutionTime;
import com.cronutils.parser.CronParser;
import java.time.DateTimeException;
import java.time.Duration;
import java.time.Instant;
import java.time.ZoneId;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;

/**
 * What a dataset is held to. Written as text, the same in the policy file and the API:
 * {@code max-age 36h}, or {@code schedule MIN HOUR DAY MONTH WEEKDAY [grace 2h] [zone Z]} with the five
 * fields of crontab(5).
 */
public sealed interface Policy {
    /** The grace period of a schedule that names none. */
    Duration DEFAULT_GRACE = Duration.ofHours(1);

    /** The canonical text, which {@link #parse} reads back to an equal policy. */
    String text();

    /** The dataset must have been modified within {@code maxAge}. */
    record MaxAge(Duration maxAge) implements Policy {
        @Override
        public String text() {
            return "max-age " + Durations.text(maxAge);
        }
    }

    /**
     * The dataset is expected to be updated at every time the cron expression names (in {@code zone}),
     * and may be up to {@code grace} late before it counts as late.
     */
    record Schedule(String cron, Duration grace, ZoneId zone, ExecutionTime times) implements Policy {
        @Override
        public String text() {
            return "schedule " + cron + " grace " + Durations.text(grace)
                    + (zone.equals(ZoneOffset.UTC) ? "" : " zone " + zone.getId());
        }

        /** The latest expected update at or before {@code now}, if the schedule ever had one. */
        public Optional<Instant> previous(Instant now) {
            ZonedDateTime at = now.atZone(zone);
            if (times.isMatch(at.withNano(0)) && at.getSecond() == 0) {
                return Optional.of(at.withNano(0).toInstant());
            }
            return times.lastExecution(at).map(ZonedDateTime::toInstant);
        }

        /** The first expected update strictly after {@code now}. */
        public Optional<Instant> next(Instant now) {
            return times.nextExecution(now.atZone(zone)).map(ZonedDateTime::toInstant);
        }

        @Override
        public boolean equals(Object other) {
            return other instanceof Schedule s && s.cron.equals(cron) && s.grace.equals(grace) && s.zone.equals(zone);
        }

        @Override
        public int hashCode() {
            return cron.hashCode() * 31 + grace.hashCode();
        }
    }

    /**
     * Reads a policy's text.
     *
     * @throws IllegalArgumentException with a message saying what is wrong and what is expected
     */
    static Policy parse(String text) {
        List<String> words = Arrays.asList(text.trim().split("\\s+"));
        String kind = words.get(0).toLowerCase(java.util.Locale.ROOT);
        if (kind.equals("max-age")) {
            if (words.size() != 2) {
                throw new IllegalArgumentException("write max-age and one duration, for example 'max-age 36h'; got '"
                        + text.trim() + "'");
            }
            return new MaxAge(Durations.parse(words.get(1)));
        }
        if (kind.equals("schedule")) {
            return schedule(text, words);
        }
        throw new IllegalArgumentException("a policy starts with 'max-age' or 'schedule', got '" + text.trim() + "'");
    }

    private static Policy schedule(String text, List<String> words) {
        if (words.size() < 6) {
            throw new IllegalArgumentException("a schedule has the five crontab fields (minute hour day-of-month month"
                    + " day-of-week), for example 'schedule 0 6 * * 1-5'; got '" + text.trim() + "'");
        }
        String expression = String.join(" ", words.subList(1, 6));
        Cron cron;
        try {
            cron = UnixCron.PARSER.parse(expression).validate();
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException("'" + expression + "' is not a crontab schedule: " + e.getMessage());
        }
        Duration grace = DEFAULT_GRACE;
        ZoneId zone = ZoneOffset.UTC;
        List<String> rest = words.subList(6, words.size());
        if (rest.size() % 2 != 0) {
            throw new IllegalArgumentException("after the five schedule fields come 'grace DURATION' and 'zone ZONE',"
                    + " got '" + String.join(" ", rest) + "'");
        }
        for (int i = 0; i < rest.size(); i += 2) {
            String key = rest.get(i).toLowerCase(java.util.Locale.ROOT);
            String value = rest.get(i + 1);
            if (key.equals("grace")) {
                grace = Durations.parse(value);
            } else if (key.equals("zone")) {
                try {
                    zone = ZoneId.of(value).normalized();
                } catch (DateTimeException e) {
                    throw new IllegalArgumentException("'" + value + "' is not a time zone (use an IANA name or an"
                            + " offset such as +01:00)");
                }
            } else {
                throw new IllegalArgumentException("unknown schedule setting '" + rest.get(i)
                        + "'; the settings are 'grace' and 'zone'");
            }
        }
        return new Schedule(expression, grace, zone, ExecutionTime.forCron(cron));
    }

    /** The one parser of crontab(5) expressions, built once (cron-utils definitions are immutable). */
    final class UnixCron {
        static final CronParser PARSER = new CronParser(CronDefinitionBuilder.instanceDefinitionFor(CronType.UNIX));

        private UnixCron() {
        }
    }
}
