package org.headwater.cli;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.lineage.LineageReport;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater lineage DATASET...}: direct upstream and downstream, optionally per column. */
@Command(name = "lineage", mixinStandardHelpOptions = true,
        description = {"Show what a dataset is made from and what is made from it, with the evidence for each",
                "link (static analysis, seen at run time, declared). DATASET is a path, URI, workspace-relative",
                "name, or the SQL name of a table or view. With --columns: where each column comes from.",
                "With --columns --json: a JSON array, one object per dataset:",
                "{dataset, columns: [{name, ordinal, origins: [{dataset, column, derived}], influencing: [{dataset, column}]}]}"})
final class LineageCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "DATASET", description = "Datasets to show.")
    List<String> keys;

    @Option(names = "--columns", description = "Show the origin of every column.")
    boolean columns;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** The shape of {@code --columns --json}: the dataset and its columns only. */
    record ColumnsOnly(String dataset, List<LineageReport.ColumnLineage> columns) {
    }

    @Override
    public Integer call() {
        List<LineageReport.Report> reports = new ArrayList<>();
        try (Catalog open = catalog.open()) {
            for (String key : keys) {
                reports.add(LineageReport.of(open.reader(), open.reader().dataset(DatasetKeys.one(open.reader(), key).id(), null).orElseThrow()));
            }
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, columns ? reports.stream().map(r -> new ColumnsOnly(r.dataset(), r.columns())).toList()
                    : reports);
            return Main.OK;
        }
        for (LineageReport.Report r : reports) {
            out.println(r.dataset());
            r.upstream().forEach(e -> out.printf("  from %s  via %s [%s, %.2f]%n", e.datasetName(), e.script(), e.evidence(), e.confidence()));
            r.downstream().forEach(e -> out.printf("  to   %s  via %s [%s, %.2f]%n", e.datasetName(), e.script(), e.evidence(), e.confidence()));
            if (r.upstream().isEmpty() && r.downstream().isEmpty()) {
                out.println("  no lineage recorded");
            }
            if (columns) {
                for (LineageReport.ColumnLineage c : r.columns()) {
                    out.printf("  %s <- %s%n", c.name(), c.origins().isEmpty() ? "(unknown)"
                            : String.join(", ", c.origins().stream().map(o -> o.dataset() + "." + o.column()
                                    + (o.derived() ? " (computed)" : "")).toList()));
                }
            }
        }
        out.flush();
        return Main.OK;
    }
}
