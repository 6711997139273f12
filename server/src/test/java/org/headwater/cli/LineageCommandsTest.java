package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Path;
import org.headwater.impact.SeedLibraryAccess;
import org.headwater.testing.Cli.Ran;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code upstream}, {@code downstream} and {@code impact} on the command line, on the seed-library
 * workspace (// reference: its scripts, read by hand; see its README).
 */
class LineageCommandsTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    static Path temp;

    static String dataDir;



    @BeforeAll
    static void harvest() throws Exception {
        Path workspace = SeedLibraryAccess.copy(temp);
        dataDir = temp.resolve("c").toString();
        assertThat(run("harvest", workspace.toString(), "--data-dir", dataDir).exit()).isZero();
    }

    @Test
    void downstreamPrintsEachDatasetWithItsPathAndJsonWithTheSameResults() throws Exception {
        Ran text = run("downstream", "raw/varieties.csv", "--depth", "1", "--data-dir", dataDir);
        assertThat(text.exit()).isZero();
        assertThat(text.out()).isEqualTo(String.join(System.lineSeparator(),
                "downstream of raw/varieties.csv: 1",
                "  1  work/trays_enriched.csv (file)",
                "       raw/varieties.csv -> work/trays_enriched.csv via scripts/enrich.py [static 0.95]", ""));
        Ran json = run("upstream", "work/trays_enriched.csv.variety_name", "--json", "--data-dir", dataDir);
        JsonNode answer = JSON.readTree(json.out());
        // reference: enrich.py copies variety_name from raw/varieties.csv (the merge's right side)
        assertThat(answer.get("target").get("column").asText()).isEqualTo("variety_name");
        assertThat(answer.get("results")).extracting(r -> r.get("name").asText() + "." + r.get("column").asText())
                .containsExactly("raw/varieties.csv.variety_name");
    }

    @Test
    void impactPrintsMarkdownAndJsonWithTheSameCounts() throws Exception {
        Ran markdown = run("impact", "work/low_trays.csv.tray_id", "--markdown", "--data-dir", dataDir);
        assertThat(markdown.exit()).isZero();
        // reference: season.py counts tray_id per variety into poor_trays; running_log.py does not read it
        assertThat(markdown.out()).startsWith("# Impact of dropping column work/low_trays.csv.tray_id\n\n"
                + "**3 affected**: 1 dataset, 1 column, 1 script, 0 figures, 0 views; 0 indirect, 0 uncertain;");
        JsonNode json = JSON.readTree(run("impact", "work/low_trays.csv.tray_id", "--json", "--data-dir", dataDir).out());
        assertThat(json.get("counts").get("total").asInt()).isEqualTo(3);
        assertThat(json.get("affected")).extracting(a -> a.get("name").asText()).containsExactly(
                "work/season.csv", "work/season.csv.poor_trays", "scripts/season.py");
    }

    @Test
    void aNameThatMatchesNothingOrABadOptionIsAUsageError() {
        Ran unknown = run("impact", "work/nothing.csv", "--data-dir", dataDir);
        assertThat(unknown.exit()).isEqualTo(Main.USAGE);
        assertThat(unknown.err()).contains("No dataset or column matches 'work/nothing.csv'");
        Ran badEvidence = run("downstream", "raw/varieties.csv", "--evidence", "rumour", "--data-dir", dataDir);
        assertThat(badEvidence.exit()).isEqualTo(Main.USAGE);
        assertThat(badEvidence.err()).contains("unknown evidence 'rumour'");
        Ran misfit = run("impact", "raw/varieties.csv", "--change", "drop", "--data-dir", dataDir);
        assertThat(misfit.exit()).isEqualTo(Main.USAGE);
        assertThat(misfit.err()).contains("drop is a change to a column; name it as dataset.column");
    }
}
