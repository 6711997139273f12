package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A graph loaded with lineage and then grown by many datasets that nothing links: walks from the new ones
 * answer (found when a harvest of 300 new files while the server ran made {@code /api/freshness} fail).
 */
class GraphGrowthTest {
    @TempDir
    Path temp;

    Catalog catalog;

    @AfterEach
    void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    @Test
    void aDatasetAddedAfterLoadingWithNoLinksHasNoUpstreamAndNoDownstream() throws Exception {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
        Path notes = Files.createDirectories(temp.resolve("notes"));
        for (int i = 0; i < 300; i++) {
            Files.writeString(notes.resolve("note_" + i + "_a.csv"), "k,v\n" + i + ",1\n", StandardCharsets.UTF_8);
        }
        catalog.harvestFolder(notes, false, HarvestProgress.NONE);
        long last = catalog.reader().findDatasets("note_299_a.csv").stream()
                .filter(d -> d.name().equals("note_299_a.csv")).findFirst().orElseThrow().id();
        // a file nothing reads or writes has no lineage either way (common practice, no source)
        assertThat(catalog.lineage().upstream(last, Query.everything()).isEmpty()).isTrue();
        assertThat(catalog.lineage().downstream(last, Query.everything()).isEmpty()).isTrue();
        assertThat(catalog.freshness().evaluate(last)).isPresent();
    }
}
