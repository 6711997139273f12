package org.headwater.cli;

import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.search.HitExplanation;
import org.headwater.search.QuerySyntaxException;
import org.headwater.search.SearchHit;
import org.headwater.search.SearchRequest;
import org.headwater.search.SearchResult;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater search TEXT}: finds datasets, columns, scripts and owners. */
@Command(name = "search", mixinStandardHelpOptions = true,
        description = {"Find datasets, columns, scripts and owners by words of their names, paths, columns,",
                "descriptions, docstrings and figure titles. Quote a phrase ('\"monthly summary\"'); narrow with",
                "field=value filters: kind, format, owner, tag, source, fresh (kind=column format=csv fresh=late).",
                "With --json, prints the same object as /api/search."})
final class SearchCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "TEXT", description = "Words, quoted phrases and field=value filters.")
    List<String> words;

    @Option(names = "--kind", paramLabel = "KIND",
            description = "Only this kind: file, file_set, table, view, figure, other, column, script, owner, team.")
    String kind;

    @Option(names = "--limit", paramLabel = "N", defaultValue = "20", description = "Most hits to show (default ${DEFAULT-VALUE}).")
    int limit;

    @Option(names = "--explain", description = "Show why each hit ranked where it did.")
    boolean explain;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        if (limit < 1 || limit > SearchRequest.MAX_SIZE) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(),
                    "--limit must be between 1 and " + SearchRequest.MAX_SIZE);
        }
        // The shell has taken the outer quotes: a phrase is written '"ion balance"'.
        String text = String.join(" ", words);
        SearchResult result;
        try (Catalog open = catalog.open()) {
            result = open.index().search(new SearchRequest(text, kind, 1, limit, explain));
        } catch (QuerySyntaxException e) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(), e.getMessage());
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, result);
            return Main.OK;
        }
        if (result.hits().isEmpty()) {
            out.println("Nothing matches." + (result.suggestion() == null ? " Try fewer words, or 'headwater harvest PATH' first."
                    : " Did you mean: " + result.suggestion()));
        } else {
            if (result.suggestion() != null) {
                out.println("Did you mean: " + result.suggestion());
            }
            for (SearchHit hit : result.hits()) {
                out.printf("%-7s %-60s %s%n", hit.kind(), hit.name(), hit.format() == null ? "" : hit.format());
                if (hit.explain() != null) {
                    HitExplanation e = hit.explain();
                    out.printf("        score %.3f = text %.3f (%s%s) × factor %.3f (uses %d, centrality %.2f)%n", hit.score(),
                            e.text(), e.mode(), e.exactName() ? ", exact name" : "", e.factor(), e.uses(), e.centrality());
                    out.printf("        matched %s%n", String.join(", ", e.matched()));
                }
            }
            out.printf("%d of %s%d%n", result.hits().size(), result.exact() ? "" : "about ", result.total());
            for (Map.Entry<String, Map<String, Integer>> facet : result.facets().entrySet()) {
                if (!facet.getValue().isEmpty()) {
                    out.printf("  %-9s %s%n", facet.getKey(), facet.getValue());
                }
            }
        }
        out.flush();
        return Main.OK;
    }
}
