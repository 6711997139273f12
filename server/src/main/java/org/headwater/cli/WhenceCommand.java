package org.headwater.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.List;
import java.util.concurrent.Callable;
import org.headwater.Catalog;
import org.headwater.lineage.StampReader;
import org.headwater.lineage.Whence;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code headwater whence FILE}: which scripts and runs produced a file, from which inputs. */
@Command(name = "whence", mixinStandardHelpOptions = true,
        description = {"Say where a file came from: the run and script that wrote it, the inputs that run read",
                "(with their content hash then), and so on upstream. Works for copies and renamed files:",
                "the file is recognised by a stamped run id, then by its content, then by its path.",
                "FILE may also be a dataset name of the catalog."})
final class WhenceCommand implements Callable<Integer> {
    @Parameters(paramLabel = "FILE", description = "A file on this machine, or a dataset name.")
    String key;

    @Mixin
    CatalogOptions catalog;

    @Mixin
    Output output;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws IOException {
        Whence.Answer answer;
        try (Catalog open = catalog.open()) {
            Whence whence = new Whence(open.store());
            Path file = Path.of(key);
            if (Files.isRegularFile(file)) {
                byte[] bytes = Files.readAllBytes(file);
                answer = whence.of(key, file.toAbsolutePath().normalize().toUri().toString(), sha256(bytes),
                        StampReader.runId(bytes).orElse(null));
            } else {
                answer = whence.ofDataset(DatasetKeys.one(open.reader(), key).id());
            }
        }
        var out = spec.commandLine().getOut();
        if (output.json) {
            Output.printJson(out, answer);
            return Main.OK;
        }
        if (answer.producers().isEmpty()) {
            out.println(key + ": the catalog knows no script or run that produced this file.");
            out.flush();
            return Main.PROBLEMS;
        }
        out.println(key + (answer.datasets().isEmpty() ? "" : "  (" + String.join(", ", answer.datasets()) + ")"));
        print(out, answer.producers(), "  ");
        for (Whence.Step step : answer.upstream()) {
            out.println("  upstream " + step.distance() + ": " + step.dataset());
            print(out, step.producers(), "    ");
        }
        out.flush();
        return Main.OK;
    }

    private static void print(java.io.PrintWriter out, List<Whence.Producer> producers, String indent) {
        for (Whence.Producer p : producers) {
            String how = p.run() == null ? p.evidence() + " analysis"
                    : "run " + p.run().id() + " at " + p.run().startedAt() + " by " + p.run().user() + "@" + p.run().host()
                            + (p.run().gitCommit() == null ? "" : ", commit " + p.run().gitCommit().substring(0, Math.min(10, p.run().gitCommit().length())));
            out.println(indent + "made by " + p.script() + "  [" + how + "; matched by " + p.matchedBy() + "]");
            for (Whence.Input in : p.inputs()) {
                out.println(indent + "  from " + in.dataset() + (in.hash() == null ? "" : "  sha-256 " + in.hash().substring(0, 12) + "…"));
            }
        }
    }

    static String sha256(byte[] bytes) {
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
