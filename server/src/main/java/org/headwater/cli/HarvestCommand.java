package org.headwater.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.jdbc.DatabaseSource;
import org.headwater.ingest.HarvestJournal;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater harvest PATH...} or {@code --jdbc URL}: reads folders or a database into the catalog. */
@Command(name = "harvest", mixinStandardHelpOptions = true,
        description = {"Harvest local folders into the catalog: every file becomes a dataset or a script.",
                "Unchanged files (same size and modification time) are not read again.",
                "Exit code 1 when some files could not be read; they are listed and the rest is kept.",
                "With --jdbc URL, harvest a database instead: schemas, tables, views, columns, keys, view lineage."})
final class HarvestCommand implements Callable<Integer> {
    @Parameters(arity = "0..*", paramLabel = "PATH", description = "Folders to harvest.")
    List<Path> paths = new ArrayList<>();

    @Option(names = "--jdbc", paramLabel = "URL", description = "Harvest the database at this JDBC URL (H2, PostgreSQL).")
    String jdbcUrl;

    @Option(names = "--user", paramLabel = "USER", description = "The database user (with --jdbc).")
    String user;

    @Option(names = "--password-env", paramLabel = "VAR",
            description = "The environment variable that holds the database password (with --jdbc).")
    String passwordEnv;

    @Option(names = "--name", paramLabel = "NAME", description = "The source's name in URIs (with --jdbc; default: the database's name).")
    String name;

    @Option(names = "--full", description = "Read every file again, even those that look unchanged.")
    boolean full;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        if (paths.isEmpty() && jdbcUrl == null) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(), "Name a folder to harvest, or --jdbc URL.");
        }
        if (jdbcUrl == null && (user != null || passwordEnv != null || name != null)) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(),
                    "--user, --password-env and --name go with --jdbc.");
        }
        List<HarvestSummary> summaries = new ArrayList<>();
        try (Catalog open = catalog.open()) {
            if (jdbcUrl != null) {
                DatabaseSource source = DatabaseSource.of(name != null ? name : DatabaseSource.defaultName(jdbcUrl), jdbcUrl,
                        user, passwordEnv);
                summaries.add(open.harvestDatabase(source, org.headwater.harvest.HarvestProgress.NONE));
            }
            for (Path path : paths) {
                summaries.add(open.harvestFolder(path, full, output.json ? org.headwater.harvest.HarvestProgress.NONE
                        : TerminalProgress.forTerminal(path)));
            }
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, summaries.size() == 1 ? summaries.get(0) : summaries);
        } else {
            for (HarvestSummary s : summaries) {
                if (s.root().startsWith("jdbc:")) {
                    out.printf("%s: %s, %d tables and views, %d changes, %d removed, %d errors in %.1f s%n", s.root(),
                            s.status(), s.datasets(), s.changes(), s.removed(), s.errors(), s.elapsedMillis() / 1000.0);
                    s.firstErrors().forEach(e -> out.printf("  %s  %s: %s%n", e.kind(), e.uri(), e.message()));
                    continue;
                }
                out.printf("%s: %d files (%d datasets, %d scripts), %d unchanged, %d changes, %d removed, %d errors in %.1f s%n",
                        s.root(), s.filesSeen(), s.datasets(), s.scripts(), s.filesUnchanged(), s.changes(), s.removed(),
                        s.errors(), s.elapsedMillis() / 1000.0);
                s.firstErrors().forEach(e -> out.printf("  %s  %s: %s%n", e.kind(), e.uri(), e.message()));
            }
            out.flush();
        }
        return summaries.stream().anyMatch(s -> s.errors() > 0 || HarvestJournal.FAILED.equals(s.status()))
                ? Main.PROBLEMS : Main.OK;
    }
}
