package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import org.headwater.impact.SeedLibraryAccess;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code impact} and {@code own} answer from the catalog's history with {@code --as-of}. */
class HistoryQueriesTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;

    @Test
    void impactAndOwnersAsOfAnEarlierTimeShowTheLineageAndOwnersOfThen() throws Exception {
        Path workspace = SeedLibraryAccess.copy(temp);
        String dataDir = temp.resolve("c").toString();
        assertThat(run("harvest", workspace.toString(), "--data-dir", dataDir).exit()).isZero();
        Thread.sleep(20);
        Instant before = Instant.now();
        Thread.sleep(20);

        // season.py is deleted: what it wrote no longer depends on low_trays.csv (reference: the fixture's code,
        // season.py is the only script reading work/low_trays.csv).
        Files.delete(workspace.resolve("scripts/season.py"));
        run("harvest", workspace.toString(), "--data-dir", dataDir);
        assertThat(run("own", "work/season.csv", "Juniper Ashgrove", "--data-dir", dataDir).exit()).isZero();

        JsonNode now = JSON.readTree(run("impact", "work/low_trays.csv.tray_id", "--json", "--data-dir", dataDir).out());
        JsonNode then = JSON.readTree(run("impact", "work/low_trays.csv.tray_id", "--json", "--as-of", before.toString(),
                "--data-dir", dataDir).out());
        assertThat(now.get("counts").get("total").asInt()).isZero();
        assertThat(then.get("affected")).extracting(a -> a.get("name").asText()).containsExactly(
                "work/season.csv", "work/season.csv.poor_trays", "scripts/season.py");

        JsonNode ownersNow = JSON.readTree(run("own", "work/season.csv", "--json", "--data-dir", dataDir).out());
        JsonNode ownersThen = JSON.readTree(run("own", "work/season.csv", "--json", "--as-of", before.toString(),
                "--data-dir", dataDir).out());
        assertThat(ownersNow.get("owners")).extracting(o -> o.get("name").asText()).contains("Juniper Ashgrove");
        assertThat(ownersThen.get("owners")).extracting(o -> o.get("name").asText()).doesNotContain("Juniper Ashgrove");
        assertThat(run("own", "work/season.csv", "Juniper Ashgrove", "--as-of", before.toString(), "--data-dir", dataDir).exit())
                .isEqualTo(Main.USAGE);
    }
}
