package org.headwater.cli;

import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Instant;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.export.ProvExport;
import org.headwater.export.ProvScope;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code headwater export --prov FILE}: the lineage graph as W3C PROV-O in JSON-LD. */
@Command(name = "export", mixinStandardHelpOptions = true,
        description = {"Export the lineage graph (whole, or the neighbourhood of one dataset) as W3C PROV-O in JSON-LD.",
                "FILE '-' writes to standard output."})
final class ExportCommand implements Callable<Integer> {
    @Option(names = "--prov", paramLabel = "FILE", required = true, description = "Where to write the PROV-O JSON-LD document.")
    String prov;

    @Option(names = "--dataset", paramLabel = "DATASET", description = "Only the neighbourhood of this dataset.")
    String dataset;

    @Option(names = "--depth", paramLabel = "N", defaultValue = "3",
            description = "Hops up and down from --dataset (default ${DEFAULT-VALUE}).")
    int depth;

    @Option(names = "--as-of", paramLabel = "TIME", description = "The graph as it was then (2026-03-01 or 2026-03-01T12:00:00Z).")
    String asOf;

    @Mixin
    CatalogOptions catalog;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        if (depth < 0) {
            throw new Problems.UsageProblem("--depth must be 0 or more");
        }
        Instant at = asOf == null ? null : CliTimes.parse(asOf);
        try (Catalog open = catalog.open()) {
            ProvScope scope = dataset == null ? ProvScope.whole(at)
                    : ProvScope.around(DatasetKeys.one(open.reader(), dataset).id(), depth, at);
            ProvExport export = new ProvExport(open.store());
            ProvExport.Counts counts;
            if (prov.equals("-")) {
                var buffer = new java.io.ByteArrayOutputStream();
                counts = export.write(scope, buffer);
                spec.commandLine().getOut().println(buffer.toString(java.nio.charset.StandardCharsets.UTF_8));
                spec.commandLine().getOut().flush();
            } else {
                // Written beside the target and moved into place: a failed export never leaves half a file.
                Path target = Path.of(prov).toAbsolutePath();
                Path tmp = Files.createTempFile(target.getParent(), ".prov-", ".tmp");
                try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(tmp))) {
                    counts = export.write(scope, out);
                } catch (IOException | RuntimeException e) {
                    Files.deleteIfExists(tmp);
                    throw e;
                }
                Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
                spec.commandLine().getErr().printf("Wrote %s: %d entities, %d derivations, %d activities, %d plans, %d agents%n",
                        target, counts.entities(), counts.derivations(), counts.activities(), counts.plans(), counts.agents());
            }
        }
        return Main.OK;
    }
}
