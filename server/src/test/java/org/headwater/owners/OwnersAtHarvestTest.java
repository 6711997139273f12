package org.headwater.owners;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.headwater.cli.Main;
import org.headwater.testing.Cli.Ran;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The owners file applied at harvest, suggested owners from git, and owners assigned by hand with
 * {@code headwater own}, on the seed-library workspace. // reference: its headwater.owners, read by hand
 */
class OwnersAtHarvestTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;


    private List<String> owners(String dataDir, String dataset) throws Exception {
        Ran ran = run("own", dataset, "--data-dir", dataDir, "--json");
        assertThat(ran.exit()).as(ran.err()).isZero();
        List<String> lines = new ArrayList<>();
        for (JsonNode o : JSON.readTree(ran.out()).get("owners")) {
            lines.add(o.get("name").asText() + " (" + o.get("kind").asText() + (o.get("inherited").asBoolean() ? ", inherited" : "")
                    + (o.get("suggested").asBoolean() ? ", suggested" : "") + "): " + o.get("reason").asText());
        }
        return lines;
    }

    @Test
    void everyDatasetSaysWhomToAskAndWhyAndHandMadeOwnersWinOverTheFile() throws Exception {
        Path workspace = org.headwater.impact.SeedLibraryAccess.copy(temp);
        String dataDir = temp.resolve("c").toString();
        assertThat(run("harvest", workspace.toString(), "--data-dir", dataDir).exit()).isZero();

        // Line 3 gives the raw folder to the sowing crew; line 4 is more specific for the variety list.
        assertThat(owners(dataDir, "raw/varieties.csv")).containsExactly(
                "Perrin Oakhollow (person): headwater.owners line 4: raw/varieties.csv");
        assertThat(owners(dataDir, "raw/trays/week=*/trays.csv")).containsExactly(
                "sowing-crew (team, inherited): headwater.owners line 3: raw/ (folder raw)");
        // A partition has its set's owners.
        assertThat(owners(dataDir, "raw/trays/week=02/trays.csv")).containsExactly(
                "sowing-crew (team, inherited): owner of the partitioned set raw/trays/week=*/trays.csv:"
                        + " headwater.owners line 3: raw/ (folder raw)");
        // Lines 5 (work/**) and 6 (work/trays_*.csv) both match; line 6 has more literal parts. git suggests
        // the author of the script that writes the file.
        assertThat(owners(dataDir, "work/trays_enriched.csv")).containsExactly(
                "Wren Maddox (person): headwater.owners line 6: work/trays_*.csv");
        assertThat(owners(dataDir, "work/rates.csv")).containsExactly(
                "trial-analysts (team): headwater.owners line 5: work/**",
                "Ivo Marsh (person, suggested): changed scripts/rates.py, which writes this dataset (git history)",
                "Wren Maddox (person, suggested): changed scripts/rates.py, which writes this dataset (git history)");
        // Line 8 says nobody; only git's suggestion is left.
        assertThat(owners(dataDir, "work/running_log.csv")).containsExactly(
                "Wren Maddox (person, suggested): changed scripts/running_log.py, which writes this dataset (git history)");
        assertThat(owners(dataDir, "figures/season_rates.png")).containsExactly(
                "newsletter (team): headwater.owners line 7: figures/*.png",
                "Tamsin Reed (person): headwater.owners line 7: figures/*.png",
                "Ivo Marsh (person, suggested): changed scripts/plot_rates.py, which writes this dataset (git history)",
                "Wren Maddox (person, suggested): changed scripts/plot_rates.py, which writes this dataset (git history)");

        // A file owner cannot be removed by hand: the message names the line to change.
        Ran refused = run("own", "work/rates.csv", "trial-analysts", "--remove", "--data-dir", dataDir);
        assertThat(refused.exit()).isEqualTo(Main.USAGE);
        assertThat(refused.err()).contains("trial-analysts owns work/rates.csv through headwater.owners line 5: work/**");

        // By hand: the file's owners of that dataset end, and a new harvest leaves the hand-made one alone.
        assertThat(run("own", "work/rates.csv", "Juniper Vale", "--data-dir", dataDir).exit()).isZero();
        assertThat(run("harvest", workspace.toString(), "--data-dir", dataDir).exit()).isZero();
        assertThat(owners(dataDir, "work/rates.csv")).containsExactly(
                "Juniper Vale (person): assigned by hand (command line)",
                "Ivo Marsh (person, suggested): changed scripts/rates.py, which writes this dataset (git history)",
                "Wren Maddox (person, suggested): changed scripts/rates.py, which writes this dataset (git history)");

        // Removing the last hand-made owner lets the file's rule apply again at the next harvest.
        assertThat(run("own", "work/rates.csv", "Juniper Vale", "--remove", "--data-dir", dataDir).exit()).isZero();
        assertThat(run("harvest", workspace.toString(), "--data-dir", dataDir).exit()).isZero();
        assertThat(owners(dataDir, "work/rates.csv")).first()
                .isEqualTo("trial-analysts (team): headwater.owners line 5: work/**");
    }

    @Test
    void aBadOwnersLineIsAHarvestErrorAndTheOtherLinesStillApply() throws Exception {
        Path workspace = org.headwater.impact.SeedLibraryAccess.copy(temp);
        Files.writeString(workspace.resolve("headwater.owners"), "raw/{varieties.csv  Perrin Oakhollow\nwork/** team:trial-analysts\n");
        String dataDir = temp.resolve("c").toString();
        Ran harvest = run("harvest", workspace.toString(), "--data-dir", dataDir, "--json");
        // A harvest with problems exits 1 and keeps everything it could read.
        assertThat(harvest.exit()).isEqualTo(Main.PROBLEMS);
        JsonNode summary = JSON.readTree(harvest.out());
        assertThat(summary.toString()).contains("headwater.owners line 1: 'raw/{varieties.csv' is not a valid glob");
        assertThat(owners(dataDir, "work/low_trays.csv")).first()
                .isEqualTo("trial-analysts (team): headwater.owners line 2: work/**");
        assertThat(owners(dataDir, "raw/varieties.csv")).isEmpty();
    }
}
