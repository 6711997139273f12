package org.headwater.cli;

import java.io.BufferedOutputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Instant;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.export.ProvExport;
import org.headwater.export.ProvScope;
import org.headwater.ops.CatalogExport;
import org.headwater.store.Store;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code headwater export --prov FILE}: the lineage graph as W3C PROV-O in JSON-LD; {@code --catalog FILE}:
 * the whole catalog, history included, as one JSON document for {@code headwater import}.
 */
@Command(name = "export", mixinStandardHelpOptions = true,
        description = {"Export the lineage graph (whole, or the neighbourhood of one dataset) as W3C PROV-O in JSON-LD",
                "with --prov FILE ('-' writes to standard output), or the whole catalog (every table, history and",
                "change log included) as one JSON document with --catalog FILE, which 'headwater import' reads."})
final class ExportCommand implements Callable<Integer> {
    /** Exactly one of the two exports. */
    static final class What {
        @Option(names = "--prov", paramLabel = "FILE", required = true, description = "Write the lineage as PROV-O JSON-LD.")
        String prov;

        @Option(names = "--catalog", paramLabel = "FILE", required = true, description = "Write the whole catalog as JSON.")
        Path catalog;
    }

    @ArgGroup(exclusive = true, multiplicity = "1")
    What what;

    @Option(names = "--dataset", paramLabel = "DATASET", description = "With --prov: only the neighbourhood of this dataset.")
    String dataset;

    @Option(names = "--depth", paramLabel = "N", defaultValue = "3",
            description = "With --prov: hops up and down from --dataset (default ${DEFAULT-VALUE}).")
    int depth;

    @Option(names = "--as-of", paramLabel = "TIME",
            description = "With --prov: the graph as it was then (2026-03-01 or 2026-03-01T12:00:00Z).")
    String asOf;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        if (what.catalog != null) {
            if (dataset != null || asOf != null) {
                throw new Problems.UsageProblem("--dataset and --as-of go with --prov; --catalog exports everything");
            }
            return exportCatalog(what.catalog);
        }
        return exportProv();
    }

    private Integer exportProv() throws IOException {
        if (depth < 0) {
            throw new Problems.UsageProblem("--depth must be 0 or more");
        }
        Instant at = asOf == null ? null : CliTimes.parse(asOf);
        try (Catalog open = catalog.open()) {
            ProvScope scope = dataset == null ? ProvScope.whole(at)
                    : ProvScope.around(DatasetKeys.one(open.reader(), dataset).id(), depth, at);
            ProvExport export = new ProvExport(open.store());
            if (what.prov.equals("-")) {
                var buffer = new ByteArrayOutputStream();
                export.write(scope, buffer);
                spec.commandLine().getOut().println(buffer.toString(StandardCharsets.UTF_8));
                spec.commandLine().getOut().flush();
                return Main.OK;
            }
            ProvExport.Counts[] counts = new ProvExport.Counts[1];
            Path target = writeAtomically(Path.of(what.prov), out -> counts[0] = export.write(scope, out));
            ProvExport.Counts c = counts[0];
            spec.commandLine().getErr().printf("Wrote %s: %d entities, %d derivations, %d activities, %d plans, %d agents%n",
                    target, c.entities(), c.derivations(), c.activities(), c.plans(), c.agents());
        }
        return Main.OK;
    }

    private Integer exportCatalog(Path file) throws IOException {
        long[] rows = new long[1];
        Path target;
        try (Store store = Store.open(catalog.storeConfig())) {
            target = writeAtomically(file, out -> rows[0] = CatalogExport.write(store, out));
        }
        spec.commandLine().getOut().printf("Exported %d rows to %s%n", rows[0], target);
        spec.commandLine().getOut().flush();
        return Main.OK;
    }

    /** Something that writes a document to a stream. */
    private interface Writer {
        void write(OutputStream out) throws IOException;
    }

    /** Writes beside the target and moves it into place: a failed export never leaves half a file. */
    private static Path writeAtomically(Path file, Writer writer) throws IOException {
        Path target = file.toAbsolutePath().normalize();
        Files.createDirectories(target.getParent());
        Path partial = Files.createTempFile(target.getParent(), ".export-", ".tmp");
        try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(partial))) {
            writer.write(out);
        } catch (IOException | RuntimeException e) {
            Files.deleteIfExists(partial);
            throw e;
        }
        Files.move(partial, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        return target;
    }
}
