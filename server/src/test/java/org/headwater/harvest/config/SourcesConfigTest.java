package org.headwater.harvest.config;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowable;

import java.net.URI;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Optional;
import org.headwater.harvest.objectstore.ObjectStoreSettings;
import org.junit.jupiter.api.Test;

class SourcesConfigTest {
    private static final Path EXAMPLE = Path.of("../examples/sources/quillwater-sources.yaml");

    @Test
    void theExampleFileDescribesAFolderABucketPrefixAndADatabase() throws Exception {
        SourcesConfig config = SourcesConfig.read(EXAMPLE);
        assertThat(config.sources()).extracting(SourceSpec::name, SourceSpec::kind).containsExactly(
                org.assertj.core.groups.Tuple.tuple("lab-workspace", "folder"),
                org.assertj.core.groups.Tuple.tuple("sediment-archive", "s3"),
                org.assertj.core.groups.Tuple.tuple("survey-db", "database"));
        // common practice, no source: 6h, 1h30m and 1d are 21,600, 5,400 and 86,400 seconds.
        assertThat(config.sources()).extracting(SourceSpec::every).containsExactly(Optional.of(Duration.ofSeconds(21_600)),
                Optional.of(Duration.ofSeconds(5_400)), Optional.of(Duration.ofSeconds(86_400)));

        var folder = (SourceSpec.Folder) config.sources().get(0);
        assertThat(folder.path()).isEqualTo(EXAMPLE.toAbsolutePath().normalize().getParent().resolve("../quillwater-lab").normalize());
        assertThat(folder.sampling()).isFalse();
        // expected: java.nio.file.FileSystem#getPathMatcher: "**" crosses directory boundaries.
        assertThat(folder.filter().selects("notebooks/drift/a.ipynb")).isFalse();
        assertThat(folder.filter().selects("field/2026/tides.csv")).isTrue();

        ObjectStoreSettings s3 = ((SourceSpec.ObjectStorePrefix) config.sources().get(1)).settings();
        assertThat(s3.bucket()).isEqualTo("quillwater-sediment");
        assertThat(s3.prefix()).isEqualTo("cores/");
        assertThat(s3.endpoint()).isEqualTo(URI.create("http://127.0.0.1:9000"));
        assertThat(s3.pathStyle()).isTrue();
        assertThat(s3.accessKeyEnv()).isEqualTo("QUILLWATER_S3_KEY_ID");
        assertThat(s3.secretKeyEnv()).isEqualTo("QUILLWATER_S3_SECRET");
        assertThat(s3.sampleBytes()).isEqualTo(128 * 1024);
        assertThat(s3.maxAttempts()).isEqualTo(5);
        var filter = ((SourceSpec.ObjectStorePrefix) config.sources().get(1)).filter();
        // expected: java.nio.file.FileSystem#getPathMatcher: "*" stays within one name, "**" does not.
        assertThat(filter.selects("2026/core-7.parquet")).isTrue();
        assertThat(filter.selects("tables/sieves/_delta_log/00000000000000000000.json")).isTrue();
        assertThat(filter.selects("2026/core-7.txt")).isFalse();

        var db = ((SourceSpec.Database) config.sources().get(2)).source();
        assertThat(db.jdbcUrl()).isEqualTo("jdbc:postgresql://127.0.0.1:5432/quillwater_surveys");
        assertThat(db.user()).isEqualTo("catalog_reader");
        assertThat(db.passwordEnv()).isEqualTo("QUILLWATER_DB_PASSWORD");
        assertThat(db.include()).containsExactly("public.*");
        assertThat(db.exclude()).containsExactly("public.tmp_*");
        assertThat(db.sampling()).isFalse();
        // Relative to the sources file, like a folder's path.
        assertThat(db.ownersFile()).isEqualTo(EXAMPLE.toAbsolutePath().getParent().resolve("survey-db.owners").normalize());
        assertThat(db.ownersFile()).isRegularFile();
    }

    @Test
    void samplingIsOffUnlessASourceTurnsItOn() {
        SourcesConfig config = SourcesConfig.parse("""
                sources:
                  - {name: a, kind: folder, path: /tmp/a}
                  - {name: b, kind: folder, path: /tmp/b, sampling: true}
                """, null, "test");
        assertThat(config.sources()).extracting(s -> ((SourceSpec.Folder) s).sampling()).containsExactly(false, true);
    }

    @Test
    void aSecretWrittenIntoTheFileIsRefusedWithoutRepeatingIt() {
        Throwable e = catchThrowable(() -> SourcesConfig.parse("""
                sources:
                  - name: ledger
                    kind: database
                    jdbc-url: jdbc:postgresql://127.0.0.1/ledger
                    password: kettle-Harbour-99
                  - name: ledger-url
                    kind: database
                    jdbc-url: jdbc:postgresql://127.0.0.1/ledger?user=r&password=kettle-Harbour-99
                  - name: drop
                    kind: s3
                    url: s3://drop/
                    secret-key: kettle-Harbour-99
                """, null, "sources.yaml"));
        assertThat(e).isInstanceOf(ConfigException.class).hasMessage("""
                sources.yaml has 3 problems:
                  source 1 (ledger): 'password' would put a secret in the file; name the environment variable that holds it with 'password-env'
                  source 2 (ledger-url): 'jdbc-url' must not hold a password; name its variable in 'password-env'
                  source 3 (drop): 'secret-key' would put a secret in the file; name the environment variable that holds it with 'secret-key-env'""");
        assertThat(e.getMessage()).doesNotContain("kettle-Harbour-99");
    }

    @Test
    void everyProblemIsListedWithTheEntryItIsIn() {
        Throwable e = catchThrowable(() -> SourcesConfig.parse("""
                sources:
                  - {name: tides, kind: folder, path: a, every: fortnightly}
                  - {name: tides, kind: folder, path: b}
                  - {name: gauges, kind: ftp, url: x}
                  - {name: buoys, kind: s3, url: "https://buoys", colour: blue}
                  - {name: depth, kind: s3, url: "s3://depth/", include: "[unclosed"}
                """, null, "sources.yaml"));
        assertThat(e).isInstanceOf(ConfigException.class);
        assertThat(e.getMessage().lines().toList()).containsExactly(
                "sources.yaml has 6 problems:",
                "  source 1 (tides): 'every': 'fortnightly' is not a schedule like 30m, 6h, 1h30m or 1d",
                "  source 2 (tides): the name 'tides' is used twice",
                "  source 3 (gauges): 'kind' must be one of folder, s3, database",
                "  source 4 (buoys): unknown key 'colour' for kind s3",
                "  source 4 (buoys): 'url': Not an s3://bucket/prefix URL: https://buoys",
                "  source 5 (depth): " + globError("[unclosed"));
    }

    private static String globError(String glob) {
        try {
            org.headwater.harvest.NameFilter.of(List.of(glob), List.of());
            throw new AssertionError("expected a bad glob");
        } catch (IllegalArgumentException e) {
            return e.getMessage();
        }
    }
}
