package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.Statement;
import org.headwater.Catalog;
import org.headwater.store.StoreConfig;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A sources file that lists a folder and two databases: the reachable database is harvested through the
 * JDBC harvester, the one that cannot be reached fails alone, and the folder is harvested all the same.
 */
class ConfiguredDatabaseTest {
    @TempDir
    Path temp;

    @Test
    void aConfiguredDatabaseIsHarvestedAndAnUnreachableOneFailsWithoutStoppingTheOthers() throws Exception {
        Path dbFile = temp.resolve("hatchery");
        String url = "jdbc:h2:file:" + dbFile;
        try (Connection c = DriverManager.getConnection(url, "sa", ""); Statement s = c.createStatement()) {
            s.execute("create table fry_counts (tank varchar(10) primary key, counted_on date, fry integer)");
            s.execute("create view busy_tanks as select tank, fry from fry_counts where fry > 100");
        }
        Path folder = Files.createDirectories(temp.resolve("tanks"));
        Files.writeString(folder.resolve("tank_log.csv"), "tank,temp_c\nT1,11.5\n");
        Path config = temp.resolve("sources.yaml");
        // A schema reads as a folder of the owners file: "public/" gives every table beneath it, a line that
        // names one table wins over it (more literal parts; README, "Owners").
        Files.writeString(temp.resolve("hatchery.owners"), """
                public/             team:hatchery-crew
                public/busy_tanks   Tilly Brook
                """);
        Files.writeString(config, """
                sources:
                  - {name: tanks, kind: folder, path: %s}
                  - {name: hatchery, kind: database, jdbc-url: "%s", user: sa, owners-file: hatchery.owners}
                  - {name: offsite, kind: database, jdbc-url: "jdbc:postgresql://127.0.0.1:1/none", user: nobody}
                """.formatted(folder, url));
        Path dataDir = temp.resolve("catalog");
        StringWriter out = new StringWriter();
        int exit = Main.run(new PrintWriter(out, true), new PrintWriter(new StringWriter(), true),
                "harvest", "--config", config.toString(), "--data-dir", dataDir.toString());

        // Exit 1: one source failed (README, "Using it": exit codes).
        assertThat(exit).isEqualTo(Main.PROBLEMS);
        // The failed source's line names why, as its harvest record does (it once printed "null").
        assertThat(out.toString()).containsPattern(
                "offsite \\(database\\): FAILED \\(harvest \\d+\\): cannot harvest jdbc:postgresql://127\\.0\\.0\\.1:1/none: ");
        try (Catalog catalog = Catalog.open(dataDir)) {
            assertThat(catalog.reader().findDatasets("db:hatchery/PUBLIC.FRY_COUNTS")).hasSize(1);
            assertThat(catalog.reader().findDatasets("db:hatchery/PUBLIC.BUSY_TANKS")).hasSize(1);
            assertThat(catalog.reader().findDatasets("tank_log.csv")).hasSize(1);
            long fry = catalog.reader().findDatasets("db:hatchery/PUBLIC.FRY_COUNTS").get(0).id();
            long busy = catalog.reader().findDatasets("db:hatchery/PUBLIC.BUSY_TANKS").get(0).id();
            assertThat(catalog.reader().owners().ownersOf(fry, null)).extracting(o -> o.name() + " | " + o.reason())
                    .containsExactly("hatchery-crew | headwater.owners line 1: public/ (folder public)");
            assertThat(catalog.reader().owners().ownersOf(busy, null)).extracting(o -> o.name() + " | " + o.reason())
                    .containsExactly("Tilly Brook | headwater.owners line 2: public/busy_tanks");
        }
    }
}
