package org.headwater.store;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class StoreTest {

    @TempDir
    Path temp;

    @Test
    void theLatestMigrationConstantNamesTheNewestMigrationFile() throws IOException {
        Path folder = Workspaces.repoRoot().resolve("server/src/main/resources/db/migration");
        Pattern version = Pattern.compile("V(\\d+)__.*\\.sql");
        int newest;
        try (Stream<Path> files = Files.list(folder)) {
            newest = files.map(f -> version.matcher(f.getFileName().toString())).filter(Matcher::matches)
                    .mapToInt(m -> Integer.parseInt(m.group(1))).max().orElseThrow();
        }
        assertThat(Store.LATEST_MIGRATION).isEqualTo(Integer.toString(newest));
    }

    @Test
    void reopeningAMigratedCatalogKeepsItsContentAndSchemaHistory() {
        StoreConfig config = StoreConfig.embedded(temp);
        try (Store store = Store.open(config)) {
            store.dsl().insertInto(org.headwater.store.schema.Tables.OWNER)
                    .set(org.headwater.store.schema.Tables.OWNER.NAME, "hydro-team")
                    .set(org.headwater.store.schema.Tables.OWNER.KIND, "team").execute();
        }
        try (Store store = Store.open(config)) {
            List<String> names = store.dsl().select(org.headwater.store.schema.Tables.OWNER.NAME)
                    .from(org.headwater.store.schema.Tables.OWNER).fetch(0, String.class);
            assertThat(names).containsExactly("hydro-team");
            // Reopening must not apply migration 1 a second time.
            int applied = store.dsl().fetchCount(org.jooq.impl.DSL.table("\"flyway_schema_history\""),
                    org.jooq.impl.DSL.condition("\"version\" = '1'"));
            assertThat(applied).isEqualTo(1);
        }
    }
}
