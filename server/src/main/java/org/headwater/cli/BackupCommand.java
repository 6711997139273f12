package org.headwater.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.headwater.ops.H2Backup;
import org.headwater.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater backup FILE}: a consistent copy of the embedded store in a zip file. */
@Command(name = "backup", mixinStandardHelpOptions = true,
        description = {"Copy the embedded catalog database to a consistent zip file (H2's BACKUP TO); stop",
                "'serve' first, H2 lets one process open the file. The search index is not copied: restore rebuilds it.",
                "For a PostgreSQL store use pg_dump instead (see README)."})
final class BackupCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "FILE", description = "The zip file to write.")
    Path file;

    @Option(names = "--force", description = "Replace FILE if it exists.")
    boolean force;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        try (Store store = Store.open(catalog.storeConfig())) {
            H2Backup.backup(store, file, force);
        } catch (H2Backup.RefusedException e) {
            throw new Problems.UsageProblem(e.getMessage());
        }
        spec.commandLine().getOut().println("Catalog backed up to " + file.toAbsolutePath().normalize());
        spec.commandLine().getOut().flush();
        return Main.OK;
    }
}
