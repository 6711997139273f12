package org.headwater.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.ops.H2Backup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater restore FILE}: a backup back into a catalog directory, with the index rebuilt. */
@Command(name = "restore", mixinStandardHelpOptions = true,
        description = {"Put a backup made by 'headwater backup' into --data-dir and rebuild the search index.",
                "Refuses a directory that already holds a catalog unless --force."})
final class RestoreCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "FILE", description = "The zip file 'headwater backup' wrote.")
    Path file;

    @Option(names = "--force", description = "Replace the catalog in --data-dir.")
    boolean force;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        if (catalog.storeUrl != null) {
            throw new Problems.UsageProblem("restore fills the embedded H2 store; for PostgreSQL use pg_restore"
                    + " (see README)");
        }
        try {
            H2Backup.restore(file, catalog.dataDir, force);
        } catch (H2Backup.RefusedException e) {
            throw new Problems.UsageProblem(e.getMessage());
        }
        int documents;
        try (Catalog open = catalog.open()) {
            open.index().rebuild();
            documents = open.index().documentCount();
        }
        spec.commandLine().getOut().printf("Catalog restored into %s; search index rebuilt (%d documents)%n",
                catalog.dataDir.toAbsolutePath().normalize(), documents);
        spec.commandLine().getOut().flush();
        return Main.OK;
    }
}
