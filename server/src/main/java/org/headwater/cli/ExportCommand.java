package org.headwater.cli;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.concurrent.Callable;
import org.headwater.ops.CatalogExport;
import org.headwater.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code headwater export --catalog FILE.json}: the whole catalog, history included, as one JSON document. */
@Command(name = "export", mixinStandardHelpOptions = true,
        description = {"Write the whole catalog (every table, history and change log included) as one JSON",
                "document; 'headwater import' reads it into a new catalog. Format: README, 'Export and import'."})
final class ExportCommand implements Callable<Integer> {
    @Option(names = "--catalog", paramLabel = "FILE", required = true, description = "The JSON file to write.")
    Path file;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        Path target = file.toAbsolutePath().normalize();
        Files.createDirectories(target.getParent());
        // Written beside the target and moved at the end: a failed export leaves no half file behind.
        Path partial = Files.createTempFile(target.getParent(), ".export-", ".json");
        long rows;
        try (Store store = Store.open(catalog.storeConfig()); OutputStream out = Files.newOutputStream(partial)) {
            rows = CatalogExport.write(store, out);
        } catch (IOException | RuntimeException e) {
            Files.deleteIfExists(partial);
            throw e;
        }
        Files.move(partial, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        spec.commandLine().getOut().printf("Exported %d rows to %s%n", rows, target);
        spec.commandLine().getOut().flush();
        return Main.OK;
    }
}
