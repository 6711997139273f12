package org.headwater.cli;

import java.nio.file.Path;
import org.headwater.Catalog;
import picocli.CommandLine.Option;

/** The {@code --data-dir} option every command shares. */
final class CatalogOptions {
    @Option(names = "--data-dir", paramLabel = "DIR", defaultValue = ".headwater",
            description = "Catalog directory (database and search index). Default: ${DEFAULT-VALUE}, relative to"
                    + " the current directory.")
    Path dataDir;

    Catalog open() {
        return Catalog.open(dataDir);
    }
}
