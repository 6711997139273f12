package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.time.Duration;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import org.headwater.testing.Cli.Ran;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code headwater check} on a catalog directory, against the real clock (file times are set relative to now). */
class CheckCommandTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;



    @Test
    void exitsWithOneWhileAnOutputIsOlderThanItsInputAndWithZeroOnceItIsRemade() throws Exception {
        Path ws = temp.resolve("orchard-trial");
        Files.createDirectories(ws.resolve("trees"));
        Files.writeString(ws.resolve("trees/girth.csv"), "tree,cm\nT1,31\nT2,28\n");
        Files.writeString(ws.resolve("trees/girth_mean.csv"), "cm\n29.5\n");
        Files.writeString(ws.resolve("mean.py"), """
                import pandas as pd
                pd.read_csv("trees/girth.csv")[["cm"]].mean().to_frame().to_csv("trees/girth_mean.csv", index=False)
                """);
        Instant hourAgo = Instant.now().minus(Duration.ofHours(1)).truncatedTo(ChronoUnit.SECONDS);
        Files.setLastModifiedTime(ws.resolve("trees/girth_mean.csv"), FileTime.from(hourAgo.minus(Duration.ofHours(3))));
        Files.setLastModifiedTime(ws.resolve("trees/girth.csv"), FileTime.from(hourAgo));
        String dataDir = temp.resolve("catalog").toString();
        assertThat(run("harvest", ws.toString(), "--data-dir", dataDir).exit()).isZero();

        Ran stale = run("check", "--json", "--data-dir", dataDir);

        assertThat(stale.exit()).isEqualTo(Main.PROBLEMS);
        JsonNode report = JSON.readTree(stale.out());
        JsonNode mean = report.get("checks").get(1);
        assertThat(mean.get("name").asText()).isEqualTo("trees/girth_mean.csv");
        assertThat(mean.get("state").asText()).isEqualTo("stale");
        assertThat(mean.get("newerInput").get("name").asText()).isEqualTo("trees/girth.csv");
        assertThat(mean.get("why").asText()).endsWith(", 3 hours after this dataset (" + hourAgo.minus(Duration.ofHours(3)) + ").");
        assertThat(report.get("checks").get(0).get("state").asText()).isEqualTo("unknown");

        // The script is run again: its output is now newer than its input.
        Thread.sleep(20);
        java.time.Instant whileStale = java.time.Instant.now();
        Thread.sleep(20);
        Files.setLastModifiedTime(ws.resolve("trees/girth_mean.csv"), FileTime.from(hourAgo.plus(Duration.ofMinutes(5))));
        run("harvest", ws.toString(), "--data-dir", dataDir);
        Ran fresh = run("check", "--data-dir", dataDir);

        assertThat(fresh.exit()).isEqualTo(Main.OK);
        assertThat(fresh.out()).contains("fresh    trees/girth_mean.csv");
        assertThat(fresh.out().strip()).endsWith("1 fresh, 0 due, 0 late, 0 stale, 1 unknown");

        // As of a moment while it was stale: the recorded state of then, and the same exit code as then.
        Ran then = run("check", "--json", "--as-of", whileStale.toString(), "--data-dir", dataDir);
        assertThat(then.exit()).isEqualTo(Main.PROBLEMS);
        JsonNode past = JSON.readTree(then.out());
        assertThat(past.get("counts").get("stale").asInt()).isEqualTo(1);
        assertThat(past.get("checks")).extracting(c -> c.get("name").asText() + " " + c.get("state").asText())
                .contains("trees/girth_mean.csv stale");
    }

    @Test
    void serveRefusesAnUnreadableCheckPeriodAsBadUsage() {
        Ran bad = run("serve", "--check-every", "soon", "--port", "0", "--data-dir", temp.resolve("c").toString());

        assertThat(bad.exit()).isEqualTo(Main.USAGE);
        assertThat(bad.err()).contains("--check-every: 'soon' is not a duration");
    }
}
