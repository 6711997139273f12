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
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater harvest PATH...} or {@code headwater harvest --config FILE}: reads sources into the catalog. */
@Command(name = "harvest", mixinStandardHelpOptions = true,
        description = {"Harvest local folders, or the sources a sources file lists, into the catalog: every file",
                "becomes a dataset or a script, every table folder one dataset.",
                "Unchanged files (same size and modification time) are not read again.",
                "Exit code 1 when some files could not be read or a source failed; the rest is kept."})
final class HarvestCommand implements Callable<Integer> {
    @Parameters(arity = "0..*", paramLabel = "PATH", description = "Folders to harvest.")
    List<Path> paths = new ArrayList<>();

    @Option(names = "--config", paramLabel = "FILE", description = "A sources file (YAML) listing what to harvest.")
    Path config;

    @Option(names = "--source", paramLabel = "NAME", description = "With --config: harvest only this source.")
    String source;

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
        if (config != null) {
            if (!paths.isEmpty()) {
                throw new Problems.UsageProblem("give either folders or --config, not both");
            }
            return harvestConfigured();
        }
        if (source != null) {
            throw new Problems.UsageProblem("--source needs --config");
        }
        if (paths.isEmpty()) {
            throw new Problems.UsageProblem("name at least one folder, or a sources file with --config");
        }
        List<HarvestSummary> summaries = new ArrayList<>();
        try (Catalog open = catalog.open()) {
            for (Path path : paths) {
                summaries.add(open.harvestFolder(path, full, output.json ? HarvestProgress.NONE
                        : TerminalProgress.forTerminal(path)));
            }
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, summaries.size() == 1 ? summaries.get(0) : summaries);
        } else {
            summaries.forEach(s -> print(out, s.root(), s));
            out.flush();
        }
        return summaries.stream().anyMatch(s -> s.errors() > 0) ? Main.PROBLEMS : Main.OK;
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
        out.printf("%s: %d files (%d datasets, %d scripts), %d unchanged, %d changes, %d removed, %d errors in %.1f s%n",
                label, s.filesSeen(), s.datasets(), s.scripts(), s.filesUnchanged(), s.changes(), s.removed(),
                s.errors(), s.elapsedMillis() / 1000.0);
        s.firstErrors().forEach(e -> out.printf("  %s  %s: %s%n", e.kind(), e.uri(), e.message()));
    }
}
