package org.headwater.cli;

import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.search.SearchHit;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater search TEXT}: finds datasets and scripts by name, path, column or description. */
@Command(name = "search", mixinStandardHelpOptions = true,
        description = {"Find datasets and scripts by words of their names, paths, columns and descriptions.",
                "With --json, prints a JSON array of hits, best first."})
final class SearchCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "TEXT", description = "Words to look for.")
    List<String> words;

    @Option(names = "--kind", paramLabel = "KIND", description = "Only this kind: file, file_set, table, view, figure, other, script.")
    String kind;

    @Option(names = "--limit", paramLabel = "N", defaultValue = "20", description = "Most hits to show (default ${DEFAULT-VALUE}).")
    int limit;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        if (limit < 1 || limit > 1000) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(), "--limit must be between 1 and 1000");
        }
        List<SearchHit> hits;
        try (Catalog open = catalog.open()) {
            hits = open.index().search(String.join(" ", words), kind, limit);
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, hits);
        } else if (hits.isEmpty()) {
            out.println("Nothing matches. Try fewer words, or 'headwater harvest PATH' first.");
        } else {
            for (SearchHit hit : hits) {
                out.printf("%-7s %-60s %s%n", hit.kind(), hit.name(), hit.format() == null ? "" : hit.format());
            }
        }
        out.flush();
        return Main.OK;
    }
}
