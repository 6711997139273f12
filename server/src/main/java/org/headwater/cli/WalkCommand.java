package org.headwater.cli;

import java.io.PrintWriter;
import java.time.Instant;
import java.util.Locale;
import java.util.concurrent.Callable;
import java.util.stream.Collectors;
import org.headwater.Catalog;
import org.headwater.lineage.LineageGraph;
import org.headwater.lineage.Neighbours;
import org.headwater.lineage.Query;
import org.headwater.lineage.QueryWords;
import org.headwater.lineage.Step;
import org.headwater.lineage.Target;
import org.headwater.lineage.TargetException;
import org.headwater.lineage.Targets;
import org.headwater.store.LabelReader;
import org.headwater.store.OwnerReader;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** What {@code upstream} and {@code downstream} share: the target, the filters, and how results print. */
abstract class WalkCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "TARGET",
            description = "A dataset (path, URI, name, or a partition of a set) or a column: DATASET.COLUMN.")
    String key;

    @Option(names = "--depth", paramLabel = "N", description = "At most N hops away (default: any).")
    String depth;

    @Option(names = "--evidence", paramLabel = "LIST",
            description = "Follow only edges with this evidence: static, runtime, declared, inferred (comma-separated).")
    String evidence;

    @Option(names = "--min-confidence", paramLabel = "X", description = "Follow only edges with confidence X or more (0 to 1).")
    String minConfidence;

    @Option(names = "--kind", paramLabel = "LIST",
            description = "Report only datasets of these kinds: file, file_set, table, view, figure, other.")
    String kind;

    @Option(names = "--source", paramLabel = "NAME", description = "Report only datasets of these sources (comma-separated).")
    String source;

    @Option(names = "--as-of", paramLabel = "TIME", description = "Answer from the lineage as it was then (2026-03-01 or an ISO instant).")
    String asOf;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    abstract boolean upstream();

    @Override
    public Integer call() {
        Instant when = asOf == null ? null : CliTimes.parse(asOf);
        Neighbours answer;
        try (Catalog open = catalog.open()) {
            LabelReader labels = new LabelReader(open.store());
            LineageGraph graph = when == null ? open.lineage() : LineageGraph.loadAsOf(open.store(), when);
            Target target;
            Query query;
            try {
                target = new Targets(open.reader(), new OwnerReader(open.store()), graph).resolve(key);
                query = QueryWords.parse(depth, evidence, minConfidence, kind, source, labels);
            } catch (TargetException | IllegalArgumentException e) {
                throw new Problems.UsageProblem(e.getMessage());
            }
            answer = Neighbours.of(graph, labels, target, upstream(), query);
        }
        PrintWriter out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, answer);
            return Main.OK;
        }
        out.printf("%s of %s: %d%s%n", answer.direction(), answer.target().label(), answer.count(),
                answer.startInCycle() ? " (it feeds back into itself)" : "");
        for (Neighbours.Neighbour n : answer.results()) {
            out.printf("  %d  %s%s (%s)%s%n", n.distance(), n.name(), n.column() == null ? "" : "." + n.column(), n.kind(),
                    n.indirect() ? " indirect: filters, joins or groups only" : "");
            out.printf("       %s%n", path(n));
        }
        out.flush();
        return Main.OK;
    }

    static String path(Neighbours.Neighbour n) {
        return n.path().stream().map(WalkCommand::hop).collect(Collectors.joining("  ;  "));
    }

    static String hop(Step s) {
        return (s.fromColumn() == null ? s.from() : s.from() + "." + s.fromColumn()) + " -> "
                + (s.toColumn() == null ? s.to() : s.to() + "." + s.toColumn()) + " via "
                + (s.script() != null ? s.script() : s.run() != null ? "run " + s.run() : "no script")
                + String.format(Locale.ROOT, " [%s %.2f%s]", s.evidence(), s.confidence(), s.role() == null ? "" : ", " + s.role());
    }
}
