package org.headwater.harvest.config;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import org.headwater.Catalog;
import org.headwater.checks.Check;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A folder harvested through a sources file reads its freshness policy file, as a plain folder harvest does. */
class ConfiguredFolderPolicyTest {
    @TempDir
    Path temp;

    @Test
    void aConfiguredFolderSourceAppliesItsFreshnessPolicyFile() throws Exception {
        Path hives = Files.createDirectories(temp.resolve("hives"));
        Files.writeString(hives.resolve("frames.csv"), "hive,frames\nH1,8\n");
        Files.writeString(hives.resolve(".headwater-freshness"), "frames.csv  max-age 36h\n");
        SourcesConfig config = SourcesConfig.parse("""
                sources:
                  - {name: hives, kind: folder, path: %s}
                """.formatted(hives), null, "test");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            var outcome = new SourceRunner(catalog, DatabaseHarvests.NONE, name -> null)
                    .run(config, null, false, s -> HarvestProgress.NONE).get(0);
            assertThat(outcome.status()).isEqualTo("ok");
            // The policy is stored in its canonical text (README, "Freshness": policies).
            assertThat(catalog.freshness().evaluate().checks()).extracting(Check::name, Check::policy)
                    .containsExactly(org.assertj.core.groups.Tuple.tuple("frames.csv", "max-age 36h"));
        }
    }
}
