package org.headwater.impact;

import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.stream.Collectors;
import org.headwater.impact.ImpactReport.Affected;
import org.headwater.impact.ImpactReport.Counts;
import org.headwater.lineage.Step;
import org.headwater.store.Views.OwnerView;

/** An impact report as Markdown, for pasting into a review or a ticket: counts, owners, then one table per distance. */
public final class ImpactMarkdown {
    private ImpactMarkdown() {
    }

    public static String render(ImpactReport report) {
        StringBuilder md = new StringBuilder();
        md.append("# ").append(escape(report.title())).append("\n\n");
        Counts c = report.counts();
        md.append("**").append(c.total()).append(" affected**: ")
                .append(String.join(", ", List.of(
                        plural(c.datasets(), "dataset"), plural(c.columns(), "column"), plural(c.scripts(), "script"),
                        plural(c.figures(), "figure"), plural(c.views(), "view"))))
                .append("; ").append(c.indirect()).append(" indirect, ").append(c.uncertain()).append(" uncertain; ")
                .append(plural(c.owners(), "owner")).append(" to notify.\n\n");
        if (report.target().partition() != null) {
            md.append("`").append(escape(report.target().partition())).append("` is a partition of `")
                    .append(escape(report.target().dataset())).append("`; the report is about the whole set.\n\n");
        }
        if (report.startInCycle()) {
            md.append("The target feeds back into itself: a script reads it and rewrites it.\n\n");
        }
        Set<String> notify = new LinkedHashSet<>();
        report.affected().forEach(a -> a.owners().forEach(o -> notify.add(owner(o))));
        if (!notify.isEmpty()) {
            md.append("Notify: ").append(String.join(", ", notify)).append("\n\n");
        }
        if (report.affected().isEmpty()) {
            md.append("Nothing downstream is affected.\n");
            return md.toString();
        }
        Map<Integer, List<Affected>> byDistance = new LinkedHashMap<>();
        report.affected().forEach(a -> byDistance.computeIfAbsent(a.distance(), d -> new java.util.ArrayList<>()).add(a));
        for (Map.Entry<Integer, List<Affected>> group : byDistance.entrySet()) {
            md.append("## ").append(group.getKey()).append(group.getKey() == 1 ? " hop" : " hops").append("\n\n");
            md.append("| affected | kind | why | owners | path |\n|---|---|---|---|---|\n");
            for (Affected a : group.getValue()) {
                md.append("| `").append(escape(a.name())).append("` | ").append(a.kind())
                        .append(a.indirect() ? " (indirect)" : "").append(a.uncertain() ? " (uncertain)" : "")
                        .append(" | ").append(escape(a.why()))
                        .append(" | ").append(escape(a.owners().stream().map(ImpactMarkdown::owner)
                                .collect(Collectors.joining(", "))))
                        .append(" | ").append(escape(path(a.path()))).append(" |\n");
            }
            md.append('\n');
        }
        return md.toString();
    }

    private static String owner(OwnerView o) {
        return o.name() + (o.kind().equals("team") ? " (team)" : "") + (o.suggested() ? " (suggested)" : "");
    }

    private static String path(List<Step> steps) {
        return steps.stream().map(s -> end(s.from(), s.fromColumn()) + " → " + end(s.to(), s.toColumn())
                        + " via " + (s.script() != null ? s.script() : s.run() != null ? "run " + s.run() : "no script")
                        + " (" + s.evidence() + " " + String.format(Locale.ROOT, "%.2f", s.confidence())
                        + (s.role() != null ? ", " + s.role() : "") + ")")
                .collect(Collectors.joining("; "));
    }

    private static String end(String dataset, String column) {
        return column == null ? dataset : dataset + "." + column;
    }

    private static String plural(int n, String word) {
        return n + " " + word + (n == 1 ? "" : "s");
    }

    /**
     * Keeps table cells whole: a pipe or a line break would end the cell or the row. GitHub Flavored
     * Markdown removes the backslash before a pipe in a cell, inside code spans too (GFM spec, "Tables").
     */
    static String escape(String text) {
        return text.replace("|", "\\|").replace("\n", " ").replace("\r", " ");
    }
}
