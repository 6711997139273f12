package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.headwater.testing.Workspaces;
import org.headwater.testing.Cli.Ran;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CommandLineTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;



    @Test
    void harvestThenSearchFindsTheNitrateDatasetFirstAndARepeatChangesNothing() throws Exception {
        String dataDir = temp.resolve("c").toString();
        Ran first = run("harvest", Workspaces.demo().toString(), "--data-dir", dataDir, "--json");
        Ran second = run("harvest", Workspaces.demo().toString(), "--data-dir", dataDir, "--json");
        Ran search = run("search", "nitrate", "--data-dir", dataDir, "--json");

        assertThat(first.exit()).isZero();
        JsonNode a = JSON.readTree(first.out());
        JsonNode b = JSON.readTree(second.out());
        // The demo holds 22 non-script files; 8 are partitions of 2 sets, so 16 datasets (and 8 scripts).
        assertThat(a.get("datasets").asInt()).isEqualTo(16);
        assertThat(b.get("datasets").asInt()).isEqualTo(16);
        assertThat(b.get("scripts").asInt()).isEqualTo(a.get("scripts").asInt());
        assertThat(b.get("changes").asInt()).isZero();
        assertThat(search.exit()).isZero();
        assertThat(JSON.readTree(search.out()).get("hits").get(0).get("name").asText()).isEqualTo("lab/nitrate_results_2025.csv");
    }

    @Test
    void showPrintsADatasetByItsShortNameAsJson() throws Exception {
        String dataDir = temp.resolve("c").toString();
        run("harvest", Workspaces.demo().toString(), "--data-dir", dataDir);
        Ran show = run("show", "station_register.csv", "--data-dir", dataDir, "--json");
        assertThat(show.exit()).isZero();
        JsonNode d = JSON.readTree(show.out());
        assertThat(d.get("name").asText()).isEqualTo("stations/station_register.csv");
        assertThat(d.get("columns")).hasSize(6);
    }

    @Test
    void exitCodesAreZeroOnSuccessOneForProblemsTwoForBadUsage() throws Exception {
        String dataDir = temp.resolve("c").toString();
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("bad.json"), "{\"a\": [1, 2");

        assertThat(run("--help").exit()).isZero();
        assertThat(run("harvest", "--help").exit()).isZero();
        assertThat(run("harvest", lake.toString(), "--data-dir", dataDir).exit()).isEqualTo(1);
        assertThat(run("frobnicate").exit()).isEqualTo(2);
        assertThat(run("harvest").exit()).isEqualTo(2);
        Ran noFolder = run("harvest", temp.resolve("absent").toString(), "--data-dir", dataDir);
        assertThat(noFolder.exit()).isEqualTo(2);
        assertThat(noFolder.err()).contains("no such folder");
        assertThat(run("show", "nothing-like-this", "--data-dir", dataDir).exit()).isEqualTo(2);
        assertThat(run("search", "x", "--limit", "0", "--data-dir", dataDir).exit()).isEqualTo(2);
    }

    @Test
    void reindexRebuildsTheIndexFromTheStore() throws Exception {
        String dataDir = temp.resolve("c").toString();
        run("harvest", Workspaces.demo().toString(), "--data-dir", dataDir);
        Ran reindex = run("reindex", "--data-dir", dataDir, "--json");
        assertThat(reindex.exit()).isZero();
        assertThat(JSON.readTree(reindex.out()).get("documents").asInt()).isEqualTo(162); // 16 file datasets, 5 SQL tables and views, 8 scripts, 133 columns
    }

    @Test
    void theProgressLineShowsABarOnceTheTotalIsKnown() {
        assertThat(TerminalProgress.line(50, 200, 2.0)).startsWith("harvesting [########                      ]  25%  50/200 files  25 files/s");
        assertThat(TerminalProgress.line(50, -1, 2.0)).startsWith("harvesting  50 files  25 files/s");
    }

    @Test
    void lineageWithColumnsGivesEachViewColumnItsOriginsAndTheColumnsThatOnlyJoinOrGroup() throws Exception {
        String dataDir = temp.resolve("c").toString();
        run("harvest", Workspaces.demo().toString(), "--data-dir", dataDir);
        Ran lineage = run("lineage", "monthly_station_summary", "--columns", "--json", "--data-dir", dataDir);
        assertThat(lineage.exit()).isZero();
        JsonNode report = JSON.readTree(lineage.out()).get(0);
        assertThat(report.get("dataset").asText()).isEqualTo("monthly_station_summary");
        // expected, read by hand from examples/quillwater-lab/sql/views.sql: s.station_code is copied,
        // EXTRACT(MONTH FROM r.reading_date) is computed, COUNT(*) has no source column; the join keys
        // and the GROUP BY columns only decide the rows.
        JsonNode code = report.get("columns").get(0);
        assertThat(code.get("name").asText()).isEqualTo("station_code");
        assertThat(code.get("origins").toString()).isEqualTo("[{\"dataset\":\"station\",\"column\":\"station_code\",\"derived\":false}]");
        assertThat(report.get("columns").get(3).get("origins").toString())
                .isEqualTo("[{\"dataset\":\"station_reading\",\"column\":\"reading_date\",\"derived\":true}]");
        assertThat(report.get("columns").get(8).get("origins")).isEmpty();
        List<String> influencing = new java.util.ArrayList<>();
        code.get("influencing").forEach(i -> influencing.add(i.get("dataset").asText() + "." + i.get("column").asText()));
        assertThat(influencing).containsExactlyInAnyOrder("station.station_code", "station_reading.station_code",
                "station.station_name", "station.river_km", "station_reading.reading_date");
    }

    @Test
    void readsListsWhatAScriptReadsAndWritesWithLines() throws Exception {
        String dataDir = temp.resolve("c").toString();
        run("harvest", Workspaces.demo().toString(), "--data-dir", dataDir);
        Ran reads = run("reads", "scripts/clean_field_visits.py", "--data-dir", dataDir, "--json");
        assertThat(reads.exit()).isZero();
        List<String> found = new java.util.ArrayList<>();
        JSON.readTree(reads.out()).get("references").forEach(r -> found.add(r.get("direction").asText() + " "
                + r.get("dataset").asText() + " " + r.get("function").asText()));
        // expected: read by hand from the script; the commented-out and `if False:` reads are not there.
        assertThat(found).containsExactly("read field/sampling_visits_*.json pandas.read_json",
                "read field/probe_log.ndjson pandas.read_json", "write derived/visits_clean.csv pandas.DataFrame.to_csv");
    }
}
