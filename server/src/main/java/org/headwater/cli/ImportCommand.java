package org.headwater.cli;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.ops.CatalogImport;
import org.headwater.store.Store;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater import FILE.json}: an export into a new, empty catalog. */
@Command(name = "import", mixinStandardHelpOptions = true,
        description = {"Read a document written by 'headwater export' into an empty catalog (all of it or,",
                "on any problem, nothing), then rebuild the search index."})
final class ImportCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "FILE", description = "The JSON file 'headwater export' wrote.")
    Path file;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        if (!Files.isRegularFile(file)) {
            throw new Problems.UsageProblem("no such file: " + file);
        }
        long rows;
        try (Store store = Store.open(catalog.storeConfig()); InputStream in = Files.newInputStream(file)) {
            rows = CatalogImport.read(store, in);
        } catch (CatalogImport.ImportException e) {
            throw new Problems.UsageProblem(e.getMessage());
        }
        int documents;
        try (Catalog open = catalog.open()) {
            open.index().rebuild();
            documents = open.index().documentCount();
        }
        spec.commandLine().getOut().printf("Imported %d rows; search index rebuilt (%d documents)%n", rows, documents);
        spec.commandLine().getOut().flush();
        return Main.OK;
    }
}
