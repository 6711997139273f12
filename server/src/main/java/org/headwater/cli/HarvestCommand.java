package org.headwater.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestSummary;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater harvest PATH...}: reads folders into the catalog. */
@Command(name = "harvest", mixinStandardHelpOptions = true,
        description = {"Harvest local folders into the catalog: every file becomes a dataset or a script.",
                "Unchanged files (same size and modification time) are not read again.",
                "Exit code 1 when some files could not be read; they are listed and the rest is kept."})
final class HarvestCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "PATH", description = "Folders to harvest.")
    List<Path> paths;

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
        List<HarvestSummary> summaries = new ArrayList<>();
        try (Catalog open = catalog.open()) {
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
                out.printf("%s: %d files (%d datasets, %d scripts), %d unchanged, %d changes, %d removed, %d errors in %.1f s%n",
                        s.root(), s.filesSeen(), s.datasets(), s.scripts(), s.filesUnchanged(), s.changes(), s.removed(),
                        s.errors(), s.elapsedMillis() / 1000.0);
                s.firstErrors().forEach(e -> out.printf("  %s  %s: %s%n", e.kind(), e.uri(), e.message()));
            }
            out.flush();
        }
        return summaries.stream().anyMatch(s -> s.errors() > 0) ? Main.PROBLEMS : Main.OK;
    }
}
