package org.headwater.cli;

import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.config.ConfigException;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourcesConfig;
import org.headwater.harvest.jdbc.DatabaseSource;
import org.headwater.ingest.HarvestJournal;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater harvest PATH...}, {@code --jdbc URL} or {@code --config FILE}: reads sources into the catalog. */
@Command(name = "harvest", mixinStandardHelpOptions = true,
        description = {"Harvest local folders, or the sources a sources file lists, into the catalog: every file",
                "becomes a dataset or a script, every table folder one dataset.",
                "Unchanged files (same size and modification time) are not read again.",
                "Exit code 1 when some files could not be read or a source failed; the rest is kept.",
                "With --jdbc URL, harvest a database instead: schemas, tables, views, columns, keys, view lineage."})
final class HarvestCommand implements Callable<Integer> {
    @Parameters(arity = "0..*", paramLabel = "PATH", description = "Folders to harvest.")
    List<Path> paths = new ArrayList<>();

    @Option(names = "--config", paramLabel = "FILE", description = "A sources file (YAML) listing what to harvest.")
    Path config;

    @Option(names = "--source", paramLabel = "NAME", description = "With --config: harvest only this source.")
    String source;

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

    @Option(names = "--sampling", description = {"Keep the smallest and largest value of number and date columns.",
            "Off by default: they are cell values, and can say something about people."})
    boolean sampling;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        if (config != null) {
            if (!paths.isEmpty() || jdbcUrl != null) {
                throw new Problems.UsageProblem("give either folders, --jdbc or --config, not more than one");
            }
            return harvestConfigured();
        }
        if (source != null) {
            throw new Problems.UsageProblem("--source needs --config");
        }
        if (paths.isEmpty() && jdbcUrl == null) {
            throw new Problems.UsageProblem("name at least one folder, a database with --jdbc, or a sources file with --config");
        }
        if (jdbcUrl == null && (user != null || passwordEnv != null || name != null)) {
            throw new Problems.UsageProblem("--user, --password-env and --name go with --jdbc");
        }
        List<HarvestSummary> summaries = new ArrayList<>();
        try (Catalog open = catalog.open()) {
            for (Path path : paths) {
                summaries.add(open.harvestFolder(path, full, sampling, output.json ? HarvestProgress.NONE
                        : TerminalProgress.forTerminal(path)));
            }
            if (jdbcUrl != null) {
                DatabaseSource db = DatabaseSource.of(name != null ? name : DatabaseSource.defaultName(jdbcUrl), jdbcUrl,
                        user, passwordEnv);
                summaries.add(open.harvestDatabase(db, HarvestProgress.NONE));
            }
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, summaries.size() == 1 ? summaries.get(0) : summaries);
        } else {
            summaries.forEach(s -> print(out, s.root(), s));
            out.flush();
        }
        return summaries.stream().anyMatch(s -> s.errors() > 0 || HarvestJournal.FAILED.equals(s.status()))
                ? Main.PROBLEMS : Main.OK;
    }

    private Integer harvestConfigured() throws Exception {
        SourcesConfig sources;
        try {
            sources = SourcesConfig.read(config);
        } catch (NoSuchFileException e) {
            throw new Problems.UsageProblem("no such sources file: " + config);
        } catch (ConfigException e) {
            throw new Problems.UsageProblem(e.getMessage());
        }
        List<SourceRunner.Outcome> outcomes;
        try (Catalog open = catalog.open()) {
            SourceRunner runner = new SourceRunner(open, Databases.of(open), System::getenv);
            try {
                outcomes = runner.run(sources, source, full, s -> HarvestProgress.NONE);
            } catch (ConfigException e) {
                throw new Problems.UsageProblem(e.getMessage());
            }
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, outcomes);
        } else {
            for (SourceRunner.Outcome o : outcomes) {
                if (o.failed()) {
                    out.printf("%s (%s): FAILED (harvest %d): %s%n", o.source(), o.kind(), o.harvestId(), o.message());
                } else {
                    print(out, o.source() + " (" + o.kind() + ")", o.summary());
                }
            }
            out.flush();
        }
        return outcomes.stream().anyMatch(o -> o.failed() || o.summary().errors() > 0) ? Main.PROBLEMS : Main.OK;
    }

    private static void print(java.io.PrintWriter out, String label, HarvestSummary s) {
        if (s.root().startsWith("jdbc:")) {
            out.printf("%s: %s, %d tables and views, %d changes, %d removed, %d errors in %.1f s%n", label,
                    s.status(), s.datasets(), s.changes(), s.removed(), s.errors(), s.elapsedMillis() / 1000.0);
            s.firstErrors().forEach(e -> out.printf("  %s  %s: %s%n", e.kind(), e.uri(), e.message()));
            return;
        }
        out.printf("%s: %d files (%d datasets, %d scripts), %d unchanged, %d changes, %d removed, %d errors in %.1f s%n",
                label, s.filesSeen(), s.datasets(), s.scripts(), s.filesUnchanged(), s.changes(), s.removed(),
                s.errors(), s.elapsedMillis() / 1000.0);
        s.firstErrors().forEach(e -> out.printf("  %s  %s: %s%n", e.kind(), e.uri(), e.message()));
    }
}
