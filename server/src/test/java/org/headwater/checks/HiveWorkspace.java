package org.headwater.checks;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * An invented workspace of a hive-weighing cooperative, generated with explicit file times: two scripts,
 * their inputs and outputs, reports on schedules, and a policy file. {@link #NOW} is a Monday morning.
 */
final class HiveWorkspace {
    static final Instant NOW = Instant.parse("2026-12-07T08:30:00Z");

    /** Every generated data file and the modification time it is given. */
    static final Map<String, Instant> TIMES = new LinkedHashMap<>();

    static {
        TIMES.put("hives/weights.csv", Instant.parse("2026-12-07T06:30:00Z"));
        TIMES.put("hives/daily_summary.csv", Instant.parse("2026-12-06T08:30:00Z"));
        TIMES.put("hives/feed_log.csv", Instant.parse("2026-12-04T08:30:00Z"));
        TIMES.put("reports/weekly.csv", Instant.parse("2026-11-30T07:10:00Z"));
        TIMES.put("reports/monthly.csv", Instant.parse("2026-11-01T06:30:00Z"));
        TIMES.put("reports/daily_counts.csv", Instant.parse("2026-12-07T05:45:00Z"));
        TIMES.put("reference/apiaries.csv", Instant.parse("2026-10-01T00:00:00Z"));
        TIMES.put("reports/apiary_tally.csv", Instant.parse("2026-11-15T00:00:00Z"));
    }

    /** What each script's code reads and writes, written from the scripts below (ground truth). */
    static final Map<String, List<String>> MADE_FROM = Map.of(
            "hives/daily_summary.csv", List.of("hives/weights.csv"),
            "reports/apiary_tally.csv", List.of("reference/apiaries.csv"));

    static final String POLICIES = """
            # How fresh the cooperative's files should be.
            hives/weights.csv          max-age 1d
            hives/feed_log.csv         max-age 36h
            reports/weekly.csv         schedule 0 7 * * 1 grace 3h
            reports/monthly.csv        schedule 0 6 1 * *
            reports/daily_counts.csv   schedule 30 5 * * *
            """;

    private HiveWorkspace() {
    }

    static Path write(Path root) throws IOException {
        Files.createDirectories(root);
        for (String name : TIMES.keySet()) {
            Path file = root.resolve(name);
            Files.createDirectories(file.getParent());
            Files.writeString(file, "hive,day,kg\nH-01,2026-12-01,41.5\nH-02,2026-12-01,38.25\n");
        }
        Files.writeString(root.resolve("summarise.py"), """
                import pandas as pd

                weights = pd.read_csv("hives/weights.csv")
                daily = weights.groupby("day", as_index=False)["kg"].mean()
                daily.to_csv("hives/daily_summary.csv", index=False)
                """);
        Files.writeString(root.resolve("tally.py"), """
                import pandas as pd

                apiaries = pd.read_csv("reference/apiaries.csv")
                apiaries.groupby("hive", as_index=False).size().to_csv("reports/apiary_tally.csv", index=False)
                """);
        Files.writeString(root.resolve(PolicyFile.NAME), POLICIES);
        setTimes(root);
        return root;
    }

    static void setTimes(Path root) throws IOException {
        for (Map.Entry<String, Instant> e : TIMES.entrySet()) {
            touch(root.resolve(e.getKey()), e.getValue());
        }
    }

    static void touch(Path file, Instant time) throws IOException {
        Files.setLastModifiedTime(file, FileTime.from(time));
    }
}
