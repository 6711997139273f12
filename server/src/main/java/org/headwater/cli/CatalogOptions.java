package org.headwater.cli;

import java.nio.file.Path;
import java.time.Clock;
import org.headwater.Catalog;
import org.headwater.store.StoreConfig;
import picocli.CommandLine.Option;

/** The options every command shares: the catalog directory, and optionally a database server as the store. */
final class CatalogOptions {
    @Option(names = "--data-dir", paramLabel = "DIR", defaultValue = ".headwater",
            description = "Catalog directory (database and search index). Default: ${DEFAULT-VALUE}, relative to"
                    + " the current directory.")
    Path dataDir;

    @Option(names = "--store-url", paramLabel = "JDBC-URL",
            description = "Keep the catalog in this database instead of the H2 file in --data-dir, for example"
                    + " jdbc:postgresql://127.0.0.1:5432/catalog (the search index stays in --data-dir).")
    String storeUrl;

    @Option(names = "--store-user", paramLabel = "USER", description = "Database user for --store-url.")
    String storeUser;

    @Option(names = "--store-password-env", paramLabel = "VARIABLE",
            description = "Name of the environment variable that holds the database password (the password"
                    + " itself is never an option, so it stays out of process lists and shell history).")
    String storePasswordEnv;

    Catalog open() {
        return Catalog.open(dataDir, storeConfig(), Clock.systemUTC());
    }

    StoreConfig storeConfig() {
        if (storeUrl == null) {
            if (storeUser != null || storePasswordEnv != null) {
                throw new Problems.UsageProblem("--store-user and --store-password-env need --store-url");
            }
            return StoreConfig.embedded(dataDir);
        }
        String password = "";
        if (storePasswordEnv != null) {
            password = System.getenv(storePasswordEnv);
            if (password == null) {
                throw new Problems.UsageProblem("the environment variable " + storePasswordEnv
                        + " named by --store-password-env is not set");
            }
        }
        return new StoreConfig(storeUrl, storeUser, password);
    }

    /** Where the catalog lives, for messages: never the password. */
    String describe() {
        return storeUrl == null ? dataDir.toAbsolutePath().normalize().toString() : storeConfig().redactedUrl();
    }
}
