package org.headwater.cli;

import java.io.PrintWriter;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.impact.ChangeKind;
import org.headwater.impact.ImpactAnalysis;
import org.headwater.lineage.LineageGraph;
import org.headwater.impact.ImpactMarkdown;
import org.headwater.impact.ImpactReport;
import org.headwater.lineage.Target;
import org.headwater.lineage.TargetException;
import org.headwater.lineage.Targets;
import org.headwater.store.LabelReader;
import org.headwater.store.OwnerReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater impact TARGET --change KIND}: what a change affects downstream, and whom to tell. */
@Command(name = "impact", mixinStandardHelpOptions = true,
        description = {"Say what a proposed change affects downstream: datasets, columns, scripts, figures and views,",
                "by hop distance, each with its owners to notify and the path that connects it.",
                "--json prints {target, change, title, counts, start_in_cycle, affected: [{name, kind, id, distance,",
                "indirect, uncertain, why, owners, path}]}; --markdown prints text for a review or a ticket."})
final class ImpactCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "TARGET", description = "A dataset, or a column as DATASET.COLUMN.")
    String key;

    @Option(names = "--change", paramLabel = "KIND",
            description = "drop, rename or retype (a column); delete, move or stale (a dataset)."
                    + " Default: drop for a column, delete for a dataset.")
    String change;

    @Option(names = "--as-of", paramLabel = "TIME",
            description = "Answer from the lineage and owners as they were then (2026-03-01 or 2026-03-01T12:00:00Z).")
    String asOf;

    @Option(names = "--markdown", description = "Print Markdown (counts, owners, one table per distance).")
    boolean markdown;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        ImpactReport report;
        try (Catalog open = catalog.open()) {
            OwnerReader owners = new OwnerReader(open.store());
            LineageGraph graph = asOf == null ? open.lineage() : LineageGraph.loadAsOf(open.store(), CliTimes.parse(asOf));
            try {
                Target target = new Targets(open.reader(), owners, graph).resolve(key);
                ChangeKind kind = change != null ? ChangeKind.of(change)
                        : target.namesColumn() ? ChangeKind.DROP : ChangeKind.DELETE;
                report = new ImpactAnalysis(graph, new LabelReader(open.store()), owners).report(target, kind);
            } catch (TargetException | IllegalArgumentException e) {
                throw new Problems.UsageProblem(e.getMessage());
            }
        }
        PrintWriter out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, report);
        } else if (markdown) {
            out.print(ImpactMarkdown.render(report));
        } else {
            var c = report.counts();
            out.printf("%s%n%d affected: %d datasets, %d columns, %d scripts, %d figures, %d views (%d indirect, %d uncertain);"
                            + " %d owners to notify%n", report.title(), c.total(), c.datasets(), c.columns(), c.scripts(),
                    c.figures(), c.views(), c.indirect(), c.uncertain(), c.owners());
            for (ImpactReport.Affected a : report.affected()) {
                out.printf("  %d  %s (%s%s%s): %s%n", a.distance(), a.name(), a.kind(), a.indirect() ? ", indirect" : "",
                        a.uncertain() ? ", uncertain" : "", a.why());
                if (!a.owners().isEmpty()) {
                    out.printf("       tell: %s%n", String.join(", ", a.owners().stream()
                            .map(o -> o.name() + (o.suggested() ? " (suggested)" : "")).toList()));
                }
            }
        }
        out.flush();
        return Main.OK;
    }
}
