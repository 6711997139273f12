package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.Cli.run;

import java.nio.file.Files;
import java.nio.file.Path;
import org.headwater.testing.Cli.Ran;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class HarvestConfigCommandTest {
    @TempDir
    Path temp;



    @Test
    void aSourcesFileHarvestsEachSourceAndAFailedOneIsReportedWithoutStoppingTheRest() throws Exception {
        Path quay = Files.createDirectories(temp.resolve("quay"));
        Files.writeString(quay.resolve("berths.csv"), "berth,length_m\nN1,120\nN2,95\n");
        Files.writeString(quay.resolve("scratch.tmp"), "not harvested: excluded\n");
        Path config = temp.resolve("sources.yaml");
        Files.writeString(config, """
                sources:
                  - name: gone-quay
                    kind: folder
                    path: no-such-quay
                  - name: quay
                    kind: folder
                    path: quay
                    exclude: ["*.tmp"]
                """);
        String data = temp.resolve("catalog").toString();

        Ran all = run("harvest", "--config", config.toString(), "--data-dir", data);
        // Exit code 1 when a source failed (the command's documented contract); the other source still ran.
        assertThat(all.exit()).isEqualTo(Main.PROBLEMS);
        assertThat(all.out().lines().toList()).hasSize(2);
        assertThat(all.out().lines().toList().get(0)).isEqualTo("gone-quay (folder): FAILED (harvest 1): "
                + temp.resolve("no-such-quay") + ": not a directory");
        assertThat(all.out().lines().toList().get(1)).startsWith("quay (folder): 1 files (1 datasets, 0 scripts), 0 unchanged");

        Ran one = run("harvest", "--config", config.toString(), "--source", "quay", "--data-dir", data);
        assertThat(one.exit()).isEqualTo(Main.OK);
        assertThat(one.out()).startsWith("quay (folder): 1 files (1 datasets, 0 scripts), 1 unchanged, 0 changes");

        Ran unknown = run("harvest", "--config", config.toString(), "--source", "pier", "--data-dir", data);
        assertThat(unknown.exit()).isEqualTo(Main.USAGE);
        assertThat(unknown.err()).contains("No source named 'pier' in the file; it has [gone-quay, quay]");
    }
}
