package org.headwater.harvest.objectstore;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.DatasetLookup.columns;
import static org.headwater.testing.DatasetLookup.dataset;

import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.config.DatabaseHarvests;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourcesConfig;
import org.headwater.testing.S3TestServer;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Object URIs name the store as well as the bucket, so buckets of the same name on two stores stay apart. */
class ObjectUrisTest {
    @TempDir
    Path temp;

    @Test
    void twoStoresWithABucketOfTheSameNameGiveTwoDatasets() throws Exception {
        try (S3TestServer east = S3TestServer.start(); S3TestServer west = S3TestServer.start();
                Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            for (S3TestServer s : List.of(east, west)) {
                s.createBucket("shore-log");
            }
            east.put("shore-log", "counts.csv", "beach,gulls\nA,12\n".getBytes(StandardCharsets.UTF_8));
            west.put("shore-log", "counts.csv", "beach,terns,plovers\nB,3,1\n".getBytes(StandardCharsets.UTF_8));
            SourcesConfig config = SourcesConfig.parse("sources:\n" + source("east", east) + source("west", west),
                    null, "test");
            var env = Map.of("KEY", S3TestServer.ACCESS_KEY, "SECRET", S3TestServer.SECRET_KEY);
            var outcomes = new SourceRunner(catalog, DatabaseHarvests.NONE, env::get).run(config, null, false,
                    s -> HarvestProgress.NONE);
            assertThat(outcomes).extracting(SourceRunner.Outcome::status).containsExactly("ok", "ok");

            // expected: Amazon S3 User Guide, "path-style requests": http://endpoint/bucket/key addresses one object.
            var a = dataset(catalog, east.endpoint() + "/shore-log/counts.csv");
            var b = dataset(catalog, west.endpoint() + "/shore-log/counts.csv");
            assertThat(a.id()).isNotEqualTo(b.id());
            assertThat(columns(a)).containsExactly("beach text", "gulls integer");
            assertThat(columns(b)).containsExactly("beach text", "terns integer", "plovers integer");
            assertThat(a.source()).isEqualTo("east");
            assertThat(b.source()).isEqualTo("west");
        }
    }

    @Test
    void onAwsItselfTheUriIsTheS3Form() {
        // common practice, no source: s3://bucket/key is how tools name an object on AWS S3.
        assertThat(ObjectStoreSettings.ofUrl("s3://shore-log/raw/").objectUri("raw/counts.csv"))
                .isEqualTo("s3://shore-log/raw/counts.csv");
        assertThat(ObjectStoreSettings.ofUrl("s3://shore-log/raw/")
                .withEndpoint(URI.create("https://store.example.test:9443/base/"), true).objectUri("raw/a b.csv"))
                .isEqualTo("https://store.example.test:9443/base/shore-log/raw/a%20b.csv");
    }

    private static String source(String name, S3TestServer server) {
        return "  - name: " + name + "\n    kind: s3\n    url: s3://shore-log/\n    endpoint: " + server.endpoint()
                + "\n    path-style: true\n    access-key-env: KEY\n    secret-key-env: SECRET\n";
    }
}
