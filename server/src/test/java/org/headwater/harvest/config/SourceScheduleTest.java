package org.headwater.harvest.config;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;
import org.headwater.Catalog;
import org.headwater.testing.DatasetLookup;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SourceScheduleTest {
    @TempDir
    Path temp;

    @Test
    void aScheduledSourceIsHarvestedAgainAfterItsIntervalAndAnUnscheduledOneIsNot() throws Exception {
        Path tides = Files.createDirectories(temp.resolve("tides"));
        Files.writeString(tides.resolve("levels.csv"), "gauge,level_m\nA,1.5\n");
        Path quay = Files.createDirectories(temp.resolve("quay"));
        Files.writeString(quay.resolve("berths.csv"), "berth\nN1\n");
        SourcesConfig config = SourcesConfig.parse("""
                sources:
                  - {name: tides, kind: folder, path: %s, every: 1s}
                  - {name: quay, kind: folder, path: %s}
                """.formatted(tides, quay), null, "test");
        List<SourceRunner.Outcome> outcomes = new CopyOnWriteArrayList<>();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            try (SourceSchedule schedule = new SourceSchedule()) {
                int scheduled = schedule.start(config, new SourceRunner(catalog, DatabaseHarvests.NONE, name -> null),
                        outcomes::add);
                assertThat(scheduled).isEqualTo(1);
                // Bounded wait: two runs of a 1 s schedule take a little over 2 s; give up after 30 s.
                long deadline = System.nanoTime() + 30_000_000_000L;
                while (outcomes.size() < 2 && System.nanoTime() < deadline) {
                    Thread.sleep(50);
                }
            }
            assertThat(outcomes.size()).isGreaterThanOrEqualTo(2);
            assertThat(outcomes).extracting(SourceRunner.Outcome::source).containsOnly("tides");
            assertThat(outcomes).extracting(SourceRunner.Outcome::status).containsOnly("ok");
            // The second run found the file unchanged.
            assertThat(outcomes.get(1).summary().filesUnchanged()).isEqualTo(1);
            assertThat(DatasetLookup.dataset(catalog, tides.toRealPath().resolve("levels.csv").toUri().toString()).present())
                    .isTrue();
            assertThat(DatasetLookup.datasetNames(catalog, quay.toRealPath().toUri().toString())).isEmpty();
        }
    }
}
