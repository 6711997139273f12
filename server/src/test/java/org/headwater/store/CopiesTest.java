package org.headwater.store;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.http.ApiServer;
import org.headwater.store.Views.DatasetSummary;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A copied or renamed file is recognised as the same content as its original, by SHA-256. */
class CopiesTest {
    @TempDir
    Path temp;

    @Test
    void aCopyUnderAnotherNameIsListedAsTheSameContentAndAnEditedCopyIsNot() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path original = lake.resolve("tallies.csv");
        Files.writeString(original, "plot,count\n1,14\n2,9\n");
        Path share = Files.createDirectories(lake.resolve("to_share"));
        Files.copy(original, share.resolve("tallies_for_review.csv"));
        Files.writeString(share.resolve("tallies_edited.csv"), "plot,count\n1,14\n2,10\n");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            Instant afterFirst = Instant.now();
            long id = catalog.reader().findDatasets("tallies.csv").get(0).id();
            assertThat(catalog.reader().copiesOf(id, null)).extracting(DatasetSummary::name)
                    .containsExactly("to_share/tallies_for_review.csv");

            var body = HttpClient.newHttpClient().send(HttpRequest.newBuilder(
                    URI.create(server.url() + "api/datasets/" + id + "/copies")).build(), HttpResponse.BodyHandlers.ofString());
            assertThat(body.statusCode()).isEqualTo(200);
            assertThat(new ObjectMapper().readTree(body.body()).get(0).get("name").asText())
                    .isEqualTo("to_share/tallies_for_review.csv");

            // The copy is edited: no longer the same content now, still a copy as of before.
            Thread.sleep(5);
            Files.writeString(share.resolve("tallies_for_review.csv"), "plot,count\n1,15\n2,9\n");
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(catalog.reader().copiesOf(id, null)).isEmpty();
            assertThat(catalog.reader().copiesOf(id, afterFirst)).extracting(DatasetSummary::name)
                    .containsExactly("to_share/tallies_for_review.csv");
        }
    }
}
