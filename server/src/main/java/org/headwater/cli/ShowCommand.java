package org.headwater.cli;

import java.time.Instant;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.DatasetView;
import org.headwater.store.Views.SchemaVersionView;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater show DATASET}: one dataset with its columns. */
@Command(name = "show", mixinStandardHelpOptions = true,
        description = {"Show one dataset: where it is, its format, its columns, owners and lineage.",
                "DATASET is a URI, a workspace-relative name, a path, or the end of a name."})
final class ShowCommand implements Callable<Integer> {
    @Parameters(paramLabel = "DATASET", description = "The dataset to show.")
    String key;

    @Option(names = "--as-of", paramLabel = "TIME", description = "Show it as it was then (2026-03-01 or 2026-03-01T12:00:00Z).")
    String asOf;

    @Option(names = "--history", description = "Show the dataset's schema versions instead, oldest first, with what"
            + " each added, removed or retyped (for a Delta or Iceberg table: its own versions, times and operations).")
    boolean history;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Instant at = asOf == null ? null : CliTimes.parse(asOf);
        var out = spec.commandLine().getOut();
        try (Catalog open = catalog.open()) {
            DatasetView d = open.reader().dataset(DatasetKeys.one(open.reader(), key).id(), at)
                    .orElseThrow(() -> new Problems.UsageProblem("dataset vanished while reading it"));
            if (history) {
                printHistory(out, open.reader().schemaHistory(d.id()));
                return Main.OK;
            }
            if (output.json) {
                Output.printJson(out, d);
                return Main.OK;
            }
            out.printf("%s  (%s, %s)%n", d.name(), d.kind(), d.present() ? d.format() : "gone");
            out.printf("  uri:      %s%n", d.uri());
            out.printf("  source:   %s%n", d.source());
            if (d.present()) {
                out.printf("  size:     %,d bytes, modified %s%n", d.sizeBytes(), d.modifiedAt());
                if (d.rowCount() != null) {
                    out.printf("  rows:     %,d%s%n", d.rowCount(), d.rowCountExact() ? "" : " (estimated)");
                }
                if (d.contentHash() != null) {
                    out.printf("  sha-256:  %s%n", d.contentHash());
                }
            }
            if (d.error() != null) {
                out.printf("  problem:  %s%n", d.error());
            }
            if (d.description() != null) {
                out.printf("  about:    %s%n", d.description());
            }
            if (!d.columns().isEmpty()) {
                out.printf("  columns (schema version %d):%n", d.schemaVersion());
                for (ColumnView c : d.columns()) {
                    out.printf("    %3d  %-40s %-10s %s%n", c.ordinal(), c.name(), c.type(), c.nullable() ? "nullable" : "");
                }
            }
            if (!d.partitions().isEmpty()) {
                out.printf("  partitions (%d):%n", d.partitions().size());
                d.partitions().stream().limit(20).forEach(p -> out.printf("    %s  %s%n", p.name(), p.keys()));
                if (d.partitions().size() > 20) {
                    out.printf("    … and %d more (--json lists all)%n", d.partitions().size() - 20);
                }
            }
            d.owners().forEach(o -> out.printf("  owner:    %s (%s)%n", o.name(), o.reason()));
            d.upstream().forEach(e -> out.printf("  upstream: %s via %s [%s]%n", e.datasetName(), e.script(), e.evidence()));
            d.downstream().forEach(e -> out.printf("  downstream: %s via %s [%s]%n", e.datasetName(), e.script(), e.evidence()));
            open.reader().copiesOf(d.id(), at).forEach(c -> out.printf("  same content: %s%n", c.name()));
        }
        out.flush();
        return Main.OK;
    }

    private void printHistory(java.io.PrintWriter out, java.util.List<SchemaVersionView> versions) {
        if (output.json) {
            Output.printJson(out, versions);
            return;
        }
        for (SchemaVersionView v : versions) {
            String table = v.tableVersion() == null ? ""
                    : "  table version " + v.tableVersion() + (v.recordedAt() == null ? "" : " at " + v.recordedAt())
                            + (v.operation() == null ? "" : " (" + v.operation() + ")");
            out.printf("version %d: %d columns, in the catalog from %s%s%n", v.version(), v.columns().size(),
                    v.validFrom(), table);
            v.drift().added().forEach(c -> out.printf("    + %s%n", c));
            v.drift().removed().forEach(c -> out.printf("    - %s%n", c));
            v.drift().retyped().forEach(c -> out.printf("    ~ %s%n", c));
        }
        out.flush();
    }
}
